import {
  Equilibration,
  type PencilMaxima,
  pencilInOrder,
  pencilMaxima,
  pencilTests,
  rowColumnMaxima,
} from "./equilibrate";
import { markowitzOrder, type OrderingOptions, type Symbolic } from "./markowitz";
import type { SparseComplexMatrix } from "./sparse-matrix";

export interface SparseLUOptions {
  /** Threshold τ of threshold pivoting (Duff, Erisman & Reid recommend 0.1). */
  pivotThreshold?: number;
  /** A pivot counts as zero below this multiple of the largest |entry| of the equilibrated matrix. */
  singularTolerance?: number;
}

/**
 * Sparse complex LU factorization for a sweep of matrices with one sparsity pattern.
 *
 * Invariant after a successful (re)factorization: P·A·Q = L·U, where P takes row rowPerm[k] to
 * row k, Q takes column colPerm[k] to column k, L is unit lower triangular and U upper triangular
 * with the pivots on its diagonal. Storage: L and U in CSR over the permuted indices with split
 * re/im Float64Arrays; the pivots' reciprocals are kept so the solves multiply only.
 *
 * Use: the constructor analyses A once (Markowitz ordering with threshold pivoting, fill pattern —
 * see `markowitzOrder`) and factors it. For each further matrix of the same pattern (the next
 * frequency of a sweep) `refactor(re, im)` recomputes only the numbers, row by row ("up-looking"
 * elimination over the fixed pattern), checking every pivot against the same threshold. Each
 * order gets a plan once (`makePlan`): the slot of every entry of A in the factors and the slot
 * every product of the elimination lands on, so a refactor writes the factors directly, with no
 * scatter vector to fill and clear (an order whose plan would exceed PLAN_LIMIT slots falls back
 * to the scatter vector). If a pivot fails at some frequency, that frequency is re-pivoted (its
 * order is kept as an alternate for later frequencies that fail too); every `refactor` tries the
 * sweep's ordering first. A sweep of A(s) = G + s·C declares the pencil once (`setPencil`) and
 * calls `refactorAt(ω)`: the values are read from G and C (no assembled copy per frequency).
 *
 * Equilibration: every (re)factorization first computes row and column factors D_r, D_c
 * (`Equilibration`: Ruiz's max-norm scaling — iterated to convergence in powers of two before an
 * ordering is analysed, one step per frequency on the fast refactor path) and pivots as if it
 * factored D_r·A·D_c: the ordering sees the scaled values, and the threshold and zero-pivot tests
 * compare scaled quantities (the pivot of step k of D_r·A·D_c is u_kk·r_k·c_k for the same order).
 * The numbers themselves are factored unscaled, so `solve` needs no scaling. A "singular" verdict therefore
 * means: the equilibrated matrix is singular to working precision — never merely "values far
 * apart" (1 fF beside 1 TΩ, 1 F at 1 GHz). The tests are squared and multiplied out, so a step
 * needs no square root or division besides the pivot's reciprocal; with a pencil the one Ruiz
 * step's maxima cost O(n) per frequency (`pencilMaxima`), not a pass over the values.
 *
 * Cost: refactor O(Σ_k |U_k|·|L_k|) flops over the fill pattern plus the scaling step (O(n) with a
 * pencil, O(nnz) without; a few passes before an analysis), solve O(nnz(L)+nnz(U)+n).
 * Assumes: A square, values given in A's CSR order. A pivot is zero when |pivot| ≤
 * singularTolerance·max|(D_r·A·D_c)_ij|; then `isSingular()` is true and `solve` must not be called.
 */
export class SparseComplexLU {
  readonly n: number;
  private readonly a: SparseComplexMatrix;
  private readonly opt: OrderingOptions;
  private base: Symbolic | null = null;
  private sym: Symbolic | null = null;
  /** The numeric plan of the current order (see `Plan`). */
  private plan: Plan | null = null;
  /** The plan of every order in use (the sweep's and its alternates), so switching allocates nothing. */
  private readonly positions = new Map<Symbolic, Plan>();
  /** L, U and the pivots in one array pair (slots: L at 0, U at nnz(L), pivots at nnz(L)+nnz(U)). */
  private fRe = new Float64Array(0);
  private fIm = new Float64Array(0);
  private lRe = new Float64Array(0);
  private lIm = new Float64Array(0);
  private uRe = new Float64Array(0);
  private uIm = new Float64Array(0);
  private readonly invRe: Float64Array;
  private readonly invIm: Float64Array;
  private readonly wRe: Float64Array;
  private readonly wIm: Float64Array;
  private readonly eq: Equilibration;
  /**
   * The pivot tests of the current values, in pivot order, so that no step needs a square root
   * or a division: cm[k] = 1/c_k² (c_k the column factor of step k), rm[k] = 1/r_k² (of its row).
   * After a full equilibration c, r are `eq`'s powers of two; on the refactor path they come from
   * one Ruiz step, c_j = 1/√cmax_j and r_i = 1/√rmax_i, i.e. cm = cmax, rm = rmax.
   */
  private readonly cm: Float64Array;
  private readonly rm: Float64Array;
  /** Largest |re| + |im| of each original row and column (the one Ruiz step of a refactor). */
  private readonly rmax: Float64Array;
  private readonly cmax: Float64Array;
  /** Where the current tests came from: a full equilibration (`eq`) or the maxima. */
  private testsFromEq = true;
  /** A pencil G + s·C the values come from (`setPencil`): its maxima per row and column. */
  private pencil: (PencilMaxima & { g: Float64Array; c: Float64Array }) | null = null;
  /** Zero-pivot bound of the current values: singularRel · max |scaled entry|. */
  private absTol = 0;
  private singular = false;
  private failedStep = -1;
  private failedCols: number[] = [];
  /** Orders analysed for frequencies where the sweep's order failed the threshold (at most 8 kept). */
  private alternates: Symbolic[] = [];
  /** How many times a new pivot order had to be analysed after the first. */
  repivots = 0;

  constructor(a: SparseComplexMatrix, options: SparseLUOptions = {}) {
    if (a.rowPtr.length !== a.n + 1) throw new RangeError("matrix is not square: row pointer length ≠ n+1");
    if (a.re.length !== a.colIdx.length || a.im.length !== a.colIdx.length) {
      throw new RangeError("dimension mismatch: values and pattern differ in length");
    }
    this.n = a.n;
    this.a = a;
    this.opt = {
      pivotThreshold: options.pivotThreshold ?? 0.1,
      absTolerance: 0,
      searchRows: 4,
    };
    this.singularRel = options.singularTolerance ?? 1e-14;
    this.invRe = new Float64Array(a.n);
    this.invIm = new Float64Array(a.n);
    this.wRe = new Float64Array(a.n);
    this.wIm = new Float64Array(a.n);
    this.eq = new Equilibration(a.n);
    this.cm = new Float64Array(a.n);
    this.rm = new Float64Array(a.n);
    this.rmax = new Float64Array(a.n);
    this.cmax = new Float64Array(a.n);
    this.scale(a.re, a.im);
    this.analyse(a.re, a.im, true);
  }

  private readonly singularRel: number;

  /** True when the last (re)factorization met a zero pivot. */
  isSingular(): boolean {
    return this.singular;
  }

  /**
   * Declare the pencil A(s) = G + s·C (G, C real, in A's CSR order) that `refactorAt(ω)`
   * factors at s = jω: the one Ruiz step per frequency then reads each row's and column's
   * largest |re| + |im| = |g| + |ω|·|c| off a few precomputed terms (see `pencilMaxima`) instead
   * of a pass over every entry. Same numbers, bit for bit, as the pass. G and C are kept by
   * reference (not copied).
   */
  setPencil(g: Float64Array, c: Float64Array): void {
    this.pencil = { ...pencilMaxima(this.a, g, c), g, c };
  }

  /** Original column indices left unpivoted when the factorization failed (diagnostics). */
  get singularColumns(): readonly number[] {
    return this.failedCols;
  }

  /** Step at which the last factorization failed, or −1. */
  get singularStep(): number {
    return this.failedStep;
  }

  /** Nonzeros of L plus U (without the unit diagonal of L, with U's diagonal). */
  get factorNonzeros(): number {
    return this.lRe.length + this.uRe.length + this.n;
  }

  /** Row order P (rowPerm[k] = original row at step k) of the current factors. */
  get rowPermutation(): Int32Array {
    return this.sym?.rowPerm ?? new Int32Array(0);
  }

  /** Column order Q (colPerm[k] = original column at step k) of the current factors. */
  get columnPermutation(): Int32Array {
    return this.sym?.colPerm ?? new Int32Array(0);
  }

  /**
   * The factors as dense re/im arrays (tests only; O(n²) memory): L unit lower, U upper.
   */
  denseFactors(): { lRe: number[][]; lIm: number[][]; uRe: number[][]; uIm: number[][] } {
    const n = this.n;
    const z = () => Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const out = { lRe: z(), lIm: z(), uRe: z(), uIm: z() };
    const s = this.sym;
    if (!s) return out;
    for (let k = 0; k < n; k++) {
      out.lRe[k]![k] = 1;
      for (let q = s.lPtr[k]!; q < s.lPtr[k + 1]!; q++) {
        out.lRe[k]![s.lIdx[q]!] = this.lRe[q]!;
        out.lIm[k]![s.lIdx[q]!] = this.lIm[q]!;
      }
      const d = this.invRe[k]! ** 2 + this.invIm[k]! ** 2;
      out.uRe[k]![k] = this.invRe[k]! / d;
      out.uIm[k]![k] = -this.invIm[k]! / d;
      for (let t = s.uPtr[k]!; t < s.uPtr[k + 1]!; t++) {
        out.uRe[k]![s.uIdx[t]!] = this.uRe[t]!;
        out.uIm[k]![s.uIdx[t]!] = this.uIm[t]!;
      }
    }
    return out;
  }

  /**
   * Refactor with new values in A's pattern (same CSR order). Keeps the sweep's pivot order when
   * every pivot passes the threshold; otherwise re-pivots for these values only.
   * Returns false when the matrix is singular.
   */
  refactor(re: Float64Array, im: Float64Array): boolean {
    if (re.length !== this.a.colIdx.length || im.length !== this.a.colIdx.length) {
      throw new RangeError("dimension mismatch: values and pattern differ in length");
    }
    if (!this.base) {
      this.scale(re, im);
      return this.analyse(re, im, true);
    }
    // One scaling step per frequency (one pass over the values); a re-pivot equilibrates fully.
    rowColumnMaxima(this.a, re, im, this.rmax, this.cmax);
    return this.refactorScaled(re, im);
  }

  /**
   * `refactor` of A = G + jωC for the pencil given to `setPencil`: the same factors and verdicts
   * as `refactor(g, ω·c)`, but the values are read from G and C directly (no assembled copy) and
   * the scaling step off the pencil's precomputed terms. A's value arrays are written only when
   * this frequency needs more than the sweep's order (a re-pivot reads them).
   */
  refactorAt(omega: number): boolean {
    const pen = this.pencil;
    if (!pen) throw new Error("refactorAt needs setPencil first");
    const { g, c } = pen;
    if (!this.base) {
      this.fill(omega, g, c);
      return this.refactor(this.a.re, this.a.im);
    }
    if (this.base !== this.sym) this.use(this.base);
    const w = Math.abs(omega);
    // One Ruiz step, its maxima straight into the tests of the sweep's order.
    const plan = this.plan!;
    if (plan.pencilOf !== pen) {
      plan.pencil = pencilInOrder(pen, this.base);
      plan.pencilOf = pen;
    }
    pencilTests(plan.pencil!, w, this.cm, this.rm);
    this.absTol = this.singularRel;
    this.testsFromEq = false;
    if (this.numeric(g, c, omega)) return true;
    this.fill(omega, g, c);
    const { re, im } = this.a;
    rowColumnMaxima(this.a, re, im, this.rmax, this.cmax);
    return this.refactorScaled(re, im, true);
  }

  /** A's values = G + jωC. */
  private fill(omega: number, g: Float64Array, c: Float64Array): void {
    const { re, im } = this.a;
    for (let p = 0; p < re.length; p++) {
      re[p] = g[p]!;
      im[p] = omega * c[p]!;
    }
  }

  /** The refactor path after the maxima of one Ruiz step are in rmax/cmax. */
  private refactorScaled(re: Float64Array, im: Float64Array, baseFailed = false): boolean {
    // Every entry of the once-scaled matrix is at most 1 (|a_ij| ≤ √(rmax_i·cmax_j)).
    this.absTol = this.singularRel;
    this.testsFromEq = false;
    if (!baseFailed) {
      this.use(this.base!);
      this.prepareTests();
      if (this.numeric(re, im, 1)) return true;
    }
    // The sweep's order failed here: try the orders earlier frequencies needed (newest first),
    // so a band of frequencies that needs another order analyses it once, not at every point.
    for (let k = this.alternates.length - 1; k >= 0; k--) {
      this.use(this.alternates[k]!);
      this.prepareTests();
      if (this.numeric(re, im, 1)) return true;
    }
    this.repivots++;
    this.scale(re, im);
    const ok = this.analyse(re, im, false);
    if (ok && this.sym) {
      this.alternates.push(this.sym);
      if (this.alternates.length > 8) this.positions.delete(this.alternates.shift()!);
    } else if (this.sym && this.sym !== this.base && !this.alternates.includes(this.sym)) {
      this.positions.delete(this.sym);
    }
    return ok;
  }

  /** Equilibrate the values re/im: factors into `eq`, the zero-pivot bound into `absTol`. */
  private scale(re: Float64Array, im: Float64Array): void {
    this.absTol = this.singularRel * this.eq.compute(this.a, re, im);
    this.testsFromEq = true;
  }

  /** cm/rm in the current pivot order, from `eq` or from the maxima (see the fields). */
  private prepareTests(): void {
    const { rowPerm, colPerm } = this.sym!;
    const { cm, rm, n } = this;
    if (this.testsFromEq) {
      const { row, col } = this.eq;
      for (let k = 0; k < n; k++) {
        const c = col[colPerm[k]!]!;
        const r = row[rowPerm[k]!]!;
        cm[k] = 1 / (c * c);
        rm[k] = 1 / (r * r);
      }
      return;
    }
    const { rmax, cmax } = this;
    for (let k = 0; k < n; k++) {
      const c = cmax[colPerm[k]!]!;
      const r = rmax[rowPerm[k]!]!;
      cm[k] = c > 0 && c < Number.POSITIVE_INFINITY ? c : 1;
      rm[k] = r > 0 && r < Number.POSITIVE_INFINITY ? r : 1;
    }
  }

  private analyse(re: Float64Array, im: Float64Array, asBase: boolean): boolean {
    // The ordering sees the scaled values (a copy: analysis is rare, once per sweep or re-pivot).
    const { rowPtr, colIdx } = this.a;
    const { row, col } = this.eq;
    const sRe = new Float64Array(re.length);
    const sIm = new Float64Array(im.length);
    for (let i = 0; i < this.n; i++) {
      for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
        const f = row[i]! * col[colIdx[p]!]!;
        sRe[p] = re[p]! * f;
        sIm[p] = im[p]! * f;
      }
    }
    const res = markowitzOrder(this.a, sRe, sIm, { ...this.opt, absTolerance: this.absTol });
    if (!res.ok) {
      this.singular = true;
      this.failedStep = res.step;
      this.failedCols = res.cols;
      return false;
    }
    this.use(res.symbolic);
    this.prepareTests();
    if (asBase) this.base = res.symbolic;
    // Same numbers as the ordering pass, so the threshold checks pass (up to rounding ties).
    if (!this.numeric(re, im, 1, true)) return false;
    return true;
  }

  /** Make s the current order (its plan and factor storage); the tests are the caller's. */
  private use(s: Symbolic): void {
    if (this.sym === s && this.plan) return;
    this.sym = s;
    let plan = this.positions.get(s);
    if (!plan) {
      plan = makePlan(this.a, s);
      this.positions.set(s, plan);
    }
    this.plan = plan;
    const nl = s.lIdx.length;
    const nu = s.uIdx.length;
    if (this.fRe.length !== nl + nu + this.n) {
      this.fRe = new Float64Array(nl + nu + this.n);
      this.fIm = new Float64Array(nl + nu + this.n);
    }
    this.lRe = this.fRe.subarray(0, nl);
    this.lIm = this.fIm.subarray(0, nl);
    this.uRe = this.fRe.subarray(nl, nl + nu);
    this.uIm = this.fIm.subarray(nl, nl + nu);
  }

  /**
   * Numeric factorization over the current pattern; false on a failed pivot.
   * The tests, squared and multiplied out (no square root or division per step): with
   * cm[k] = 1/c_k², rm[k] = 1/r_k² from `prepareTests` (c, r: the column and row factors),
   *  - zero pivot: |u_kk|·c_k·r_k ≤ absTol  ⇔  |u_kk|² ≤ absTol²·rm[k]·cm[k];
   *  - threshold: |u_kk|·c_k ≥ τ·(|re|+|im|)(u_kj)·c_j/√2 for every j of U's row k (|x|₁/√2 ≤ |x|₂,
   *    a conservative bound; the row factor cancels)  ⇔  |u_kk|²·cm[j] ≥ ½τ²·(|re|+|im|)²·cm[k].
   */
  private numeric(re: Float64Array, im: Float64Array, imScale: number, lenient = false): boolean {
    const s = this.sym!;
    const plan = this.plan!;
    if (!plan.upd) return this.numericScatter(re, im, imScale, lenient);
    const { lPtr, lIdx, uPtr, uIdx } = s;
    const { src, updStart, upd } = plan;
    const { fRe, fIm, invRe, invIm, cm, rm, n } = this;
    const offU = lIdx.length;
    const offD = offU + uIdx.length;
    const tol2 = this.absTol * this.absTol;
    const tau = lenient ? 0 : this.opt.pivotThreshold;
    const half = 0.5 * tau * tau;
    this.singular = false;
    this.failedStep = -1;
    if (this.failedCols.length > 0) this.failedCols = [];
    let l0 = 0;
    let u0 = offU;
    for (let k = 0; k < n; k++) {
      const l1 = lPtr[k + 1]!;
      const u1 = offU + uPtr[k + 1]!;
      const dk = offD + k;
      // Row k of the factors starts as row rowPerm[k] of A, zero at its fill.
      for (let q = l0; q < l1; q++) {
        const p = src[q]!;
        fRe[q] = p >= 0 ? re[p]! : 0;
        fIm[q] = p >= 0 ? imScale * im[p]! : 0;
      }
      for (let t = u0; t < u1; t++) {
        const p = src[t]!;
        fRe[t] = p >= 0 ? re[p]! : 0;
        fIm[t] = p >= 0 ? imScale * im[p]! : 0;
      }
      const pd = src[dk]!;
      fRe[dk] = pd >= 0 ? re[pd]! : 0;
      fIm[dk] = pd >= 0 ? imScale * im[pd]! : 0;
      // Eliminate with earlier rows, in ascending order of the L pattern: l = a_kj / u_jj, then
      // row k −= l·(row j of U), each product landing on the slot the plan recorded for it.
      for (let q = l0; q < l1; q++) {
        const j = lIdx[q]!;
        const xr = fRe[q]!;
        const xi = fIm[q]!;
        const ir = invRe[j]!;
        const ii = invIm[j]!;
        const lr = xr * ir - xi * ii;
        const li = xr * ii + xi * ir;
        fRe[q] = lr;
        fIm[q] = li;
        if (lr === 0 && li === 0) continue;
        const t0 = offU + uPtr[j]!;
        const m0 = updStart[q]!;
        const m1 = updStart[q + 1]!;
        for (let m = m0, t = t0; m < m1; m++, t++) {
          const c = upd[m]!;
          const ur = fRe[t]!;
          const ui = fIm[t]!;
          fRe[c] = fRe[c]! - (lr * ur - li * ui);
          fIm[c] = fIm[c]! - (lr * ui + li * ur);
        }
      }
      const pr = fRe[dk]!;
      const pi = fIm[dk]!;
      const d = pr * pr + pi * pi;
      const ck = cm[k]!;
      const hk = half * ck;
      let small = d <= tol2 * rm[k]! * ck;
      for (let t = u0; t < u1 && !small; t++) {
        const m = Math.abs(fRe[t]!) + Math.abs(fIm[t]!);
        if (d * cm[uIdx[t - offU]!]! < hk * m * m) small = true;
      }
      l0 = l1;
      u0 = u1;
      if (small) {
        this.singular = d <= tol2 * rm[k]! * ck;
        this.failedStep = k;
        this.failedCols = Array.from(s.colPerm.subarray(k));
        return false;
      }
      const inv = 1 / d;
      invRe[k] = pr * inv;
      invIm[k] = -pi * inv;
    }
    return true;
  }

  /**
   * `numeric` with a dense scatter vector instead of the plan's update slots: for orders whose
   * elimination would need more than PLAN_LIMIT recorded updates (much fill). Same arithmetic.
   */
  private numericScatter(re: Float64Array, im: Float64Array, imScale: number, lenient: boolean): boolean {
    const s = this.sym!;
    const { rowPtr } = this.a;
    const { rowPerm, lPtr, lIdx, uPtr, uIdx } = s;
    const aPos = this.plan!.aPos;
    const { lRe, lIm, uRe, uIm, invRe, invIm, wRe, wIm, cm, rm, n } = this;
    const tol2 = this.absTol * this.absTol;
    const tau = lenient ? 0 : this.opt.pivotThreshold;
    const half = 0.5 * tau * tau;
    this.singular = false;
    this.failedStep = -1;
    if (this.failedCols.length > 0) this.failedCols = [];
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
      if (small) {
        this.singular = d <= tol2 * rm[k]! * ck;
        this.failedStep = k;
        this.failedCols = Array.from(s.colPerm.subarray(k));
        return false;
      }
      const inv = 1 / d;
      invRe[k] = pr * inv;
      invIm[k] = -pi * inv;
    }
    return true;
  }

  /**
   * Solve A·x = b with the current factors. x may alias b. Cost O(nnz(L)+nnz(U)+n).
   * Returns false when x has a NaN or ±∞ (an overflow: the equations are singular in effect).
   * Throws if the last factorization was singular (a programming error, never user input).
   */
  solve(bRe: Float64Array, bIm: Float64Array, xRe: Float64Array = bRe, xIm: Float64Array = bIm): boolean {
    if (this.singular || !this.sym) throw new Error("matrix is singular: cannot solve");
    const n = this.n;
    if (bRe.length !== n || bIm.length !== n || xRe.length !== n || xIm.length !== n) {
      throw new RangeError("dimension mismatch: right-hand side length ≠ n");
    }
    const { rowPerm, colPerm, lPtr, lIdx, uPtr, uIdx } = this.sym;
    const { lRe, lIm, uRe, uIm, invRe, invIm, wRe, wIm } = this;
    let q0 = 0;
    for (let k = 0; k < n; k++) {
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
    // Backward; x may alias b, whose entries the forward pass has read already.
    let t1 = uPtr[n]!;
    let finite = 0;
    for (let k = n - 1; k >= 0; k--) {
      let yr = wRe[k]!;
      let yi = wIm[k]!;
      const t0 = uPtr[k]!;
      for (let t = t0; t < t1; t++) {
        const j = uIdx[t]!;
        yr -= uRe[t]! * wRe[j]! - uIm[t]! * wIm[j]!;
        yi -= uRe[t]! * wIm[j]! + uIm[t]! * wRe[j]!;
      }
      t1 = t0;
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
   * Solve Aᵀ·z = d (the plain transpose, no conjugate) with the current factors: the adjoint
   * system of noise analysis. With P·A·Q = L·U, Aᵀ = Q·Uᵀ·Lᵀ·P, so w = Qᵀ·d, Uᵀ·y = w (forward,
   * scattering U's rows), Lᵀ·v = y (backward, scattering L's rows), z = Pᵀ·v. z may alias d.
   * Cost O(nnz(L)+nnz(U)+n), as `solve`.
   */
  solveTransposed(
    dRe: Float64Array,
    dIm: Float64Array,
    zRe: Float64Array = dRe,
    zIm: Float64Array = dIm,
  ): void {
    if (this.singular || !this.sym) throw new Error("matrix is singular: cannot solve");
    const n = this.n;
    if (dRe.length !== n || dIm.length !== n || zRe.length !== n || zIm.length !== n) {
      throw new RangeError("dimension mismatch: right-hand side length ≠ n");
    }
    const { rowPerm, colPerm, lPtr, lIdx, uPtr, uIdx } = this.sym;
    const { lRe, lIm, uRe, uIm, invRe, invIm, wRe, wIm } = this;
    for (let k = 0; k < n; k++) {
      wRe[k] = dRe[colPerm[k]!]!;
      wIm[k] = dIm[colPerm[k]!]!;
    }
    // Uᵀ·y = w, forward: y_k = w_k/u_kk, then row k of U scatters −u_kj·y_k into w_j (j > k).
    let t0 = 0;
    for (let k = 0; k < n; k++) {
      const br = wRe[k]!;
      const bi = wIm[k]!;
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
}

/** Most update slots a plan records (4 bytes each); an order needing more factors by scatter. */
const PLAN_LIMIT = 1 << 22;

/**
 * Where each number of a refactor goes, for one pivot order (the factors live in one array:
 * L's entries at 0…, U's at nnz(L)…, the pivots at nnz(L)+nnz(U)…):
 *  - src[slot]: the entry of A (CSR position) that starts the slot, or −1 for fill;
 *  - upd[updStart[q] + i]: the slot that the i-th entry of U's row j (j = lIdx[q]) updates when
 *    L's entry q (row k, column j) eliminates it, i.e. the slot of (k, uIdx[uPtr[j] + i]).
 * With them a refactor needs no scatter vector: each product lands directly on its slot.
 * `aPos` (A's entry → pivot column) serves the scatter fallback when `upd` would exceed PLAN_LIMIT.
 */
interface Plan {
  aPos: Int32Array;
  src: Int32Array;
  /** The pencil's terms in this order (step k's column, then its row), for `pencilTests`. */
  pencil: PencilMaxima | null;
  pencilOf: PencilMaxima | null;
  updStart: Int32Array;
  upd: Int32Array | null;
}

function makePlan(a: SparseComplexMatrix, s: Symbolic): Plan {
  const { n, rowPtr, colIdx } = a;
  const { rowPerm, colPos, lPtr, lIdx, uPtr, uIdx } = s;
  const offU = lIdx.length;
  const offD = offU + uIdx.length;
  const aPos = new Int32Array(colIdx.length);
  for (let p = 0; p < colIdx.length; p++) aPos[p] = colPos[colIdx[p]!]!;
  const src = new Int32Array(offD + n).fill(-1);
  const updStart = new Int32Array(lIdx.length + 1);
  let total = 0;
  for (let q = 0; q < lIdx.length; q++) {
    const j = lIdx[q]!;
    total += uPtr[j + 1]! - uPtr[j]!;
    updStart[q + 1] = total;
  }
  const upd = total <= PLAN_LIMIT ? new Int32Array(total) : null;
  // slot[c] = the slot of (k, c) in the row k being planned (−1 outside its pattern).
  const slot = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    for (let q = lPtr[k]!; q < lPtr[k + 1]!; q++) slot[lIdx[q]!] = q;
    for (let t = uPtr[k]!; t < uPtr[k + 1]!; t++) slot[uIdx[t]!] = offU + t;
    slot[k] = offD + k;
    const r = rowPerm[k]!;
    for (let p = rowPtr[r]!; p < rowPtr[r + 1]!; p++) src[slot[aPos[p]!]!] = p;
    if (upd) {
      for (let q = lPtr[k]!; q < lPtr[k + 1]!; q++) {
        const j = lIdx[q]!;
        let m = updStart[q]!;
        for (let t = uPtr[j]!; t < uPtr[j + 1]!; t++) upd[m++] = slot[uIdx[t]!]!;
      }
    }
    for (let q = lPtr[k]!; q < lPtr[k + 1]!; q++) slot[lIdx[q]!] = -1;
    for (let t = uPtr[k]!; t < uPtr[k + 1]!; t++) slot[uIdx[t]!] = -1;
    slot[k] = -1;
  }
  return { aPos, src, updStart, upd, pencil: null, pencilOf: null };
}
