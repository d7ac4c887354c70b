/**
 * Reading a swept trace precisely: crossings, extrema and band edges are bracketed on the sweep's
 * points, then refined by solving the circuit again at new frequencies (never by interpolation).
 */
import type { Level } from "../types";
import { formatHz } from "./ac";
import type { Dual } from "./probes";
import { brentRoot, goldenMax } from "./roots";

/** A swept trace plus the means to evaluate it exactly at any other frequency. */
export interface TraceSampler {
  name: string;
  freqs: number[];
  re: number[];
  im: number[];
  /** Solve the circuit at f; with deriv the Dual carries dX/ds. A string is a solve failure. */
  at(f: number, deriv: boolean): Dual | string;
}

/** Relative tolerance of refined frequencies (ln f is searched to this absolute width). */
const REL_TOL = 1e-12;

/**
 * Root of g between frequencies a < b (g(a)·g(b) < 0), searched on ln f so the tolerance is
 * relative; on f itself when a = 0. NaN when there is no bracket.
 */
function refineRoot(g: (f: number) => number, a: number, b: number, ga: number, gb: number): number {
  if (a > b) return refineRoot(g, b, a, gb, ga);
  if (a > 0) {
    const u = brentRoot((x) => g(Math.exp(x)), Math.log(a), Math.log(b), ga, gb, REL_TOL);
    return Math.exp(u);
  }
  return brentRoot(g, a, b, ga, gb, REL_TOL * b);
}

export type Outcome = { value: number } | { reason: string };

export class SolveFailed extends Error {}

export const mag = (re: number, im: number) => Math.hypot(re, im);
export const deg = (re: number, im: number) => {
  const d = (Math.atan2(im, re) * 180) / Math.PI;
  return d <= -180 ? d + 360 : d;
};
/** Wrap an angle in degrees into (−180, 180]. */
export function wrapDeg(d: number): number {
  let w = d - 360 * Math.floor((d + 180) / 360);
  if (w <= -180) w += 360;
  return w;
}

export function at(tr: TraceSampler, f: number, deriv = false): Dual {
  const r = tr.at(f, deriv);
  if (typeof r === "string") throw new SolveFailed(r);
  return r;
}

export function range(tr: TraceSampler): string {
  const f = tr.freqs;
  return `between ${formatHz(f[0] ?? 0)} and ${formatHz(f[f.length - 1] ?? 0)}`;
}

/**
 * First crossing of g through zero in the sweep, refined by Brent's method on ln f.
 * `gs(k)` is g at sample k, `g(f)` solves the circuit again; `valid(k)` rejects sign changes
 * that are not crossings (phase wraps). A trace that only touches or starts on the level does
 * not cross it. Returns null when there is no crossing.
 */
function firstCrossing(
  tr: TraceSampler,
  gs: (k: number) => number,
  g: (f: number) => number,
  valid: (k: number) => boolean = () => true,
): number | null {
  const f = tr.freqs;
  const n = f.length;
  let k = 0;
  while (k < n && gs(k) === 0) k++;
  if (k >= n) return null;
  let prev = gs(k);
  for (; k + 1 < n; k++) {
    const next = gs(k + 1);
    if (next === 0) {
      // On the level at k+1…m−1: a crossing only if the trace leaves it on the other side.
      let m = k + 1;
      while (m < n && gs(m) === 0) m++;
      if (m >= n) return null;
      if (prev * gs(m) < 0) return f[k + 1]!;
      k = m - 1;
      prev = gs(m);
      continue;
    }
    if (prev * next < 0 && valid(k)) {
      const r = refineRoot(g, f[k]!, f[k + 1]!, prev, next);
      if (!Number.isNaN(r)) return r;
    }
    prev = next;
  }
  return null;
}

/** Sign of d|X|/dω at f from the analytic derivative: Re(conj(X)·j·dX/ds). */
function slope(tr: TraceSampler, f: number): number {
  const x = at(tr, f, true);
  return -x.re * x.dIm + x.im * x.dRe;
}

/** Frequency of the largest (sign = 1) or smallest (sign = −1) |X|, refined. */
export function extremum(tr: TraceSampler, sign: 1 | -1): { f: number; mag: number; k: number } {
  const fs = tr.freqs;
  let k = 0;
  for (let i = 1; i < fs.length; i++) {
    if (sign * mag(tr.re[i]!, tr.im[i]!) > sign * mag(tr.re[k]!, tr.im[k]!)) k = i;
  }
  if (k === 0 || k === fs.length - 1) return { f: fs[k]!, mag: mag(tr.re[k]!, tr.im[k]!), k };
  const h = (f: number) => sign * slope(tr, f);
  const lo = fs[k - 1]!;
  const mid = fs[k]!;
  const hi = fs[k + 1]!;
  const hm = h(mid);
  let best = mid;
  if (hm !== 0) {
    const [a, b] = hm > 0 ? [mid, hi] : [lo, mid];
    const ha = h(a);
    const hb = h(b);
    const r = refineRoot(h, a, b, ha, hb);
    if (!Number.isNaN(r)) best = r;
    else if (lo > 0) {
      const m = (f: number) => {
        const x = at(tr, f);
        return sign * mag(x.re, x.im);
      };
      best = Math.exp(goldenMax((x) => m(Math.exp(x)), Math.log(lo), Math.log(hi), 1e-10));
    }
  }
  const x = at(tr, best);
  return { f: best, mag: mag(x.re, x.im), k };
}

function levelScale(level: Level | undefined): number | null {
  if (!level || level.kind === "half-power") return Math.SQRT1_2;
  if (level.kind === "db") return 10 ** (level.value / 20);
  if (level.kind === "mag") return level.value;
  return null;
}

export function magnitudeCrossing(tr: TraceSampler, target: number): number | null {
  const lt = Math.log(target);
  return firstCrossing(
    tr,
    (k) => Math.log(mag(tr.re[k]!, tr.im[k]!)) - lt,
    (f) => {
      const x = at(tr, f);
      return Math.log(mag(x.re, x.im)) - lt;
    },
  );
}

export function phaseCrossing(tr: TraceSampler, levelDeg: number): number | null {
  const L = (levelDeg * Math.PI) / 180;
  const cl = Math.cos(L);
  const sl = Math.sin(L);
  // sin(∠X − L) = Im(X·e^{−jL})/|X|: continuous where ∠X is near L, its sign that of the wrapped difference.
  const s = (re: number, im: number) => (im * cl - re * sl) / mag(re, im);
  const d = (k: number) => wrapDeg(deg(tr.re[k]!, tr.im[k]!) - levelDeg);
  return firstCrossing(
    tr,
    (k) => s(tr.re[k]!, tr.im[k]!),
    (f) => {
      const x = at(tr, f);
      return s(x.re, x.im);
    },
    (k) => Math.abs(d(k) - d(k + 1)) < 180,
  );
}

export function bandwidth(tr: TraceSampler, level: Level | undefined): Outcome {
  const scale = levelScale(level);
  if (scale === null || !(scale > 0 && scale < 1)) {
    return {
      reason: "bandwidth needs a level below the peak: half-power, a negative dB value or a magnitude < 1",
    };
  }
  const pk = extremum(tr, 1);
  const thr = pk.mag * scale;
  const lt = Math.log(thr);
  const fs = tr.freqs;
  const g = (f: number) => {
    const x = at(tr, f);
    return Math.log(mag(x.re, x.im)) - lt;
  };
  const edge = (k: number, inner: number): number => {
    const a = fs[k]!;
    const ga = g(a);
    let b = inner;
    let gb = g(b);
    if (ga * gb > 0) {
      b = pk.f;
      gb = g(b);
    }
    return refineRoot(g, a, b, ga, gb);
  };
  let lower = 0;
  for (let k = pk.k - 1; k >= 0; k--) {
    if (mag(tr.re[k]!, tr.im[k]!) < thr) {
      lower = edge(k, fs[k + 1]!);
      break;
    }
  }
  let upper: number | null = null;
  for (let k = pk.k + 1; k < fs.length; k++) {
    if (mag(tr.re[k]!, tr.im[k]!) < thr) {
      upper = edge(k, fs[k - 1]!);
      break;
    }
  }
  if (upper === null) {
    return {
      reason: `|${tr.name}| stays above the band's edge up to the sweep's end (${formatHz(fs.at(-1) ?? 0)})`,
    };
  }
  if (!Number.isFinite(lower) || !Number.isFinite(upper))
    return { reason: "the band's edges could not be refined" };
  return { value: upper - lower };
}
