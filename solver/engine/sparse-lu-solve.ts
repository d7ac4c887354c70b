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
  const { fac, w } = f;
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
      const j = 2 * lIdx[q]!;
      const lr = fac[2 * q]!;
      const li = fac[2 * q + 1]!;
      yr -= lr * w[j]! - li * w[j + 1]!;
      yi -= lr * w[j + 1]! + li * w[j]!;
    }
    q0 = q1;
    w[2 * k] = yr;
    w[2 * k + 1] = yi;
  }
  return backward(f, xRe, xIm, null);
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
  // L·y = −P·M·v (for each step k, row r = P's k-th: y_k = −Σ M[r, j]·v_j − Σ L[k, j]·y_j), then
  // the backward pass over `steps`, in one WebAssembly call (`derive` in lu-kernels.wat).
  f.forwardRe = null;
  f.forwardIm = null;
  return f.space!.derive(m, vRe, vIm, steps, xRe, xIm);
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
 * U·z = y (y in f.w) over the given steps, descending — every step (null), or those x at some
 * unknowns needs (`backwardReach`) — and x = Q·z there; false when x has a NaN or ±∞. For each
 * step k: z_k = (y_k − Σ U[k, j]·z_j) · (1/u_kk), written to w and to x at Q's k-th unknown.
 * WebAssembly (`backward` in lu-kernels.wat).
 */
function backward(f: LUFactors, xRe: Float64Array, xIm: Float64Array, steps: Int32Array | null): boolean {
  return f.space!.backward(steps, xRe, xIm);
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
  const n = f.n;
  if (dRe.length !== n || dIm.length !== n || zRe.length !== n || zIm.length !== n) {
    throw new RangeError("dimension mismatch: right-hand side length ≠ n");
  }
  solveFactorsTransposedInSteps(f, sparseRhs(dRe, dIm));
  const { rowPerm } = f.sym!;
  const { w } = f;
  for (let k = 0; k < n; k++) {
    zRe[rowPerm[k]!] = w[2 * k]!;
    zIm[rowPerm[k]!] = w[2 * k + 1]!;
  }
}

/** A right-hand side by its nonzero entries: d = Σ (re[t] + j·im[t])·e(index[t]), indices distinct. */
export interface SparseRhs {
  index: Int32Array;
  re: Float64Array;
  im: Float64Array;
}

/** The nonzero entries of d = dRe + j·dIm. */
export function sparseRhs(dRe: Float64Array, dIm: Float64Array): SparseRhs {
  const index: number[] = [];
  for (let i = 0; i < dRe.length; i++) if (dRe[i] !== 0 || dIm[i] !== 0) index.push(i);
  return {
    index: Int32Array.from(index),
    re: Float64Array.from(index, (i) => dRe[i]!),
    im: Float64Array.from(index, (i) => dIm[i]!),
  };
}

/**
 * `solveFactorsTransposed` of a sparse d, without the last permutation: v with z = Pᵀ·v is left in
 * f.w (v_k at 2k, 2k + 1), so z_i is v at step `sym.rowPos[i]`. A caller that reads a few sums of z
 * per solve (the noise sources) reads them there, with indices mapped once per pivot order; and
 * the forward pass starts at d's first step (nothing before it is nonzero).
 */
export function solveFactorsTransposedInSteps(f: LUFactors, d: SparseRhs): void {
  if (f.singular || !f.sym) throw new Error("matrix is singular: cannot solve");
  const n = f.n;
  const { colPos } = f.sym;
  const { w } = f;
  f.forwardRe = null;
  f.forwardIm = null;
  // w = Qᵀ·d: zero, then d's entries at their steps.
  w.fill(0, 0, 2 * n);
  let first = n;
  for (let t = 0; t < d.index.length; t++) {
    const i = d.index[t]!;
    if (!(i >= 0 && i < n)) throw new RangeError(`right-hand side entry ${i} outside 0…${n - 1}`);
    const k = colPos[i]!;
    w[2 * k] = d.re[t]!;
    w[2 * k + 1] = d.im[t]!;
    if (k < first) first = k;
  }
  // Uᵀ·y = w, forward: y_k = w_k/u_kk, then row k of U scatters −u_kj·y_k into w_j (j > k); then
  // Lᵀ·v = y, backward: row k of L scatters −l_kj·v_k into w_j (j < k). WebAssembly (`transposed`
  // in lu-kernels.wat). A zero w_k is left as it is and scatters nothing (a noise adjoint's d has
  // one or two entries, and often half the steps get none): the factors are finite, so that
  // changes at most the sign of a zero in z (see the comment of `solveFactorsTransposed`).
  f.space!.transposed(first);
}
