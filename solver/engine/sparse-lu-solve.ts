import type { Symbolic } from "./markowitz";
import type { LUFactors } from "./sparse-lu-factors";

/**
 * Solve A·x = b with the factors f (P·A·Q = L·U): forward with L, backward with U. x may alias b.
 * Cost O(nnz(L)+nnz(U)+n).
 * Returns false when x has a NaN or ±∞ (an overflow: the equations are singular in effect).
 * Throws if the last factorization was singular (a programming error, never user input).
 */
export function solveFactors(
  f: LUFactors,
  bRe: Float64Array,
  bIm: Float64Array,
  xRe: Float64Array,
  xIm: Float64Array,
): boolean {
  if (f.singular || !f.sym) throw new Error("matrix is singular: cannot solve");
  const n = f.n;
  if (bRe.length !== n || bIm.length !== n || xRe.length !== n || xIm.length !== n) {
    throw new RangeError("dimension mismatch: right-hand side length ≠ n");
  }
  const { rowPerm, lPtr, lIdx } = f.sym;
  const { lRe, lIm, wRe, wIm } = f;
  // The factorization ran the forward pass of this b already (`factorPencil`): y is in w.
  const forwarded = f.forwardRe === bRe && f.forwardIm === bIm;
  f.forwardRe = null;
  f.forwardIm = null;
  let q0 = 0;
  for (let k = forwarded ? n : 0; k < n; k++) {
    const r = rowPerm[k]!;
    let yr = bRe[r]!;
    let yi = bIm[r]!;
    const q1 = lPtr[k + 1]!;
    for (let q = q0; q < q1; q++) {
      const j = lIdx[q]!;
      yr -= lRe[q]! * wRe[j]! - lIm[q]! * wIm[j]!;
      yi -= lRe[q]! * wIm[j]! + lIm[q]! * wRe[j]!;
    }
    q0 = q1;
    wRe[k] = yr;
    wIm[k] = yi;
  }
  return backward(f, xRe, xIm, f.descending);
}

/**
 * Solve A·x = −M·v with the factors f, for a sparse real M in CSR (mPtr, mIdx, mVal; the C of
 * A(s) = G + s·C gives dx/ds = −A⁻¹·C·x): each entry of −M·v is formed as the forward pass
 * reaches its row, the same arithmetic as forming −M·v first and calling `solveFactors`.
 * v must not alias x. Cost O(nnz(M)+nnz(L)+nnz(U)+n). Returns false when x is not finite.
 * With `steps` (from `backwardReach`), the backward pass runs over those steps only: x is then
 * right (the same numbers) at the unknowns the steps were reached from and stale elsewhere.
 */
export function solveFactorsOfProduct(
  f: LUFactors,
  m: { ptr: Int32Array; idx: Int32Array; val: Float64Array },
  vRe: Float64Array,
  vIm: Float64Array,
  xRe: Float64Array,
  xIm: Float64Array,
  steps: Int32Array | null = null,
): boolean {
  if (f.singular || !f.sym) throw new Error("matrix is singular: cannot solve");
  const n = f.n;
  if (vRe.length !== n || vIm.length !== n || xRe.length !== n || xIm.length !== n) {
    throw new RangeError("dimension mismatch: right-hand side length ≠ n");
  }
  forwardOfProduct(f, m, vRe, vIm);
  return backward(f, xRe, xIm, steps ?? f.descending);
}

/**
 * The forward half of `solveFactorsOfProduct`: L·y = −P·M·v into f.w. Its own function, not
 * written into the caller with `backward`: a first sweep runs interpreted until the optimizing
 * compiler has taken up each kernel, and one function holding both passes took it about twice as
 * long as this pass alone (`backward` is shared with `solveFactors`, compiled once).
 */
function forwardOfProduct(
  f: LUFactors,
  m: { ptr: Int32Array; idx: Int32Array; val: Float64Array },
  vRe: Float64Array,
  vIm: Float64Array,
): void {
  const { rowPerm, lPtr, lIdx } = f.sym!;
  const { lRe, lIm, wRe, wIm, n } = f;
  const { ptr, idx, val } = m;
  f.forwardRe = null;
  f.forwardIm = null;
  let q0 = 0;
  for (let k = 0; k < n; k++) {
    const r = rowPerm[k]!;
    let yr = 0;
    let yi = 0;
    const p1 = ptr[r + 1]!;
    for (let p = ptr[r]!; p < p1; p++) {
      const mv = val[p]!;
      const j = idx[p]!;
      yr -= mv * vRe[j]!;
      yi -= mv * vIm[j]!;
    }
    const q1 = lPtr[k + 1]!;
    for (let q = q0; q < q1; q++) {
      const j = lIdx[q]!;
      yr -= lRe[q]! * wRe[j]! - lIm[q]! * wIm[j]!;
      yi -= lRe[q]! * wIm[j]! + lIm[q]! * wRe[j]!;
    }
    q0 = q1;
    wRe[k] = yr;
    wIm[k] = yi;
  }
}

/**
 * The steps of the backward pass that x at the original unknowns `want` depends on, in the order
 * the pass takes them (descending): the steps of those unknowns and every step U's rows reach from
 * them. x_j at step k needs z at each column of U's row k, so the pass over these steps alone gives
 * the wanted unknowns exactly the numbers of the full pass. Cost O(n + the reached part of U).
 */
export function backwardReach(sym: Symbolic, want: Int32Array): Int32Array {
  const { colPos, uPtr, uIdx, n } = sym;
  const mark = new Uint8Array(n);
  const stack = new Int32Array(n);
  let top = 0;
  let count = 0;
  for (let w = 0; w < want.length; w++) {
    const k = colPos[want[w]!]!;
    if (mark[k] === 1) continue;
    mark[k] = 1;
    stack[top++] = k;
    count++;
  }
  while (top > 0) {
    const k = stack[--top]!;
    for (let t = uPtr[k]!; t < uPtr[k + 1]!; t++) {
      const j = uIdx[t]!;
      if (mark[j] === 1) continue;
      mark[j] = 1;
      stack[top++] = j;
      count++;
    }
  }
  const steps = new Int32Array(count);
  let c = 0;
  for (let k = n - 1; k >= 0; k--) if (mark[k] === 1) steps[c++] = k;
  return steps;
}

/**
 * U·z = y (y in f.w) over the given steps, descending — every step (`f.descending`), or those x at
 * some unknowns needs (`backwardReach`) — and x = Q·z there; false when x has a NaN or ±∞. One
 * function for both: the optimizing compiler takes up one kernel, not two, while a first sweep
 * runs interpreted.
 */
function backward(f: LUFactors, xRe: Float64Array, xIm: Float64Array, steps: Int32Array): boolean {
  const { colPerm, uPtr, uIdx } = f.sym!;
  const { uRe, uIm, invRe, invIm, wRe, wIm } = f;
  let finite = 0;
  for (let i = 0; i < steps.length; i++) {
    const k = steps[i]!;
    let yr = wRe[k]!;
    let yi = wIm[k]!;
    const t1 = uPtr[k + 1]!;
    for (let t = uPtr[k]!; t < t1; t++) {
      const j = uIdx[t]!;
      yr -= uRe[t]! * wRe[j]! - uIm[t]! * wIm[j]!;
      yi -= uRe[t]! * wIm[j]! + uIm[t]! * wRe[j]!;
    }
    const ir = invRe[k]!;
    const ii = invIm[k]!;
    const zr = yr * ir - yi * ii;
    const zi = yr * ii + yi * ir;
    wRe[k] = zr;
    wIm[k] = zi;
    xRe[colPerm[k]!] = zr;
    xIm[colPerm[k]!] = zi;
    // x·0 is 0 for every finite x and NaN for ±∞ or NaN.
    finite += zr * 0 + zi * 0;
  }
  return finite === 0;
}

/**
 * Solve Aᵀ·z = d (the plain transpose, no conjugate) with the factors f: the adjoint
 * system of noise analysis. With P·A·Q = L·U, Aᵀ = Q·Uᵀ·Lᵀ·P, so w = Qᵀ·d, Uᵀ·y = w (forward,
 * scattering U's rows), Lᵀ·v = y (backward, scattering L's rows), z = Pᵀ·v. z may alias d.
 * Cost O(nnz(L)+nnz(U)+n), as `solve`, less the rows a sparse d leaves at zero (skipped: such an
 * entry of z may come out −0 where the full arithmetic gives +0 or the reverse — the same value).
 */
export function solveFactorsTransposed(
  f: LUFactors,
  dRe: Float64Array,
  dIm: Float64Array,
  zRe: Float64Array,
  zIm: Float64Array,
): void {
  if (f.singular || !f.sym) throw new Error("matrix is singular: cannot solve");
  const n = f.n;
  if (dRe.length !== n || dIm.length !== n || zRe.length !== n || zIm.length !== n) {
    throw new RangeError("dimension mismatch: right-hand side length ≠ n");
  }
  const { rowPerm, colPerm, lPtr, lIdx, uPtr, uIdx } = f.sym;
  const { lRe, lIm, uRe, uIm, invRe, invIm, wRe, wIm } = f;
  f.forwardRe = null;
  f.forwardIm = null;
  for (let k = 0; k < n; k++) {
    wRe[k] = dRe[colPerm[k]!]!;
    wIm[k] = dIm[colPerm[k]!]!;
  }
  // Uᵀ·y = w, forward: y_k = w_k/u_kk, then row k of U scatters −u_kj·y_k into w_j (j > k).
  // A zero w_k is left as it is and scatters nothing (a noise adjoint's d has one or two entries,
  // and often half the steps get none): the factors are finite, so that changes at most the sign
  // of a zero in z (see the comment of this function).
  let t0 = 0;
  for (let k = 0; k < n; k++) {
    const br = wRe[k]!;
    const bi = wIm[k]!;
    if (br === 0 && bi === 0) {
      t0 = uPtr[k + 1]!;
      continue;
    }
    const ir = invRe[k]!;
    const ii = invIm[k]!;
    const yr = br * ir - bi * ii;
    const yi = br * ii + bi * ir;
    wRe[k] = yr;
    wIm[k] = yi;
    const t1 = uPtr[k + 1]!;
    for (let t = t0; t < t1; t++) {
      const j = uIdx[t]!;
      const ur = uRe[t]!;
      const ui = uIm[t]!;
      wRe[j] = wRe[j]! - (ur * yr - ui * yi);
      wIm[j] = wIm[j]! - (ur * yi + ui * yr);
    }
    t0 = t1;
  }
  // Lᵀ·v = y, backward: row k of L scatters −l_kj·v_k into w_j (j < k); z = Pᵀ·v as it goes.
  let q1 = lPtr[n]!;
  for (let k = n - 1; k >= 0; k--) {
    const vr = wRe[k]!;
    const vi = wIm[k]!;
    const q0 = lPtr[k]!;
    if (vr === 0 && vi === 0) {
      q1 = q0;
      zRe[rowPerm[k]!] = vr;
      zIm[rowPerm[k]!] = vi;
      continue;
    }
    for (let q = q0; q < q1; q++) {
      const j = lIdx[q]!;
      const lr = lRe[q]!;
      const li = lIm[q]!;
      wRe[j] = wRe[j]! - (lr * vr - li * vi);
      wIm[j] = wIm[j]! - (lr * vi + li * vr);
    }
    q1 = q0;
    zRe[rowPerm[k]!] = vr;
    zIm[rowPerm[k]!] = vi;
  }
}
