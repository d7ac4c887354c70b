import { KernelSpace } from "./lu-wasm";
import type { Symbolic } from "./markowitz";
import { makePlan, type Plan } from "./sparse-lu-plan";
import type { SparseComplexMatrix } from "./sparse-matrix";

/**
 * The numbers of one factorization P·A·Q = L·U (see `SparseComplexLU`) and the order they are in:
 * L and U in CSR over the permuted indices (the pattern of `sym`), each complex number's parts side
 * by side in one array (`fac`), the pivots' reciprocals (so the solves multiply only), a scratch
 * vector, and the verdict of the last factorization. `use(s)` switches the order; each order's plan is kept, so switching back
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
  /**
   * The WebAssembly memory and kernels of each order in use (lu-wasm.ts): while an order is in
   * use, `fac`, `inv` and `w` are views of its memory.
   */
  private readonly spaces = new Map<Symbolic, KernelSpace>();
  /** The current order's space. */
  space: KernelSpace | null = null;
  /**
   * L, U and the pivots in one array, each complex number's real and imaginary parts side by side
   * (slot t at 2t and 2t + 1; L's slots at 0, U's at nnz(L), the pivots at nnz(L) + nnz(U)). Side
   * by side, not in a re and an im array: a kernel's row reads both parts of an entry, and half as
   * many arrays leave the optimized loops registers for the rest (the solves ~15–20 % faster).
   */
  fac: Float64Array = new Float64Array(0);
  /** The pivots' reciprocals 1/u_kk, interleaved as `fac` (k at 2k, 2k + 1). */
  inv: Float64Array = new Float64Array(0);
  /**
   * Scratch of the scatter factorization and the solves, interleaved as `fac` (zero between uses
   * by the former), with one more pair at 2n that nothing writes and so stays 0: where a reader of
   * z in the pivot order (`solveFactorsTransposedInSteps`) finds gnd.
   */
  w: Float64Array = new Float64Array(0);
  /**
   * The right-hand side whose forward substitution (y with L·y = P·b) the last factorization left
   * in w (`factorPencil` with b), or null; any solve or factorization clears it.
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

  /**
   * Make s the current order (its plan and factor storage); the values are the caller's. Each
   * order has its own WebAssembly memory (`KernelSpace`), kept with its plan.
   */
  use(s: Symbolic): void {
    if (this.sym === s && this.plan) return;
    this.sym = s;
    let plan = this.plans.get(s);
    if (!plan) {
      plan = makePlan(this.a, s);
      this.plans.set(s, plan);
    }
    this.plan = plan;
    let space = this.spaces.get(s);
    if (!space) {
      space = new KernelSpace(this.n, this.a.colIdx.length, s, plan.updStart, plan.upd);
      this.spaces.set(s, space);
    }
    this.space = space;
    this.fac = space.fac;
    this.inv = space.inv;
    this.w = space.w;
  }

  /** The memory of order s, if it has been used. */
  spaceOf(s: Symbolic): KernelSpace | null {
    return this.spaces.get(s) ?? null;
  }

  /** Drop the plan of an order no longer in use. */
  forget(s: Symbolic): void {
    this.plans.delete(s);
    this.spaces.delete(s);
  }

  /** The factors as dense re/im arrays (tests only; O(n²) memory): L unit lower, U upper. */
  dense(): { lRe: number[][]; lIm: number[][]; uRe: number[][]; uIm: number[][] } {
    const n = this.n;
    const z = () => Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const out = { lRe: z(), lIm: z(), uRe: z(), uIm: z() };
    const s = this.sym;
    if (!s) return out;
    const { fac, inv } = this;
    const offU = s.lIdx.length;
    for (let k = 0; k < n; k++) {
      out.lRe[k]![k] = 1;
      for (let q = s.lPtr[k]!; q < s.lPtr[k + 1]!; q++) {
        out.lRe[k]![s.lIdx[q]!] = fac[2 * q]!;
        out.lIm[k]![s.lIdx[q]!] = fac[2 * q + 1]!;
      }
      const d = inv[2 * k]! ** 2 + inv[2 * k + 1]! ** 2;
      out.uRe[k]![k] = inv[2 * k]! / d;
      out.uIm[k]![k] = -inv[2 * k + 1]! / d;
      for (let t = s.uPtr[k]!; t < s.uPtr[k + 1]!; t++) {
        out.uRe[k]![s.uIdx[t]!] = fac[2 * (offU + t)]!;
        out.uIm[k]![s.uIdx[t]!] = fac[2 * (offU + t) + 1]!;
      }
    }
    return out;
  }
}
