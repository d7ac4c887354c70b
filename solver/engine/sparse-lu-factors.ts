import type { Symbolic } from "./markowitz";
import { makePlan, type Plan } from "./sparse-lu-plan";
import type { SparseComplexMatrix } from "./sparse-matrix";

/**
 * The numbers of one factorization P·A·Q = L·U (see `SparseComplexLU`) and the order they are in:
 * L and U in CSR over the permuted indices (the pattern of `sym`) with split re/im arrays, the
 * pivots' reciprocals (so the solves multiply only), a scratch vector, and the verdict of the
 * last factorization. `use(s)` switches the order; each order's plan is kept, so switching back
 * allocates nothing.
 */
export class LUFactors {
  readonly n: number;
  readonly a: SparseComplexMatrix;
  sym: Symbolic | null = null;
  /** The numeric plan of the current order (see `Plan`). */
  plan: Plan | null = null;
  /** The plan of every order in use (the sweep's and its alternates). */
  private readonly plans = new Map<Symbolic, Plan>();
  /** L, U and the pivots in one array pair (slots: L at 0, U at nnz(L), pivots at nnz(L)+nnz(U)). */
  fRe = new Float64Array(0);
  fIm = new Float64Array(0);
  lRe = new Float64Array(0);
  lIm = new Float64Array(0);
  uRe = new Float64Array(0);
  uIm = new Float64Array(0);
  readonly invRe: Float64Array;
  readonly invIm: Float64Array;
  /** Scratch of the scatter factorization and the solves (zero between uses by the former). */
  /** The steps n−1 … 0: the whole backward pass (see `backward` in sparse-lu-solve.ts). */
  readonly descending: Int32Array;
  readonly wRe: Float64Array;
  readonly wIm: Float64Array;
  /**
   * The right-hand side whose forward substitution (y with L·y = P·b) the last factorization left
   * in wRe/wIm (`factorPencil` with b), or null; any solve or factorization clears it.
   */
  forwardRe: Float64Array | null = null;
  forwardIm: Float64Array | null = null;
  /** True when the last (re)factorization met a zero pivot. */
  singular = false;
  /** Step at which the last factorization failed, or −1. */
  failedStep = -1;
  /** Original column indices left unpivoted when the factorization failed (diagnostics). */
  failedCols: number[] = [];

  constructor(a: SparseComplexMatrix) {
    this.n = a.n;
    this.a = a;
    this.invRe = new Float64Array(a.n);
    this.invIm = new Float64Array(a.n);
    this.descending = new Int32Array(a.n);
    for (let k = 0; k < a.n; k++) this.descending[k] = a.n - 1 - k;
    this.wRe = new Float64Array(a.n);
    this.wIm = new Float64Array(a.n);
  }

  /** No failure recorded: the start of every numeric factorization. */
  clearFailure(): void {
    this.singular = false;
    this.failedStep = -1;
    if (this.failedCols.length > 0) this.failedCols = [];
  }

  /**
   * The numeric factorization in the current order failed at `step` — `singular` when the pivot was
   * below the zero bound, not just the threshold: the columns from that step on are left unpivoted.
   * Returns false, the factorization's answer.
   */
  pivotFailed(step: number, singular: boolean): false {
    this.singular = singular;
    this.failedStep = step;
    this.failedCols = Array.from(this.sym!.colPerm.subarray(step));
    return false;
  }

  /** Make s the current order (its plan and factor storage); the values are the caller's. */
  use(s: Symbolic): void {
    if (this.sym === s && this.plan) return;
    this.sym = s;
    let plan = this.plans.get(s);
    if (!plan) {
      plan = makePlan(this.a, s);
      this.plans.set(s, plan);
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

  /** Drop the plan of an order no longer in use. */
  forget(s: Symbolic): void {
    this.plans.delete(s);
  }

  /** The factors as dense re/im arrays (tests only; O(n²) memory): L unit lower, U upper. */
  dense(): { lRe: number[][]; lIm: number[][]; uRe: number[][]; uIm: number[][] } {
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
}
