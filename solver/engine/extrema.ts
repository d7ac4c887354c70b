/**
 * Global search on a swept trace: every local extremum the samples show — and features narrower
 * than the grid that only bend the samples — is bracketed and refined by solving again, so a
 * measure reports the global answer, not the neighbourhood of the largest sample.
 */
import type { Dual } from "./probes";
import { brentRoot } from "./roots";

/** One point of a trace: a sweep sample or a refined extremum. */
export interface Pt {
  f: number;
  re: number;
  im: number;
}

/** The quantity searched: its value at a point and its slope d/dω at a solved Dual. */
export interface Quantity {
  value(re: number, im: number): number;
  slope(x: Dual): number;
}

/** The smallest normal double (2^−1022): below it a double keeps too few digits to compare. */
export const MIN_NORMAL = 2.2250738585072014e-308;

/**
 * Whether a sample of X can take part in the search: |X| at or above the smallest normal double
 * (max(|Re|, |Im|), which cannot underflow). Deep in a stop band a ladder's far end falls below it,
 * where the samples are rounding noise whose "extrema" mean nothing and would each cost dozens of
 * solves (a 10 000-section ladder spent 9 s there against 0.7 s for its sweep).
 */
export function resolvable(re: number, im: number): boolean {
  const scale = Math.max(Math.abs(re), Math.abs(im));
  return scale >= MIN_NORMAL && scale < Number.POSITIVE_INFINITY;
}

/** Most bend-only candidates (local maxima of |second difference|, largest first) refined per search. */
const MAX_BENDS = 8;
/** Deepest bisection of a candidate interval (2 sample steps / 2^12: a 26 % step resolves 0.01 %). */
const MAX_DEPTH = 12;
/** Most midpoints solved per candidate interval. */
const MAX_PROBES = 48;
/** A midpoint further than this from the cubic Hermite prediction (units of the quantity) is bisected. */
const HERMITE_TOL = 1e-6;

interface Probe {
  u: number;
  v: number;
  /** dv/d(ln f). */
  d: number;
}

/**
 * Refined local extrema of q near the samples' candidates, in ascending frequency.
 *
 * Candidates: every interior local maximum or minimum of q over the samples, and the MAX_BENDS
 * largest local maxima of the samples' |second difference| of q on ln f (a resonance narrower than
 * the grid, sitting on a slope, shows only as a bend). Each candidate's interval [f(k−1), f(k+1)]
 * is bisected on ln f wherever the solved midpoint departs from the cubic Hermite interpolant of its
 * ends' values and slopes (dX/ds from one extra solve) — smooth stretches cost one solve, a feature
 * narrower than the grid is zoomed in on — and every sign change of the slope between neighbouring
 * probes is refined to its root by Brent's method on ln f to 1e-12 relative. Only candidates up to
 * sample `last` are searched (a first crossing needs nothing beyond the samples' own first one), and
 * only where the candidate and both neighbours are `resolvable`.
 */
export function hiddenExtrema(
  pts: Pt[],
  q: Quantity,
  at: (f: number, deriv: boolean) => Dual,
  last = pts.length - 1,
): Pt[] {
  const n = Math.min(pts.length, last + 2);
  if (n < 3) return [];
  const v = pts.map((p) => q.value(p.re, p.im));
  const cand = new Set<number>();
  const bend = new Float64Array(n);
  for (let k = 1; k + 1 < n; k++) {
    const a = v[k - 1]!;
    const b = v[k]!;
    const c = v[k + 1]!;
    if ((b >= a && b >= c && (b > a || b > c)) || (b <= a && b <= c && (b < a || b < c))) cand.add(k);
    const f0 = pts[k - 1]!.f;
    const f2 = pts[k + 1]!.f;
    if (!(f0 > 0)) continue;
    const w = Math.log(f2 / pts[k]!.f) / Math.log(f2 / f0);
    const x = Math.abs(b - (w * a + (1 - w) * c));
    bend[k] = Number.isFinite(x) ? x : 0;
  }
  // Local maxima of the bend: a smooth trace has one per corner; a feature narrower than the grid
  // adds its own, however small beside the corners' bends.
  const bends: [number, number][] = [];
  for (let k = 1; k + 1 < n; k++) {
    if (bend[k]! > 0 && bend[k]! > bend[k - 1]! && bend[k]! >= bend[k + 1]!) bends.push([bend[k]!, k]);
  }
  bends.sort((x, y) => y[0] - x[0]);
  for (const [, k] of bends.slice(0, MAX_BENDS)) cand.add(k);
  const probe = (u: number): Probe => {
    const f = Math.exp(u);
    const x = at(f, true);
    return { u, v: q.value(x.re, x.im), d: 2 * Math.PI * f * q.slope(x) };
  };
  const out: Pt[] = [];
  const done = new Set<number>();
  for (const k of [...cand].sort((x, y) => x - y)) {
    if (!pts.slice(k - 1, k + 2).every((p) => resolvable(p.re, p.im))) continue;
    const lo = pts[k - 1]!.f;
    const hi = pts[k + 1]!.f;
    if (!(lo > 0) || !(hi > lo)) continue;
    const probes = [probe(Math.log(lo))];
    bisect(probes[0]!, probe(Math.log(hi)), 0, probe, probes, { left: MAX_PROBES });
    for (let i = 0; i + 1 < probes.length; i++) {
      const a = probes[i]!;
      const b = probes[i + 1]!;
      if (!(a.d * b.d < 0)) continue;
      const u = brentRoot((x) => probe(x).d, a.u, b.u, a.d, b.d, 1e-12);
      if (Number.isNaN(u) || done.has(u)) continue;
      done.add(u);
      const f = Math.exp(u);
      const x = at(f, false);
      out.push({ f, re: x.re, im: x.im });
    }
  }
  return out.sort((a, b) => a.f - b.f);
}

/**
 * Append to `out` the probes after a up to b, bisecting where the Hermite prediction fails, at most
 * `budget.left` solves in all (a trace that is nowhere smooth cannot make the search explode).
 */
function bisect(
  a: Probe,
  b: Probe,
  depth: number,
  probe: (u: number) => Probe,
  out: Probe[],
  budget: { left: number },
): void {
  if (budget.left <= 0) {
    out.push(b);
    return;
  }
  budget.left--;
  const h = b.u - a.u;
  const m = probe((a.u + b.u) / 2);
  // Cubic Hermite interpolant of the ends at the midpoint: value and slope.
  const predicted = (a.v + b.v) / 2 + (h / 8) * (a.d - b.d);
  const predictedSlope = (1.5 * (b.v - a.v)) / h - (a.d + b.d) / 4;
  const off = Math.max(Math.abs(m.v - predicted), (Math.abs(m.d - predictedSlope) * h) / 4);
  if (depth < MAX_DEPTH && (!(off <= HERMITE_TOL) || m.d * a.d < 0 || m.d * b.d < 0)) {
    bisect(a, m, depth + 1, probe, out, budget);
    bisect(m, b, depth + 1, probe, out, budget);
    return;
  }
  out.push(m, b);
}

/** The samples plus extra points, in ascending frequency (an extra point equal to a sample is dropped). */
export function merged(pts: Pt[], extra: Pt[]): Pt[] {
  if (extra.length === 0) return pts;
  const seen = new Set(pts.map((p) => p.f));
  return [...pts, ...extra.filter((p) => !seen.has(p.f))].sort((a, b) => a.f - b.f);
}

/** d ln|X|/dω at a solved Dual: Re(conj(X)·j·dX/ds)/|X|². */
export const lnMagnitudeSlope = (x: Dual) => (-x.re * x.dIm + x.im * x.dRe) / (x.re * x.re + x.im * x.im);

/** d∠X/dω (rad per rad/s) at a solved Dual: Re(dX/ds / X). */
export const phaseSlope = (x: Dual) => (x.dRe * x.re + x.dIm * x.im) / (x.re * x.re + x.im * x.im);
