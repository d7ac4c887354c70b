import { rowColumnMaxima } from "./equilibrate";
import { markowitzOrder, type OrderingOptions, type Symbolic } from "./markowitz";
import { type PencilMaxima, pencilInOrder, pencilMaxima, pencilTests } from "./pencil-maxima";
import { LUFactors } from "./sparse-lu-factors";
import { factorNumeric, factorPencil } from "./sparse-lu-numeric";
import { planPencil } from "./sparse-lu-plan";
import { PivotTests } from "./sparse-lu-scaling";
import {
  backwardReach,
  type SparseRhs,
  solveFactors,
  solveFactorsOfProduct,
  solveFactorsTransposed,
  solveFactorsTransposedInSteps,
} from "./sparse-lu-solve";
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
 * with the pivots on its diagonal (storage: `LUFactors`).
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
 * Equilibration (`PivotTests`): the ordering and the pivot tests see D_r·A·D_c (Ruiz's max-norm
 * scaling), the numbers are factored unscaled. A "singular" verdict therefore means: the
 * equilibrated matrix is singular to working precision — never merely "values far apart"
 * (1 fF beside 1 TΩ, 1 F at 1 GHz).
 *
 * Files: this class (which order, when to re-pivot), `sparse-lu-plan.ts` (an order's plan),
 * `-factors.ts` (the numbers), `-scaling.ts` (the pivot tests' scaling), `-numeric.ts` and
 * `-scatter.ts` (the numeric factorization), `-solve.ts` (the triangular solves).
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
  /** The sweep's order (analysed at the first factorization). */
  private base: Symbolic | null = null;
  /** The factors and the order they are in. */
  private readonly f: LUFactors;
  /** The scaling of the current values behind the pivot tests. */
  private readonly t: PivotTests;
  /** A pencil G + s·C the values come from (`setPencil`): its maxima per row and column. */
  private pencil: (PencilMaxima & { g: Float64Array; c: Float64Array }) | null = null;
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
    this.f = new LUFactors(a);
    this.t = new PivotTests(a.n, options.singularTolerance ?? 1e-14);
    this.t.full(a, a.re, a.im);
    this.analyse(a.re, a.im, true);
  }

  /** True when the last (re)factorization met a zero pivot. */
  isSingular(): boolean {
    return this.f.singular;
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

  /**
   * Eight n-vectors in the memory of the sweep's order (null before it has one): solves and dx/ds
   * into them are written in place, with no copy (`KernelSpace.outputArrays`). For `AcSolver`.
   */
  solutionArrays(): Float64Array[] | null {
    return this.base ? (this.f.spaceOf(this.base)?.outputArrays() ?? null) : null;
  }

  /** Original column indices left unpivoted when the factorization failed (diagnostics). */
  get singularColumns(): readonly number[] {
    return this.f.failedCols;
  }

  /** Step at which the last factorization failed, or −1. */
  get singularStep(): number {
    return this.f.failedStep;
  }

  /** Row order P (rowPerm[k] = original row at step k) of the current factors. */
  get rowPermutation(): Int32Array {
    return this.f.sym?.rowPerm ?? new Int32Array(0);
  }

  /** Column order Q (colPerm[k] = original column at step k) of the current factors. */
  get columnPermutation(): Int32Array {
    return this.f.sym?.colPerm ?? new Int32Array(0);
  }

  /** The factors as dense re/im arrays (tests only; O(n²) memory): L unit lower, U upper. */
  denseFactors(): { lRe: number[][]; lIm: number[][]; uRe: number[][]; uIm: number[][] } {
    return this.f.dense();
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
      this.t.full(this.a, re, im);
      return this.analyse(re, im, true);
    }
    // One scaling step per frequency (one pass over the values); a re-pivot equilibrates fully.
    rowColumnMaxima(this.a, re, im, this.t.rmax, this.t.cmax);
    return this.refactorScaled(re, im);
  }

  /**
   * `refactor` of A = G + jωC for the pencil given to `setPencil`: the same factors and verdicts
   * as `refactor(g, ω·c)`, but the values are read from G and C directly (no assembled copy) and
   * the scaling step off the pencil's precomputed terms. A's value arrays are written only when
   * this frequency needs more than the sweep's order (a re-pivot reads them).
   * With a right-hand side b, the forward substitution of b runs along the elimination when the
   * sweep's order holds, and a following `solve(b)` of the same arrays (unchanged in between)
   * only substitutes backward: the same numbers as without.
   */
  refactorAt(omega: number, bRe: Float64Array | null = null, bIm: Float64Array | null = null): boolean {
    const pen = this.pencil;
    if (!pen) throw new Error("refactorAt needs setPencil first");
    const { g, c } = pen;
    if (!this.base) {
      this.fill(omega, g, c);
      return this.refactor(this.a.re, this.a.im);
    }
    if (this.base !== this.f.sym) this.f.use(this.base);
    const w = Math.abs(omega);
    // One Ruiz step, its maxima straight into the tests of the sweep's order.
    const plan = this.f.plan!;
    if (plan.pencilOf !== pen) planPencil(plan, pen, pencilInOrder(pen, this.base));
    this.t.oneStep();
    // The values copied from the plan's slots of G and C (same numbers as reading G and C), the
    // tests computed with them in the order's memory; otherwise the tests here, then a refactor.
    const slots = plan.slotG !== null && omega >= 0 && omega < Number.POSITIVE_INFINITY;
    const tau = this.opt.pivotThreshold;
    if (slots) {
      if (factorPencil(this.f, this.t, omega, tau, bRe, bIm)) return true;
    } else {
      pencilTests(plan.pencil!, w, this.t.cm, this.t.rm);
      if (this.numeric(g, c, omega)) return true;
    }
    this.fill(omega, g, c);
    const { re, im } = this.a;
    rowColumnMaxima(this.a, re, im, this.t.rmax, this.t.cmax);
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
    this.t.oneStep();
    if (!baseFailed && this.tryOrder(this.base!, re, im)) return true;
    // The sweep's order failed here: try the orders earlier frequencies needed (newest first),
    // so a band of frequencies that needs another order analyses it once, not at every point.
    for (let k = this.alternates.length - 1; k >= 0; k--) {
      if (this.tryOrder(this.alternates[k]!, re, im)) return true;
    }
    this.repivots++;
    this.t.full(this.a, re, im);
    const ok = this.analyse(re, im, false);
    const sym = this.f.sym;
    if (ok && sym) {
      this.alternates.push(sym);
      if (this.alternates.length > 8) this.f.forget(this.alternates.shift()!);
    } else if (sym && sym !== this.base && !this.alternates.includes(sym)) {
      this.f.forget(sym);
    }
    return ok;
  }

  /** Factor re/im in the order s with the tests of one Ruiz step; false on a failed pivot. */
  private tryOrder(s: Symbolic, re: Float64Array, im: Float64Array): boolean {
    this.f.use(s);
    this.t.prepare(s);
    return this.numeric(re, im, 1);
  }

  private analyse(re: Float64Array, im: Float64Array, asBase: boolean): boolean {
    // The ordering sees the scaled values (a copy: analysis is rare, once per sweep or re-pivot).
    const scaled = this.t.scaled(this.a, re, im);
    const res = markowitzOrder(this.a, scaled.re, scaled.im, { ...this.opt, absTolerance: this.t.absTol });
    if (!res.ok) {
      this.f.singular = true;
      this.f.failedStep = res.step;
      this.f.failedCols = res.cols;
      return false;
    }
    this.f.use(res.symbolic);
    this.t.prepare(res.symbolic);
    if (asBase) this.base = res.symbolic;
    // Same numbers as the ordering pass, so the threshold checks pass (up to rounding ties).
    return this.numeric(re, im, 1, true);
  }

  /** Numeric factorization in the current order (`factorNumeric`); lenient skips the threshold. */
  private numeric(re: Float64Array, im: Float64Array, imScale: number, lenient = false): boolean {
    return factorNumeric(this.f, this.t, re, im, imScale, lenient ? 0 : this.opt.pivotThreshold);
  }

  /**
   * Solve A·x = b with the current factors (`solveFactors`). x may alias b. Cost O(nnz(L)+nnz(U)+n).
   * Returns false when x has a NaN or ±∞ (an overflow: the equations are singular in effect).
   * Throws if the last factorization was singular (a programming error, never user input).
   */
  solve(bRe: Float64Array, bIm: Float64Array, xRe: Float64Array = bRe, xIm: Float64Array = bIm): boolean {
    return solveFactors(this.f, bRe, bIm, xRe, xIm);
  }

  /**
   * Solve A·x = −M·v (M sparse real in CSR, in A's row numbering; v must not alias x) without
   * forming −M·v first (`solveFactorsOfProduct`): dx/ds = −A⁻¹·C·x in one pass. Same numbers as
   * `solve` of −M·v. With `want` (original unknowns), x is computed at those only — the same
   * numbers there, stale numbers elsewhere — by a backward pass over the steps they depend on.
   */
  solveProduct(
    m: { ptr: Int32Array; idx: Int32Array; val: Float64Array },
    vRe: Float64Array,
    vIm: Float64Array,
    xRe: Float64Array,
    xIm: Float64Array,
    want: Int32Array | null = null,
  ): boolean {
    return solveFactorsOfProduct(this.f, m, vRe, vIm, xRe, xIm, want && this.stepsFor(want));
  }

  /**
   * The backward steps x at the unknowns `want` needs in the current order (`backwardReach`),
   * kept per order and `want` array; null (the whole pass) when they are most of the steps anyway.
   */
  private stepsFor(want: Int32Array): Int32Array | null {
    const s = this.f.sym!;
    let byWant = this.reaches.get(s);
    if (!byWant) {
      byWant = new Map();
      this.reaches.set(s, byWant);
    }
    let steps = byWant.get(want);
    if (steps === undefined) {
      const reach = backwardReach(s, want);
      steps = reach.length > 0.75 * this.n ? null : reach;
      byWant.set(want, steps);
    }
    return steps;
  }

  /** `stepsFor`'s answers, per order (an order dropped from use drops its entry with it). */
  private readonly reaches = new WeakMap<Symbolic, Map<Int32Array, Int32Array | null>>();

  /**
   * Solve Aᵀ·z = d (the plain transpose, no conjugate: the adjoint system of noise analysis) with
   * the current factors (`solveFactorsTransposed`). z may alias d. Cost as `solve`.
   */
  solveTransposed(
    dRe: Float64Array,
    dIm: Float64Array,
    zRe: Float64Array = dRe,
    zIm: Float64Array = dIm,
  ): void {
    solveFactorsTransposed(this.f, dRe, dIm, zRe, zIm);
  }

  /**
   * `solveTransposed` of a sparse d (`sparseRhs`) that leaves z in the pivot order
   * (`solveFactorsTransposedInSteps`): z_i is at 2·rowPos[i] and 2·rowPos[i] + 1 of `w` (real,
   * imaginary), valid until the next solve or refactor. `rowPos` is the same array as long as the
   * pivot order is, so a caller can map its indices once.
   */
  solveTransposedInSteps(d: SparseRhs): { w: Float64Array; rowPos: Int32Array } {
    solveFactorsTransposedInSteps(this.f, d);
    return { w: this.f.w, rowPos: this.f.sym!.rowPos };
  }
}
