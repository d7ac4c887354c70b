/** Damped Newton on the harmonic-balance system, with a dense LU (partial pivoting) for each step. */
import type { HbSystem } from "./hb-system";

export interface NewtonOutcome {
  x: Float64Array;
  converged: boolean;
  iterations: number;
  /** max|R| relative to the largest port harmonic. */
  residual: number;
  reason: string | null;
}

/** Solve a·x = b in place (a row-major n×n, overwritten); false when singular. */
export function denseSolve(a: Float64Array, b: Float64Array, n: number): boolean {
  for (let col = 0; col < n; col++) {
    let piv = col;
    let best = Math.abs(a[col * n + col]!);
    for (let r = col + 1; r < n; r++) {
      const v = Math.abs(a[r * n + col]!);
      if (v > best) {
        best = v;
        piv = r;
      }
    }
    if (!(best > 0) || !Number.isFinite(best)) return false;
    if (piv !== col) {
      for (let c = 0; c < n; c++) {
        const t = a[col * n + c]!;
        a[col * n + c] = a[piv * n + c]!;
        a[piv * n + c] = t;
      }
      const t = b[col]!;
      b[col] = b[piv]!;
      b[piv] = t;
    }
    const d = a[col * n + col]!;
    for (let r = col + 1; r < n; r++) {
      const factor = a[r * n + col]! / d;
      if (factor === 0) continue;
      for (let c = col + 1; c < n; c++) a[r * n + c] = a[r * n + c]! - factor * a[col * n + c]!;
      b[r] = b[r]! - factor * b[col]!;
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = b[r]!;
    for (let c = r + 1; c < n; c++) s -= a[r * n + c]! * b[c]!;
    b[r] = s / a[r * n + r]!;
  }
  return true;
}

/** Largest port harmonic (every unknown but ω). */
export function scaleOf(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) if (i !== 2) s = Math.max(s, Math.abs(x[i]!));
  return s;
}

function norm(r: Float64Array, x: Float64Array): number {
  let m = 0;
  for (const v of r) m = Math.max(m, Math.abs(v));
  return m / Math.max(scaleOf(x), 1e-300);
}

export const TOLERANCE = 1e-9;
const MAX_ITERATIONS = 60;

/** Damped Newton from x0: each step halved until the residual falls (at most 12 times). */
export function newton(sys: HbSystem, x0: Float64Array): NewtonOutcome {
  let x = Float64Array.from(x0);
  let ev = sys.evaluate(x, true);
  if (ev === null) return fail(x, 0, Number.NaN, "the network is singular at the starting frequency");
  let res = norm(ev.r, x);
  for (let it = 1; it <= MAX_ITERATIONS; it++) {
    const step = Float64Array.from(ev.r);
    if (!denseSolve(ev.j!, step, sys.size))
      return fail(x, it, res, "the harmonic-balance Jacobian is singular");
    let lambda = 1;
    let accepted = false;
    for (let halving = 0; halving < 12; halving++, lambda /= 2) {
      const trial = x.map((v, i) => v - lambda * step[i]!);
      if (!(sys.omega(trial) > 0)) continue;
      const tev = sys.evaluate(trial, false);
      if (tev === null) continue;
      const tres = norm(tev.r, trial);
      if (tres < res || tres < TOLERANCE) {
        x = trial;
        res = tres;
        accepted = true;
        break;
      }
    }
    if (!accepted) return fail(x, it, res, "Newton's steps stopped reducing the residual");
    if (res < TOLERANCE) return { x, converged: true, iterations: it, residual: res, reason: null };
    const next = sys.evaluate(x, true);
    if (next === null) return fail(x, it, res, "the network became singular during the iterations");
    ev = next;
  }
  return fail(x, MAX_ITERATIONS, res, `no convergence in ${MAX_ITERATIONS} Newton steps`);
}

function fail(x: Float64Array, iterations: number, residual: number, reason: string): NewtonOutcome {
  return { x, converged: false, iterations, residual, reason };
}
