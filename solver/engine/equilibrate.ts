import type { SparseComplexMatrix } from "./sparse-matrix";

/**
 * Row and column equilibration of a sparse complex matrix: diagonal D_r, D_c with every row and
 * every column of D_r·A·D_c having its largest entry in [1/2, 2) (|a| measured as |re| + |im|).
 *
 * Method: iterated max-norm scaling — D. Ruiz, "A scaling algorithm to equilibrate both rows and
 * columns norms in matrices", Rutherford Appleton Laboratory report RAL-TR-2001-034 (2001): each
 * sweep divides row i by √(max_j |a_ij|) and column j by √(max_i |a_ij|) of the current scaled
 * matrix; it converges linearly, usually within a few sweeps. The factors are rounded to powers of
 * two (as LAPACK's xGEEQUB does) so scaling multiplies exactly and adds no rounding error.
 *
 * Deterministic: the factors depend on the matrix only (every call starts from D = I), so a
 * frequency gets the same scaling whatever was solved before it.
 * Cost: O(nnz) per sweep, at most `MAX_SWEEPS` sweeps. A zero row or column keeps factor 1.
 */
export const MAX_SWEEPS = 12;

export class Equilibration {
  readonly row: Float64Array;
  readonly col: Float64Array;
  private readonly rmax: Float64Array;
  private readonly cmax: Float64Array;
  /** Sweeps the last `compute` needed (diagnostics). */
  sweeps = 0;

  constructor(n: number) {
    this.row = new Float64Array(n).fill(1);
    this.col = new Float64Array(n).fill(1);
    this.rmax = new Float64Array(n);
    this.cmax = new Float64Array(n);
  }

  /** Compute the factors for values re/im in a's pattern. Returns max |entry| of the scaled matrix. */
  compute(a: SparseComplexMatrix, re: Float64Array, im: Float64Array): number {
    const { row, col, rmax, cmax } = this;
    const { rowPtr, colIdx, n } = a;
    row.fill(1);
    col.fill(1);
    let biggest = 0;
    for (let sweep = 0; sweep <= MAX_SWEEPS; sweep++) {
      rmax.fill(0);
      cmax.fill(0);
      biggest = 0;
      for (let i = 0; i < n; i++) {
        const ri = row[i]!;
        let m = 0;
        for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
          const j = colIdx[p]!;
          // |re| + |im| written out: this runs once per analysis, before the JIT has seen it,
          // where a call per entry costs more than the rest of the loop.
          const x = re[p]!;
          const y = im[p]!;
          const v = ((x < 0 ? -x : x) + (y < 0 ? -y : y)) * ri * col[j]!;
          if (v > m) m = v;
          if (v > cmax[j]!) cmax[j] = v;
        }
        rmax[i] = m;
        if (m > biggest) biggest = m;
      }
      this.sweeps = sweep;
      if (sweep === MAX_SWEEPS) break;
      // Rows and columns are updated together from the same scaled matrix (Ruiz's simultaneous form).
      const moved = rescale(row, rmax) + rescale(col, cmax);
      if (moved === 0) break;
    }
    return biggest;
  }
}

// Exponent arithmetic on the bits of a double (IEEE 754 binary64, little-endian as on every
// platform Node runs on): floor(log2 m) and 2^k without Math.log2 / Math.pow in the sweep loop.
const BUF = new Float64Array(1);
const BITS = new Int32Array(BUF.buffer);
/** floor(log2 m) for a positive normal m. */
function exponentOf(m: number): number {
  BUF[0] = m;
  return ((BITS[1]! >>> 20) & 0x7ff) - 1023;
}
/** 2^k for −1022 ≤ k ≤ 1023, exactly. */
function pow2(k: number): number {
  BITS[0] = 0;
  BITS[1] = (k + 1023) << 20;
  return BUF[0]!;
}

/**
 * Multiply each factor by 2^k, k = −⌈floor(log2 max)/2⌉ ≈ −round(log2(max)/2) (Ruiz's 1/√max in
 * powers of two), where max is outside [1/2, 2); returns how many factors moved.
 */
function rescale(factor: Float64Array, max: Float64Array): number {
  let moved = 0;
  for (let i = 0; i < factor.length; i++) {
    const m = max[i]!;
    if (m === 0 || (m >= 0.5 && m < 2) || !(m < Number.POSITIVE_INFINITY) || m < 2.3e-308) continue;
    const k = -((exponentOf(m) + 1) >> 1);
    const f = factor[i]! * pow2(k);
    if (f === 0 || !Number.isFinite(f)) continue;
    factor[i] = f;
    moved++;
  }
  return moved;
}

/**
 * The maxima of one simultaneous Ruiz step from D = I (whose factors are 1/√max; the LU's tests
 * take the maxima themselves): the largest |re| + |im| of every row into rmax and of every column
 * into cmax. One O(nnz) pass.
 */
export function rowColumnMaxima(
  a: SparseComplexMatrix,
  re: Float64Array,
  im: Float64Array,
  rmax: Float64Array,
  cmax: Float64Array,
): void {
  const { rowPtr, colIdx, n } = a;
  cmax.fill(0);
  for (let i = 0; i < n; i++) {
    let m = 0;
    const p1 = rowPtr[i + 1]!;
    for (let p = rowPtr[i]!; p < p1; p++) {
      const j = colIdx[p]!;
      const v = Math.abs(re[p]!) + Math.abs(im[p]!);
      if (v > m) m = v;
      if (v > cmax[j]!) cmax[j] = v;
    }
    rmax[i] = m;
  }
}
