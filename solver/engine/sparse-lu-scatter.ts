import type { LUFactors } from "./sparse-lu-factors";
import type { PivotTests } from "./sparse-lu-scaling";

/**
 * `factorNumeric` with a dense scatter vector instead of the plan's update slots: for orders whose
 * elimination would need more than PLAN_LIMIT recorded updates (much fill). Same arithmetic, and
 * one algorithm in one function for the same reason.
 */
export function factorScatter(
  f: LUFactors,
  tests: PivotTests,
  re: Float64Array,
  im: Float64Array,
  imScale: number,
  tau: number,
): boolean {
  const s = f.sym!;
  const { rowPtr } = f.a;
  const { rowPerm, lPtr, lIdx, uPtr, uIdx } = s;
  const aPos = f.plan!.aPos;
  const { fac, inv, w, n } = f;
  const offU = lIdx.length;
  const { cm, rm } = tests;
  const tol2 = tests.absTol * tests.absTol;
  const half = 0.5 * tau * tau;
  f.clearFailure();
  // The scatter vector starts at zero (`solve` uses it as scratch too); each row leaves it zero,
  // so no row has to clear its pattern first.
  w.fill(0);
  let l0 = 0;
  let u0 = 0;
  for (let k = 0; k < n; k++) {
    const l1 = lPtr[k + 1]!;
    const u1 = uPtr[k + 1]!;
    // Scatter row rowPerm[k] of A (w is zero here: every entry of the row's pattern is zeroed as
    // it is read below, and every entry written lies in that pattern).
    const r = rowPerm[k]!;
    const p1 = rowPtr[r + 1]!;
    for (let p = rowPtr[r]!; p < p1; p++) {
      const j = 2 * aPos[p]!;
      w[j] = w[j]! + re[p]!;
      w[j + 1] = w[j + 1]! + imScale * im[p]!;
    }
    // Eliminate with earlier rows, in ascending order of the L pattern.
    for (let q = l0; q < l1; q++) {
      const j = lIdx[q]!;
      const xr = w[2 * j]!;
      const xi = w[2 * j + 1]!;
      w[2 * j] = 0;
      w[2 * j + 1] = 0;
      const ir = inv[2 * j]!;
      const ii = inv[2 * j + 1]!;
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      fac[2 * q] = lr;
      fac[2 * q + 1] = li;
      if (lr === 0 && li === 0) continue;
      const t1 = uPtr[j + 1]!;
      for (let t = uPtr[j]!; t < t1; t++) {
        const c = 2 * uIdx[t]!;
        const ur = fac[2 * (offU + t)]!;
        const ui = fac[2 * (offU + t) + 1]!;
        w[c] = w[c]! - (lr * ur - li * ui);
        w[c + 1] = w[c + 1]! - (lr * ui + li * ur);
      }
    }
    const pr = w[2 * k]!;
    const pi = w[2 * k + 1]!;
    w[2 * k] = 0;
    w[2 * k + 1] = 0;
    const d = pr * pr + pi * pi;
    const ck = cm[k]!;
    const hk = half * ck;
    let small = d <= tol2 * rm[k]! * ck;
    // Gather U's row (leaving w zero) and test each entry against the pivot.
    for (let t = u0; t < u1; t++) {
      const c = uIdx[t]!;
      const vr = w[2 * c]!;
      const vi = w[2 * c + 1]!;
      fac[2 * (offU + t)] = vr;
      fac[2 * (offU + t) + 1] = vi;
      w[2 * c] = 0;
      w[2 * c + 1] = 0;
      const m = Math.abs(vr) + Math.abs(vi);
      if (d * cm[c]! < hk * m * m) small = true;
    }
    l0 = l1;
    u0 = u1;
    if (small) return f.pivotFailed(k, d <= tol2 * rm[k]! * ck);
    const id = 1 / d;
    inv[2 * k] = pr * id;
    inv[2 * k + 1] = -pi * id;
  }
  return true;
}
