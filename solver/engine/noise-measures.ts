/**
 * The noise measures (NETLIST.md "Measures"): `noise(N) at F`, `noise(N) from F1 to F2` and the
 * input-referred `input-noise(…)`. Each value is solved at its own frequencies (never read off the
 * sweep): at F one solve and one adjoint solve; over a band, adaptive Gauss–Kronrod quadrature of
 * the density² on u = ln f (∫S df = ∫S·f du, smooth for thermal, 1/f and roll-off alike), solving
 * at every node.
 */
import { formatHz } from "./ac";
import type { NoisePoint } from "./noise";
import { integrate } from "./quadrature";
import type { Outcome } from "./refine";

/** A noise statement that can be evaluated at any frequency (a solve plus an adjoint solve). */
export interface NoiseSampler {
  name: string;
  input: string | null;
  at(f: number): NoisePoint | string;
}

/** Most solves one integrated noise measure may spend. */
export const MAX_NOISE_EVALUATIONS = 6000;

class Failed extends Error {}

function density2(s: NoiseSampler, f: number, referred: boolean): number {
  const p = s.at(f);
  if (typeof p === "string") throw new Failed(p);
  if (!referred) return p.total;
  if (p.gain2 === null || !(p.gain2 > 0))
    throw new Failed(`the gain from ${s.input} to the probe is zero at ${formatHz(f)}`);
  return p.total / p.gain2;
}

export function noiseMeasure(
  s: NoiseSampler,
  referred: boolean,
  atHz: number | null,
  band: { from: number; to: number } | null,
): Outcome {
  if (referred && s.input === null)
    return { reason: `noise ${s.name} has no input source: write \`noise ${s.name} = … input SOURCE\`` };
  try {
    if (atHz !== null) {
      if (!(atHz > 0) || !Number.isFinite(atHz))
        return { reason: `${formatHz(atHz)} is not a positive frequency` };
      return { value: Math.sqrt(density2(s, atHz, referred)) };
    }
    if (!band) return { reason: "noise needs `at F` or `from F1 to F2`" };
    if (!(band.from > 0) || !(band.to > band.from) || !Number.isFinite(band.to))
      return { reason: "the band must be 0 < F1 < F2 (the 1/f noise integral diverges at 0 Hz)" };
    const a = Math.log(band.from);
    const b = Math.log(band.to);
    const r = integrate(
      (u) => {
        const f = Math.exp(u);
        return density2(s, f, referred) * f;
      },
      a,
      b,
      {
        rel: 1e-9,
        pieces: Math.max(2, Math.ceil((b - a) / Math.LN10)),
        maxEvaluations: MAX_NOISE_EVALUATIONS,
      },
    );
    if (!r.converged)
      return {
        reason: `the noise integral did not converge in ${r.evaluations} solves (error estimate ${(
          (r.error / Math.abs(r.value)) * 100
        ).toPrecision(2)} %)`,
      };
    return { value: Math.sqrt(r.value) };
  } catch (e) {
    if (e instanceof Failed) return { reason: e.message };
    throw e;
  }
}
