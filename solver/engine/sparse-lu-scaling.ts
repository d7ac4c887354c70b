import { Equilibration } from "./equilibrate";
import type { Symbolic } from "./markowitz";
import type { SparseComplexMatrix } from "./sparse-matrix";

/**
 * The scaling behind the pivot tests of `SparseComplexLU`: the row and column factors D_r, D_c of
 * the current values and the zero-pivot bound, as the numeric factorization reads them.
 *
 * Every (re)factorization first computes D_r, D_c (`Equilibration`: Ruiz's max-norm scaling —
 * iterated to convergence in powers of two before an ordering is analysed, one step per frequency
 * on the fast refactor path) and pivots as if it factored D_r·A·D_c: the ordering sees the scaled
 * values (`scaled`), and the threshold and zero-pivot tests compare scaled quantities (the pivot
 * of step k of D_r·A·D_c is u_kk·r_k·c_k for the same order). The numbers themselves are factored
 * unscaled, so the solves need no scaling. The tests are squared and multiplied out, so a step
 * needs no square root or division besides the pivot's reciprocal; with a pencil the one Ruiz
 * step's maxima cost O(n) per frequency (`pencilMaxima`), not a pass over the values.
 *
 * The tests, in pivot order, need no square root or division per step: cm[k] = 1/c_k² (c_k the
 * column factor of step k), rm[k] = 1/r_k² (of its row). After a full equilibration (`full`) c, r
 * are `eq`'s powers of two; on the refactor path (`oneStep`) they come from one Ruiz step,
 * c_j = 1/√cmax_j and r_i = 1/√rmax_i, i.e. cm = cmax, rm = rmax.
 */
export class PivotTests {
  readonly eq: Equilibration;
  readonly cm: Float64Array;
  readonly rm: Float64Array;
  /** Largest |re| + |im| of each original row and column (the one Ruiz step of a refactor). */
  readonly rmax: Float64Array;
  readonly cmax: Float64Array;
  /** Where the current tests come from: a full equilibration (`eq`) or the maxima. */
  fromEq = true;
  /** Zero-pivot bound of the current values: singularRel · max |scaled entry|. */
  absTol = 0;

  constructor(
    private readonly n: number,
    private readonly singularRel: number,
  ) {
    this.eq = new Equilibration(n);
    this.cm = new Float64Array(n);
    this.rm = new Float64Array(n);
    this.rmax = new Float64Array(n);
    this.cmax = new Float64Array(n);
  }

  /** Equilibrate the values re/im fully: factors into `eq`, the zero-pivot bound into `absTol`. */
  full(a: SparseComplexMatrix, re: Float64Array, im: Float64Array): void {
    this.absTol = this.singularRel * this.eq.compute(a, re, im);
    this.fromEq = true;
  }

  /** The tests come from one Ruiz step (rmax/cmax, or cm/rm filled directly from a pencil). */
  oneStep(): void {
    // Every entry of the once-scaled matrix is at most 1 (|a_ij| ≤ √(rmax_i·cmax_j)).
    this.absTol = this.singularRel;
    this.fromEq = false;
  }

  /** cm/rm in the pivot order s, from `eq` or from the maxima (see the fields). */
  prepare(s: Symbolic): void {
    const { rowPerm, colPerm } = s;
    const { cm, rm, n } = this;
    if (this.fromEq) {
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

  /** The values re/im scaled by `eq` (D_r·A·D_c), a copy: for an ordering to analyse. */
  scaled(a: SparseComplexMatrix, re: Float64Array, im: Float64Array): { re: Float64Array; im: Float64Array } {
    const { rowPtr, colIdx } = a;
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
    return { re: sRe, im: sIm };
  }
}
