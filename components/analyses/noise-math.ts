/**
 * Client-side figures of the noise and pole–zero views (pure; tested in tests/unit/noise-math.test.ts).
 */
import type { NoiseResult, PoleResult, ZeroResult } from "@/solver/types";

/**
 * ∫ S(f) df over [f1, f2] from samples of a density (S = density²) on ascending frequencies, each
 * segment taken as a power law S ∝ f^p (straight on log–log axes, exact for thermal, 1/f and
 * n-th order roll-offs alike). The band is clipped to the samples. Returns the rms value
 * √∫S df, or null when the band holds no segment or a density is missing.
 */
export function bandRms(freqs: number[], density: (number | null)[], f1: number, f2: number): number | null {
  const lo = Math.max(f1, freqs[0] ?? Infinity);
  const hi = Math.min(f2, freqs[freqs.length - 1] ?? -Infinity);
  if (!(hi > lo) || !(lo > 0)) return null;
  let total = 0;
  for (let k = 0; k + 1 < freqs.length; k++) {
    const fa = freqs[k]!;
    const fb = freqs[k + 1]!;
    if (fb <= lo || fa >= hi) continue;
    const da = density[k];
    const db = density[k + 1];
    if (da == null || db == null || !(fa > 0)) return null;
    const sa = da * da;
    const sb = db * db;
    const x0 = Math.max(fa, lo);
    const x1 = Math.min(fb, hi);
    if (sa === 0 || sb === 0) {
      total += ((sa + sb) / 2) * (x1 - x0);
      continue;
    }
    const p = Math.log(sb / sa) / Math.log(fb / fa);
    const s0 = sa * (x0 / fa) ** p;
    total +=
      Math.abs(p + 1) < 1e-9
        ? s0 * x0 * Math.log(x1 / x0)
        : ((s0 * x0) / (p + 1)) * ((x1 / x0) ** (p + 1) - 1);
  }
  return Math.sqrt(total);
}

export interface NoiseShare {
  label: string;
  rms: number | null;
  /** Fraction of the band's noise power, 0…1. */
  share: number | null;
}

/** Each contribution's rms over the band and its share of the total power, largest first. */
export function noiseShares(noise: NoiseResult, freqs: number[], f1: number, f2: number): NoiseShare[] {
  const total = bandRms(freqs, noise.density, f1, f2);
  return noise.contributions
    .map((c) => {
      const rms = bandRms(freqs, c.density, f1, f2);
      const share = rms !== null && total ? (rms * rms) / (total * total) : null;
      return { label: c.source === "thermal" ? c.part : `${c.part} ${c.source}`, rms, share };
    })
    .sort((a, b) => (b.share ?? -1) - (a.share ?? -1));
}

/** A root of the pole–zero map. */
export interface MapRoot {
  re: number;
  im: number;
  frequencyHz: number;
  kind: "pole" | "zero";
}

/**
 * The view of a pole–zero map that shows the dominant roots legibly: the roots within `factor`
 * times the smallest non-zero |s| (roots at the origin always), the half-width that holds them,
 * and the far roots left out (listed beside the map).
 */
export function dominantView(
  poles: PoleResult[],
  zeros: ZeroResult[],
  factor = 100,
): { near: MapRoot[]; far: MapRoot[]; reach: number } {
  const roots: MapRoot[] = [
    ...poles.map((p) => ({ re: p.re, im: p.im, frequencyHz: p.frequencyHz, kind: "pole" as const })),
    ...zeros.map((z) => ({ re: z.re, im: z.im, frequencyHz: z.frequencyHz, kind: "zero" as const })),
  ];
  const size = (r: MapRoot) => Math.hypot(r.re, r.im);
  const nonzero = roots.map(size).filter((x) => x > 0);
  const smallest = nonzero.length > 0 ? Math.min(...nonzero) : 1;
  const near = roots.filter((r) => size(r) <= factor * smallest);
  const far = roots.filter((r) => size(r) > factor * smallest).sort((a, b) => size(a) - size(b));
  const reach = Math.max(smallest, ...near.map((r) => Math.max(Math.abs(r.re), Math.abs(r.im))));
  return { near, far, reach };
}
