/**
 * The small-signal side of a steady oscillation: whether it starts (the growing pole pair) and the
 * loop gain at zero phase, said in words when it does not start.
 */
import type { Circuit, PoleResult } from "../../types";
import { buildMna } from "../mna";
import { computePoles, MAX_POLE_UNKNOWNS } from "../poles";
import { at, mag, phaseCrossing, SolveFailed, type TraceSampler } from "../refine";

export interface StartInfo {
  /** The fastest-growing complex pole pair (σ > 0), or null. */
  growing: PoleResult | null;
  /** The dominant complex pole whatever its sign (for the "does not start" words). */
  dominant: PoleResult | null;
  /** |T| at the loop's first zero-phase frequency, when found. */
  loop: { frequencyHz: number; magnitude: number } | null;
}

const fmt = (x: number, d = 3) => String(Number(x.toPrecision(d)));

export function loopAtZeroPhase(tr: TraceSampler | undefined): StartInfo["loop"] {
  if (!tr) return null;
  try {
    const { f } = phaseCrossing(tr, 0);
    if (f === null) return null;
    const x = at(tr, f);
    return { frequencyHz: f, magnitude: mag(x.re, x.im) };
  } catch (e) {
    if (e instanceof SolveFailed) return null;
    throw e;
  }
}

/** Poles of the small-signal network (diodes unbiased, swing ignored) and the loop at zero phase. */
export function startInfo(
  circuit: Circuit,
  loop: TraceSampler | undefined,
  scaleHz: number,
): StartInfo | string {
  const built = buildMna(circuit.parts, circuit.nodes);
  if (!built.ok) return built.errors[0]?.message ?? "the network could not be built";
  if (built.system.n > MAX_POLE_UNKNOWNS)
    return `the circuit has ${built.system.n} unknowns; a steady oscillation needs its poles, computed for up to ${MAX_POLE_UNKNOWNS}`;
  const poles = computePoles(built.system, scaleHz);
  if (poles === null) return "no regular shift found for the poles; the network may be singular";
  let dominant: PoleResult | null = null;
  for (const p of poles) if (p.im > 0 && (!dominant || p.re > dominant.re)) dominant = p;
  return {
    growing: dominant && dominant.re > 0 ? dominant : null,
    dominant,
    loop: loopAtZeroPhase(loop),
  };
}

/** Why it does not start, in words ("loop gain 0.67 at zero phase: it does not start"). */
export function notStarting(info: StartInfo): string {
  if (info.loop) return `loop gain ${fmt(info.loop.magnitude, 2)} at zero phase: it does not start`;
  if (info.dominant)
    return `the dominant poles decay ×${fmt(info.dominant.growthPerCycle ?? 0)} per cycle: it does not start`;
  return "the network has no complex poles: it does not start";
}
