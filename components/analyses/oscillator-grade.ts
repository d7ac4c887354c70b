/**
 * The oscillator verdict, graded by margin (client-safe, no React). It reads only refined numbers:
 * the loop gain at zero phase that the engine refined on the circuit (`result.zeroPhase`), the dominant
 * complex pole, and each check's Monte Carlo yield — never values interpolated between sweep points.
 *
 * Grades: "starts" only with margin — |T| at least MARGIN_DB above 0 dB (or growth per cycle above
 * 1 + MARGIN_GROWTH) and, when the run has Monte Carlo, every sample passing the checks that read the
 * loop; "marginal" when the nominal circuit starts but either of those fails (the yield is named);
 * "won't start" when |T| < 1 or the poles decay; "unclear" without a loop crossing or complex poles.
 */

import type { DrawnResult } from "@/lib/drawn-result";
import { formatQuantity } from "@/solver/format";
import type { PoleResult, ZeroPhaseLoop } from "@/solver/types";

const hz = (f: number) => formatQuantity(f, "Hz");

/** The pole that decides whether oscillations grow: the complex pole with the largest σ (ω > 0). */
export function dominantOscillatoryPole(poles: PoleResult[]): PoleResult | null {
  let best: PoleResult | null = null;
  for (const p of poles) {
    if (!(p.im > 0) || p.growthPerCycle === null) continue;
    if (!best || p.re > best.re) best = p;
  }
  return best;
}

export type VerdictKind = "starts" | "marginal" | "decays" | "unknown";

export interface OscillatorVerdict {
  kind: VerdictKind;
  /** "starts: grows ×1.17 per cycle at 1.59 kHz" */
  headline: string;
  loop: ZeroPhaseLoop | null;
  pole: PoleResult | null;
  /** Sentences joining the views (loop gain, poles, Monte Carlo yield). */
  detail: string;
}

/** Loop gain within this many dB of 0 dB is too close to call "starts" (tolerances move it by more). */
export const MARGIN_DB = 0.3;
/**
 * Without a loop, growth per cycle up to this is marginal: for the equal-part bridge the growth is
 * e^(π(K−3)) (σ = (K−3)/(2RC), ω = 1/RC), and |T| = K/3 = 0.3 dB above 1 is K = 3.104 → ×1.39.
 */
const MARGIN_GROWTH = 0.39;

const fmt = (x: number, d = 3) => String(Number(x.toPrecision(d)));
const pct = (x: number) => `${fmt(x * 100, 3)} %`;

function loopGrade(loop: ZeroPhaseLoop | null): VerdictKind {
  if (!loop || loop.gain === null) return "unknown";
  const db = 20 * Math.log10(loop.gain);
  return db < 0 ? "decays" : db <= MARGIN_DB ? "marginal" : "starts";
}

function poleGrade(pole: PoleResult | null): VerdictKind {
  if (!pole || pole.growthPerCycle === null) return "unknown";
  const g = pole.growthPerCycle;
  return g < 1 ? "decays" : g <= 1 + MARGIN_GROWTH ? "marginal" : "starts";
}

/** The worst Monte Carlo yield among the checks that read the loop's measures, if below 100 %. */
function weakestCheck(result: DrawnResult, loop: ZeroPhaseLoop | null) {
  const reading = new Set(loop?.checks ?? []);
  const rows = (result.monteCarlo?.checks ?? []).filter((c) => reading.has(c.expression) && c.yield < 1);
  return rows.sort((a, b) => a.yield - b.yield)[0] ?? null;
}

export function oscillatorVerdict(result: DrawnResult): OscillatorVerdict | null {
  const loop = result.zeroPhase?.[0] ?? null;
  const pole = result.poles ? dominantOscillatoryPole(result.poles) : null;
  if (!pole && !loop) return null;
  // The poles decide when present (they see the whole network); the loop gain otherwise.
  // The poles decide whether it starts at all (they see the whole network); the margin is the loop
  // gain's in dB when there is a loop, else the growth per cycle's.
  const byLoop = loopGrade(loop);
  const byPole = poleGrade(pole);
  let kind = byPole !== "unknown" ? byPole : byLoop;
  if (kind !== "decays" && byLoop !== "unknown") kind = byLoop === "decays" ? "marginal" : byLoop;
  const weak = weakestCheck(result, loop);
  if (kind === "starts" && weak) kind = "marginal";
  return { kind, headline: headline(kind, loop, pole), loop, pole, detail: detail(result, loop, pole, weak) };
}

function headline(kind: VerdictKind, loop: ZeroPhaseLoop | null, pole: PoleResult | null): string {
  if (pole && pole.growthPerCycle !== null) {
    const g = pole.growthPerCycle;
    const at = hz(pole.frequencyHz);
    if (kind === "decays") return `decays ×${fmt(g)} per cycle at ${at} — will not start`;
    if (kind === "marginal") return `grows ×${fmt(g)} per cycle at ${at} — marginal`;
    return `grows ×${fmt(g)} per cycle at ${at}`;
  }
  if (loop && loop.gain !== null && loop.frequencyHz !== null) {
    const at = hz(loop.frequencyHz);
    const db = `${fmt(20 * Math.log10(loop.gain), 2)} dB`;
    if (kind === "decays") return `loop gain ${fmt(loop.gain, 4)} (${db}) at ${at} — will not start`;
    if (kind === "marginal") return `loop gain ${fmt(loop.gain, 4)} (${db}) at ${at} — marginal`;
    return `loop gain ${fmt(loop.gain, 4)} (${db}) at ${at} — should start`;
  }
  return "cannot be judged from this run";
}

function detail(
  result: DrawnResult,
  loop: ZeroPhaseLoop | null,
  pole: PoleResult | null,
  weak: { expression: string; yield: number } | null,
): string {
  const parts: string[] = [];
  if (loop?.gain != null && loop.frequencyHz != null) {
    const met = loop.gain >= 1;
    parts.push(
      `|${loop.loop}| = ${fmt(loop.gain, 4)} where ∠${loop.loop} = 0° (${hz(loop.frequencyHz)}): ` +
        `the Barkhausen criterion is ${met ? "met" : "not met"}` +
        (met && 20 * Math.log10(loop.gain) <= MARGIN_DB ? `, with less than ${MARGIN_DB} dB to spare.` : "."),
    );
  } else if (loop) {
    parts.push(`No zero-phase point: ${loop.reason ?? "the loop phase does not cross 0°"}.`);
  } else {
    parts.push("No loop trace: add a loop cut to see the loop gain at its zero-phase frequency.");
  }
  if (pole) {
    parts.push(
      `Dominant poles σ = ${fmt(pole.re, 4)} s⁻¹, ω = ±${fmt(pole.im, 6)} rad/s` +
        (pole.re > 0 ? " lie in the right half-plane." : " lie in the left half-plane."),
    );
  } else if (result.poles) {
    parts.push("No complex poles: the network has no natural oscillation.");
  } else {
    parts.push("Add `poles` to the netlist to see the growth per cycle.");
  }
  // The steady oscillation (harmonic balance) makes the same start decision, from the same poles.
  if (result.steady) parts.push(`Steady state: ${result.steady.summary}.`);
  if (weak) {
    parts.push(
      `Monte Carlo: only ${pct(weak.yield)} of ${result.monteCarlo!.samples} samples pass \`${weak.expression}\` — some boards built to these tolerances would not start.`,
    );
  }
  return parts.join(" ");
}
