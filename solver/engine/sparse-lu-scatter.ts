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
  const { lRe, lIm, uRe, uIm, invRe, invIm, wRe, wIm, n } = f;
  const { cm, rm } = tests;
  const tol2 = tests.absTol * tests.absTol;
  const half = 0.5 * tau * tau;
  f.clearFailure();
  // The scatter vector starts at zero (`solve` uses it as scratch too); each row leaves it zero,
  // so no row has to clear its pattern first.
  wRe.fill(0);
  wIm.fill(0);
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
      const j = aPos[p]!;
      wRe[j] = wRe[j]! + re[p]!;
      wIm[j] = wIm[j]! + imScale * im[p]!;
    }
    // Eliminate with earlier rows, in ascending order of the L pattern.
    for (let q = l0; q < l1; q++) {
      const j = lIdx[q]!;
      const xr = wRe[j]!;
      const xi = wIm[j]!;
      wRe[j] = 0;
      wIm[j] = 0;
      const ir = invRe[j]!;
      const ii = invIm[j]!;
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      lRe[q] = lr;
      lIm[q] = li;
      if (lr === 0 && li === 0) continue;
      const t1 = uPtr[j + 1]!;
      for (let t = uPtr[j]!; t < t1; t++) {
        const c = uIdx[t]!;
        const ur = uRe[t]!;
        const ui = uIm[t]!;
        wRe[c] = wRe[c]! - (lr * ur - li * ui);
        wIm[c] = wIm[c]! - (lr * ui + li * ur);
      }
    }
    const pr = wRe[k]!;
    const pi = wIm[k]!;
    wRe[k] = 0;
    wIm[k] = 0;
    const d = pr * pr + pi * pi;
    const ck = cm[k]!;
    const hk = half * ck;
    let small = d <= tol2 * rm[k]! * ck;
    // Gather U's row (leaving w zero) and test each entry against the pivot.
    for (let t = u0; t < u1; t++) {
      const c = uIdx[t]!;
      const vr = wRe[c]!;
      const vi = wIm[c]!;
      uRe[t] = vr;
      uIm[t] = vi;
      wRe[c] = 0;
      wIm[c] = 0;
      const m = Math.abs(vr) + Math.abs(vi);
      if (d * cm[c]! < hk * m * m) small = true;
    }
    l0 = l1;
    u0 = u1;
    if (small) return f.pivotFailed(k, d <= tol2 * rm[k]! * ck);
    const inv = 1 / d;
    invRe[k] = pr * inv;
    invIm[k] = -pi * inv;
  }
  return true;
}
