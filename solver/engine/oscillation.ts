/**
 * The loop gain where each loop's phase crosses 0° (the Barkhausen criterion, |T| ≥ 1 at ∠T = 0°),
 * refined on the circuit itself like the `zero-phase` measure — never interpolated between sweep
 * points — so the oscillator verdict and the measures beside it read the same number.
 */
import type { Circuit, ZeroPhaseLoop } from "../types";
import { at, phaseCrossing, range, SolveFailed, type TraceSampler } from "./refine";

export function loopsAtZeroPhase(circuit: Circuit, samplers: Map<string, TraceSampler>): ZeroPhaseLoop[] {
  const out: ZeroPhaseLoop[] = [];
  for (const loop of circuit.loops) {
    const tr = samplers.get(loop.name);
    if (!tr) continue;
    const measures = new Set(circuit.measures.filter((m) => m.target === loop.name).map((m) => m.name));
    const checks = circuit.checks.filter((c) => measures.has(c.measure)).map((c) => c.expression);
    try {
      const { f, rounding } = phaseCrossing(tr, 0);
      if (f === null) {
        const none = `∠${loop.name} does not cross 0° ${range(tr)}`;
        out.push({
          loop: loop.name,
          frequencyHz: null,
          gain: null,
          reason: rounding ? `${none}: it meets 0° only within rounding (about 1e-10)` : none,
          checks,
        });
        continue;
      }
      const x = at(tr, f);
      out.push({ loop: loop.name, frequencyHz: f, gain: Math.hypot(x.re, x.im), reason: null, checks });
    } catch (err) {
      if (!(err instanceof SolveFailed)) throw err;
      out.push({ loop: loop.name, frequencyHz: null, gain: null, reason: err.message, checks });
    }
  }
  return out;
}
