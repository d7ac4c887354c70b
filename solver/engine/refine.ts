/**
 * Reading a swept trace precisely: crossings, extrema and band edges are bracketed on the sweep's
 * points, then refined by solving the circuit again at new frequencies (never by interpolation).
 * One method for every reading, kept in one file (over 250 lines) so its tolerances live in one place.
 */
import { deg, wrapDeg } from "../angles";
import type { Level } from "../types";
import { formatHz } from "./ac";
import { hiddenExtrema, lnMagnitudeSlope, merged, type Pt, phaseSlope, type Quantity } from "./extrema";
import type { Dual } from "./probes";
import { brentRoot } from "./roots";

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
// The angles are defined once in solver/angles.ts; measures.ts and trace.ts still import them from here.
export { deg, wrapDeg };

export function at(tr: TraceSampler, f: number, deriv = false): Dual {
  const r = tr.at(f, deriv);
  if (typeof r === "string") throw new SolveFailed(r);
  return r;
}

export function range(tr: TraceSampler): string {
  const f = tr.freqs;
  return `between ${formatHz(f[0] ?? 0)} and ${formatHz(f[f.length - 1] ?? 0)}`;
}

/** A level the trace reaches only within this distance (ln |X| or sin of the phase error) is rounding. */
export const ROUNDING = 1e-10;

/** The sweep's samples as points. */
function samplePts(tr: TraceSampler): Pt[] {
  return tr.freqs.map((f, k) => ({ f, re: tr.re[k]!, im: tr.im[k]! }));
}

/**
 * First crossing of g through zero over the points (sweep samples plus refined extrema, so a
 * notch dipping through the level and back between two samples is seen), refined by Brent's
 * method on ln f. `valid(a, b)` rejects sign changes that are not crossings (phase wraps). A trace
 * that only touches or starts on the level does not cross it; a sign change where both points lie
 * within ROUNDING of the level is rounding, not a crossing. Returns the frequency, or null with
 * `rounding` telling whether a sign change was rejected as rounding.
 */
function firstCrossing(
  pts: Pt[],
  gp: (p: Pt) => number,
  g: (f: number) => number,
  valid: (a: Pt, b: Pt) => boolean = () => true,
): { f: number | null; rounding: boolean } {
  const n = pts.length;
  const gs = pts.map(gp);
  let rounding = false;
  let k = 0;
  while (k < n && gs[k] === 0) k++;
  if (k >= n) return { f: null, rounding };
  let prev = gs[k]!;
  for (; k + 1 < n; k++) {
    const next = gs[k + 1]!;
    if (next === 0) {
      // On the level at k+1…m−1: a crossing only if the trace leaves it on the other side.
      let m = k + 1;
      while (m < n && gs[m] === 0) m++;
      if (m >= n) return { f: null, rounding };
      if (prev * gs[m]! < 0) {
        if (Math.max(Math.abs(prev), Math.abs(gs[m]!)) > ROUNDING) return { f: pts[k + 1]!.f, rounding };
        rounding = true;
      }
      k = m - 1;
      prev = gs[m]!;
      continue;
    }
    if (prev * next < 0 && valid(pts[k]!, pts[k + 1]!)) {
      if (Math.max(Math.abs(prev), Math.abs(next)) <= ROUNDING) rounding = true;
      else {
        const r = refineRoot(g, pts[k]!.f, pts[k + 1]!.f, prev, next);
        if (!Number.isNaN(r)) return { f: r, rounding };
      }
    }
    prev = next;
  }
  return { f: null, rounding };
}

/** Index after which the samples' first (valid, beyond rounding) sign change of g lies; the last index if none. */
function firstSignChange(
  pts: Pt[],
  gp: (p: Pt) => number,
  valid: (a: Pt, b: Pt) => boolean = () => true,
): number {
  let prev = 0;
  for (let k = 0; k < pts.length; k++) {
    const g = gp(pts[k]!);
    if (g === 0) continue;
    if (prev * g < 0 && Math.max(Math.abs(prev), Math.abs(g)) > ROUNDING && valid(pts[k - 1]!, pts[k]!))
      return k;
    prev = g;
  }
  return pts.length - 1;
}

/** ln|X|: its extrema are those of |X|, and its bends are read on a scale fit for many decades. */
const magnitude: Quantity = { value: (re, im) => Math.log(mag(re, im)), slope: lnMagnitudeSlope };

/** |X| over the sweep is flat to within rounding: no peak, dip or band to speak of. */
export function isFlat(tr: TraceSampler): boolean {
  let lo = Number.POSITIVE_INFINITY;
  let hi = 0;
  for (let k = 0; k < tr.freqs.length; k++) {
    const m = mag(tr.re[k]!, tr.im[k]!);
    lo = Math.min(lo, m);
    hi = Math.max(hi, m);
  }
  return hi - lo <= ROUNDING * hi;
}

/**
 * Frequency of the largest (sign = 1) or smallest (sign = −1) |X| over the sweep: every local
 * extremum and bend of the samples is refined (`hiddenExtrema`), then the global one is taken.
 * `pts` is the samples with the refined extrema merged in; `k` the peak's index in it.
 */
export function extremum(tr: TraceSampler, sign: 1 | -1): { f: number; mag: number; k: number; pts: Pt[] } {
  const pts = merged(
    samplePts(tr),
    hiddenExtrema(samplePts(tr), magnitude, (f, d) => at(tr, f, d)),
  );
  let k = 0;
  for (let i = 1; i < pts.length; i++) {
    if (sign * mag(pts[i]!.re, pts[i]!.im) > sign * mag(pts[k]!.re, pts[k]!.im)) k = i;
  }
  return { f: pts[k]!.f, mag: mag(pts[k]!.re, pts[k]!.im), k, pts };
}

function levelScale(level: Level | undefined): number | null {
  if (!level || level.kind === "half-power") return Math.SQRT1_2;
  if (level.kind === "db") return 10 ** (level.value / 20);
  if (level.kind === "mag") return level.value;
  return null;
}

/** First frequency where |X| crosses target; null with `rounding` when only rounding crosses it. */
export function magnitudeCrossing(tr: TraceSampler, target: number): { f: number | null; rounding: boolean } {
  const lt = Math.log(target);
  const pts0 = samplePts(tr);
  const gp = (p: Pt) => Math.log(mag(p.re, p.im)) - lt;
  const last = firstSignChange(pts0, gp);
  const pts = merged(
    pts0,
    hiddenExtrema(pts0, magnitude, (f, d) => at(tr, f, d), last),
  );
  return firstCrossing(pts, gp, (f) => {
    const x = at(tr, f);
    return Math.log(mag(x.re, x.im)) - lt;
  });
}

export function phaseCrossing(tr: TraceSampler, levelDeg: number): { f: number | null; rounding: boolean } {
  const L = (levelDeg * Math.PI) / 180;
  const cl = Math.cos(L);
  const sl = Math.sin(L);
  // sin(∠X − L) = Im(X·e^{−jL})/|X|: continuous where ∠X is near L, its sign that of the wrapped difference.
  const s = (re: number, im: number) => (im * cl - re * sl) / mag(re, im);
  // Its slope: cos(∠X − L)·d∠X/dω; extrema of the phase (two crossings close together) are refined too.
  const q: Quantity = {
    value: s,
    slope: (x) => ((x.re * cl + x.im * sl) / mag(x.re, x.im)) * phaseSlope(x),
  };
  const d = (p: Pt) => wrapDeg(deg(p.re, p.im) - levelDeg);
  const pts0 = samplePts(tr);
  const valid = (a: Pt, b: Pt) => Math.abs(d(a) - d(b)) < 180;
  const last = firstSignChange(pts0, (p) => s(p.re, p.im), valid);
  const pts = merged(
    pts0,
    hiddenExtrema(pts0, q, (f, dv) => at(tr, f, dv), last),
  );
  return firstCrossing(
    pts,
    (p) => s(p.re, p.im),
    (f) => {
      const x = at(tr, f);
      return s(x.re, x.im);
    },
    valid,
  );
}

export function bandwidth(tr: TraceSampler, level: Level | undefined): Outcome {
  const scale = levelScale(level);
  if (scale === null || !(scale > 0 && scale < 1)) {
    return {
      reason: "bandwidth needs a level below the peak: half-power, a negative dB value or a magnitude < 1",
    };
  }
  if (isFlat(tr)) return { reason: flatReason(tr, "no band") };
  const pk = extremum(tr, 1);
  const { pts } = pk;
  const thr = pk.mag * scale;
  const lt = Math.log(thr);
  const g = (f: number) => {
    const x = at(tr, f);
    return Math.log(mag(x.re, x.im)) - lt;
  };
  const edge = (k: number, inner: number): number => {
    const a = pts[k]!.f;
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
    if (mag(pts[k]!.re, pts[k]!.im) < thr) {
      lower = edge(k, pts[k + 1]!.f);
      break;
    }
  }
  let upper: number | null = null;
  for (let k = pk.k + 1; k < pts.length; k++) {
    if (mag(pts[k]!.re, pts[k]!.im) < thr) {
      upper = edge(k, pts[k - 1]!.f);
      break;
    }
  }
  if (upper === null) {
    const fs = tr.freqs;
    return {
      reason: `|${tr.name}| stays above the band's edge up to the sweep's end (${formatHz(fs.at(-1) ?? 0)})`,
    };
  }
  if (!Number.isFinite(lower) || !Number.isFinite(upper))
    return { reason: "the band's edges could not be refined" };
  return { value: upper - lower };
}

/** Why a flat trace has no peak/dip/band. */
export function flatReason(tr: TraceSampler, what: string): string {
  return `|${tr.name}| is flat to within rounding ${range(tr)}, so it has ${what}`;
}
