import type { LUFactors } from "./sparse-lu-factors";
import type { PivotTests } from "./sparse-lu-scaling";
import { factorScatter } from "./sparse-lu-scatter";

/**
 * Numeric factorization of A = re + j·imScale·im into `f` over its current order (`f.use`), by the
 * order's plan; false on a failed pivot (the verdict in f.singular / f.failedStep / f.failedCols).
 * τ = 0 skips the threshold test (the values the ordering was analysed on).
 * The tests, squared and multiplied out (no square root or division per step): with
 * cm[k] = 1/c_k², rm[k] = 1/r_k² from `PivotTests.prepare` (c, r: the column and row factors),
 *  - zero pivot: |u_kk|·c_k·r_k ≤ absTol  ⇔  |u_kk|² ≤ absTol²·rm[k]·cm[k];
 *  - threshold: |u_kk|·c_k ≥ τ·(|re|+|im|)(u_kj)·c_j/√2 for every j of U's row k (|x|₁/√2 ≤ |x|₂,
 *    a conservative bound; the row factor cancels)  ⇔  |u_kk|²·cm[j] ≥ ½τ²·(|re|+|im|)²·cm[k].
 * Two steps: load every slot (one flat pass, or a copy from the pencil's slots: `factorPencil`),
 * then one loop over the rows (up-looking elimination: eliminate, test the pivot), kept in one
 * function on purpose: it is the sweep's hot loop, and a helper per row would add a call and
 * re-read the arrays. Loading row by row inside that loop cost three short loops per row.
 */
export function factorNumeric(
  f: LUFactors,
  tests: PivotTests,
  re: Float64Array,
  im: Float64Array,
  imScale: number,
  tau: number,
): boolean {
  const plan = f.plan!;
  f.forwardRe = null;
  f.forwardIm = null;
  if (!plan.upd) return factorScatter(f, tests, re, im, imScale, tau);
  // Every slot starts as its entry of A (zero at fill), in one flat pass before the elimination:
  // a row's elimination writes only its own slots, so no slot is read before it is loaded.
  const { src } = plan;
  const { fac } = f;
  for (let t = 0; t < src.length; t++) {
    const p = src[t]!;
    fac[2 * t] = p >= 0 ? re[p]! : 0;
    fac[2 * t + 1] = p >= 0 ? imScale * im[p]! : 0;
  }
  return eliminate(f, tests, tau, null, null);
}

/**
 * `factorNumeric` of A = G + jωC from the pencil's values laid out in the plan's slots
 * (`Plan.slotG`, `Plan.cSlots`, see `planPencil`): the load is a copy and a scaled copy, the same
 * numbers bit for bit as gathering g[p] and ω·c[p] (and 0 at fill, for ω ≥ 0).
 * Needs the plan's update slots and ω finite and ≥ 0 (the caller checks).
 * With a right-hand side b it also runs the forward substitution L·y = P·b along the elimination
 * (row k of L is final at step k), the same arithmetic as `solveFactors`' forward pass, which a
 * `solve` of the same b arrays then skips (see `LUFactors.forwardRe`). The pivot tests are the
 * maxima of one Ruiz step at ω from the plan's pencil (`pencilTests`), computed with the load in the
 * order's memory; `tests` gives the zero-pivot bound (after `PivotTests.oneStep`).
 */
export function factorPencil(
  f: LUFactors,
  tests: PivotTests,
  omega: number,
  tau: number,
  bRe: Float64Array | null,
  bIm: Float64Array | null,
): boolean {
  const space = f.space!;
  f.forwardRe = null;
  f.forwardIm = null;
  space.stagePencil(f.plan!);
  f.clearFailure();
  const tol2 = tests.absTol * tests.absTol;
  const k = space.factorPencil(omega, tol2, 0.5 * tau * tau, bRe, bIm);
  return finish(f, k, tol2, space.tests, bRe, bIm);
}

/**
 * The elimination over the plan's slots, after every slot holds its entry of A: row by row
 * (up-looking), each product landing on the slot the plan recorded for it, then the pivot tests;
 * with b, the forward substitution into f.w as it goes (see `factorPencil`). The loop itself is
 * WebAssembly (`eliminate` in lu-kernels.wat, through the order's `KernelSpace`): for each row k,
 *  - for each entry q of L's row k (column j = lIdx[q], ascending): l = a_kj · (1/u_jj), stored in
 *    q's slot; with b, y_k −= l·y_j; unless l = 0, every entry of U's row j is multiplied by l and
 *    subtracted from the slot `upd` recorded for it;
 *  - the pivot d = |u_kk|² and the tests above; on a failure it stops at k;
 *  - inv_k = conj(u_kk)/d, and y_k into w.
 */
function eliminate(
  f: LUFactors,
  tests: PivotTests,
  tau: number,
  bRe: Float64Array | null,
  bIm: Float64Array | null,
): boolean {
  const tol2 = tests.absTol * tests.absTol;
  f.clearFailure();
  const k = f.space!.eliminate(tests.cm, tests.rm, tol2, 0.5 * tau * tau, bRe, bIm);
  return finish(f, k, tol2, tests, bRe, bIm);
}

/**
 * After an elimination that stopped at step k (−1: it did not): the verdict (`pivotFailed`, singular
 * when the pivot was below the zero bound of the tests cm/rm used), or the forward pass of b noted.
 */
function finish(
  f: LUFactors,
  k: number,
  tol2: number,
  tests: { cm: Float64Array; rm: Float64Array },
  bRe: Float64Array | null,
  bIm: Float64Array | null,
): boolean {
  if (k >= 0) {
    const dk = 2 * (f.sym!.lIdx.length + f.sym!.uIdx.length + k);
    const pr = f.fac[dk]!;
    const pi = f.fac[dk + 1]!;
    const d = pr * pr + pi * pi;
    return f.pivotFailed(k, d <= tol2 * tests.rm[k]! * tests.cm[k]!);
  }
  if (bRe !== null && bIm !== null) {
    f.forwardRe = bRe;
    f.forwardIm = bIm;
  }
  return true;
}
