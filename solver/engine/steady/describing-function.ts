/**
 * The describing-function estimate that starts harmonic balance (A. Gelb and W. E. Vander Velde,
 * *Multiple-Input Describing Functions and Nonlinear System Design*, 1968): each limiter is replaced
 * by its equivalent gain N(A) for a sine of amplitude A across it; the oscillation sits where the
 * loop through the first port, L(jω)·N(A), is 1 at zero phase.
 */
import { type Port, portLaw } from "./ports";
import type { Transfer } from "./transfer";

const DF_SAMPLES = 256;

/** Equivalent gain of a port's law for w = A·cos θ: the fundamental of u divided by A. */
export function describingGain(port: Port, amplitude: number, samples = DF_SAMPLES): number {
  let s = 0;
  for (let i = 0; i < samples; i++) {
    const c = Math.cos((2 * Math.PI * i) / samples);
    s += portLaw(port, amplitude * c).u * c;
  }
  return (2 * s) / samples / amplitude;
}

/**
 * The loop through port e with every other port closed by its small-signal slope g_f = f′(0)
 * (a swing limit passes its signal, an unbiased diode is practically open):
 * L_eff = L_ee + L_er·G·(I − L_rr·G)⁻¹·L_re. Also the other ports' response per unit input at e.
 */
export function effectiveLoop(
  t: Transfer,
  e: number,
  omega: number,
): { re: number; im: number; others: { re: number; im: number }[] } | null {
  const l = t.at(omega);
  if (l === null) return null;
  const p = t.p;
  const rest = [...Array(p).keys()].filter((f) => f !== e);
  const g = t.ports.map((port) => portLaw(port, 0).g);
  // Solve (I − L_rr·G)·y = L_re for y (complex, Gaussian elimination on the small system).
  const m = rest.length;
  const a = rest.map((i) =>
    rest.flatMap((j) => {
      const re = (i === j ? 1 : 0) - l.re[i * p + j]! * g[j]!;
      const im = -l.im[i * p + j]! * g[j]!;
      return [re, im];
    }),
  );
  const b = rest.map((i) => [l.re[i * p + e]!, l.im[i * p + e]!]);
  const y = complexSolve(a, b, m);
  if (y === null) return null;
  let re = l.re[e * p + e]!;
  let im = l.im[e * p + e]!;
  rest.forEach((j, k) => {
    const [yr, yi] = [y[k]![0]! * g[j]!, y[k]![1]! * g[j]!];
    re += l.re[e * p + j]! * yr - l.im[e * p + j]! * yi;
    im += l.re[e * p + j]! * yi + l.im[e * p + j]! * yr;
  });
  const others = Array.from({ length: p }, () => ({ re: 0, im: 0 }));
  rest.forEach((j, k) => {
    others[j] = { re: y[k]![0]!, im: y[k]![1]! };
  });
  return { re, im, others };
}

/** Complex Gaussian elimination with partial pivoting; rows of a are [re, im, re, im, …]. */
function complexSolve(a: number[][], b: number[][], m: number): number[][] | null {
  for (let c = 0; c < m; c++) {
    let piv = c;
    for (let r = c + 1; r < m; r++)
      if (Math.hypot(a[r]![2 * c]!, a[r]![2 * c + 1]!) > Math.hypot(a[piv]![2 * c]!, a[piv]![2 * c + 1]!))
        piv = r;
    [a[c], a[piv]] = [a[piv]!, a[c]!];
    [b[c], b[piv]] = [b[piv]!, b[c]!];
    const dr = a[c]![2 * c]!;
    const di = a[c]![2 * c + 1]!;
    const d2 = dr * dr + di * di;
    if (!(d2 > 0)) return null;
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const nr = a[r]![2 * c]!;
      const ni = a[r]![2 * c + 1]!;
      const fr = (nr * dr + ni * di) / d2;
      const fi = (ni * dr - nr * di) / d2;
      for (let k = 0; k < m; k++) {
        const xr = a[c]![2 * k]!;
        const xi = a[c]![2 * k + 1]!;
        a[r]![2 * k] = a[r]![2 * k]! - (fr * xr - fi * xi);
        a[r]![2 * k + 1] = a[r]![2 * k + 1]! - (fr * xi + fi * xr);
      }
      b[r] = [b[r]![0]! - (fr * b[c]![0]! - fi * b[c]![1]!), b[r]![1]! - (fr * b[c]![1]! + fi * b[c]![0]!)];
    }
  }
  return b.map((v, r) => {
    const dr = a[r]![2 * r]!;
    const di = a[r]![2 * r + 1]!;
    const d2 = dr * dr + di * di;
    return [(v[0]! * dr + v[1]! * di) / d2, (v[1]! * dr - v[0]! * di) / d2];
  });
}

/**
 * The frequency near omega0 where L_00 is real and positive (a sign change of its imaginary part,
 * refined by bisection), searched over a decade each way; null if there is none.
 */
export function zeroPhaseNear(
  t: Transfer,
  e: number,
  omega0: number,
): { omega: number; gain: number } | null {
  const loopAt = (w: number) => effectiveLoop(t, e, w);
  const steps = 80;
  let best: { omega: number; gain: number } | null = null;
  let prev: { w: number; v: { re: number; im: number } } | null = null;
  for (let i = 0; i <= steps; i++) {
    const w = omega0 * 10 ** (-1 + (2 * i) / steps);
    const v = loopAt(w);
    if (v === null) {
      prev = null;
      continue;
    }
    if (prev && Math.sign(prev.v.im) !== Math.sign(v.im) && (prev.v.re > 0 || v.re > 0)) {
      let lo = prev.w;
      let hi = w;
      let flo = prev.v.im;
      for (let b = 0; b < 60 && hi / lo > 1 + 1e-12; b++) {
        const mid = Math.sqrt(lo * hi);
        const fm = loopAt(mid);
        if (fm === null) break;
        if (Math.sign(fm.im) === Math.sign(flo)) {
          lo = mid;
          flo = fm.im;
        } else hi = mid;
      }
      const omega = Math.sqrt(lo * hi);
      const g = loopAt(omega);
      if (
        g &&
        g.re > 0 &&
        (!best || Math.abs(Math.log(omega / omega0)) < Math.abs(Math.log(best.omega / omega0)))
      )
        best = { omega, gain: g.re };
    }
    prev = { w, v };
  }
  return best;
}

/** The amplitude A with N(A) = target, by bisection on log A over 1e-6…1e9; null if none. */
export function amplitudeFor(port: Port, target: number): number | null {
  const grid = Array.from({ length: 15 * 4 + 1 }, (_, i) => 10 ** (-6 + i / 4));
  let prevA = grid[0]!;
  let prevF = describingGain(port, prevA) - target;
  for (const a of grid.slice(1)) {
    const f = describingGain(port, a) - target;
    if (Math.sign(f) !== Math.sign(prevF) && f !== 0) {
      let lo = prevA;
      let hi = a;
      let flo = prevF;
      for (let b = 0; b < 60 && hi / lo > 1 + 1e-9; b++) {
        const mid = Math.sqrt(lo * hi);
        const fm = describingGain(port, mid) - target;
        if (Math.sign(fm) === Math.sign(flo)) {
          lo = mid;
          flo = fm;
        } else hi = mid;
      }
      return Math.sqrt(lo * hi);
    }
    if (f === 0) return a;
    prevA = a;
    prevF = f;
  }
  return null;
}

/** A start of harmonic balance: ω and the fundamental (two-sided) of every port's control variable. */
export interface Estimate {
  omega: number;
  /** The describing-function port and the amplitude across it. */
  port: number;
  amplitude: number;
  fundamentals: { re: number; im: number }[];
}

/**
 * The estimate with port e as the limiter (the others linear), or the reason there is none. The
 * fundamentals are turned so that port 0's is real (its phase is the reference of the equations).
 */
export function describingEstimate(t: Transfer, e: number, omega0: number): Estimate | { reason: string } {
  const z = zeroPhaseNear(t, e, omega0);
  if (z === null) return { reason: "the limiter's loop has no zero-phase frequency near the growing poles" };
  const port = t.ports[e]!;
  const a = amplitudeFor(port, 1 / z.gain);
  if (a === null)
    return { reason: `no amplitude makes the limiter's equivalent gain ${(1 / z.gain).toPrecision(4)}` };
  const loop = effectiveLoop(t, e, z.omega)!;
  const u = describingGain(port, a) * (a / 2);
  const f = loop.others.map((o, j) => (j === e ? { re: a / 2, im: 0 } : { re: o.re * u, im: o.im * u }));
  const ref = Math.atan2(f[0]!.im, f[0]!.re);
  const c = Math.cos(ref);
  const s = Math.sin(ref);
  const fundamentals = f.map((v) => ({ re: v.re * c + v.im * s, im: v.im * c - v.re * s }));
  return { omega: z.omega, port: e, amplitude: a, fundamentals };
}
