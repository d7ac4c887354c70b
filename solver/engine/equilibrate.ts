import { kernelsIn, Layout } from "./lu-wasm";
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

type Equilibrate = (
  n: number,
  rowPtr: number,
  colIdx: number,
  re: number,
  im: number,
  row: number,
  col: number,
  rmax: number,
  cmax: number,
  maxSweeps: number,
  out: number,
) => number;

/** The sweeps' memory (lu-wasm.ts): the pattern, the values and the factors of one matrix size. */
interface Space {
  run: Equilibrate;
  memory: WebAssembly.Memory;
  nnz: number;
  at: {
    rowPtr: number;
    colIdx: number;
    re: number;
    im: number;
    row: number;
    col: number;
    rmax: number;
    cmax: number;
    out: number;
  };
  re: Float64Array;
  im: Float64Array;
  /** The pattern copied in (by reference). */
  rowPtrOf: Int32Array | null;
  colIdxOf: Int32Array | null;
}

/**
 * The factors of Ruiz's sweeps for one matrix size. The sweeps are WebAssembly (`equilibrate` in
 * lu-kernels.wat): an analysis runs them once, in a fresh process before the JIT has seen them,
 * where the same loops in TypeScript cost ~0.4 ms a sweep of a 1 000-node circuit. Same numbers,
 * bit for bit (tests/solver/lu-wasm.test.ts). Per row i and column j, each sweep computes
 * m = max (|re| + |im|)·row_i·col_j over the row and over the column, then multiplies each factor
 * whose m is outside [1/2, 2) by 2^−⌈floor(log2 m)/2⌉ (rows and columns from the same sweep).
 */
export class Equilibration {
  /** D_r and D_c (views of the sweeps' memory once `compute` has run). */
  row: Float64Array;
  col: Float64Array;
  /** Sweeps the last `compute` needed (diagnostics). */
  sweeps = 0;
  private space: Space | null = null;

  constructor(private readonly n: number) {
    this.row = new Float64Array(n).fill(1);
    this.col = new Float64Array(n).fill(1);
  }

  /** Compute the factors for values re/im in a's pattern. Returns max |entry| of the scaled matrix. */
  compute(a: SparseComplexMatrix, re: Float64Array, im: Float64Array): number {
    const { n } = this;
    const nnz = a.colIdx.length;
    let space = this.space;
    if (!space || space.nnz < nnz) space = this.allocate(nnz);
    const { at } = space;
    if (space.rowPtrOf !== a.rowPtr || space.colIdxOf !== a.colIdx) {
      new Int32Array(space.memory.buffer, at.rowPtr, n + 1).set(a.rowPtr);
      new Int32Array(space.memory.buffer, at.colIdx, nnz).set(a.colIdx);
      space.rowPtrOf = a.rowPtr;
      space.colIdxOf = a.colIdx;
    }
    space.re.set(re);
    space.im.set(im);
    this.row.fill(1);
    this.col.fill(1);
    const biggest = space.run(
      n,
      at.rowPtr,
      at.colIdx,
      at.re,
      at.im,
      at.row,
      at.col,
      at.rmax,
      at.cmax,
      MAX_SWEEPS,
      at.out,
    );
    this.sweeps = new Int32Array(space.memory.buffer, at.out, 1)[0]!;
    return biggest;
  }

  private allocate(nnz: number): Space {
    const n = this.n;
    const l = new Layout();
    const take = (bytes: number) => l.take(bytes);
    const at = {
      re: take(8 * nnz),
      im: take(8 * nnz),
      row: take(8 * n),
      col: take(8 * n),
      rmax: take(8 * n),
      cmax: take(8 * n),
      rowPtr: take(4 * (n + 1)),
      colIdx: take(4 * nnz),
      out: take(4),
    };
    const { memory, exports } = kernelsIn(l.size);
    const buf = memory.buffer;
    this.row = new Float64Array(buf, at.row, n);
    this.col = new Float64Array(buf, at.col, n);
    this.space = {
      run: exports.equilibrate as Equilibrate,
      memory,
      nnz,
      at,
      re: new Float64Array(buf, at.re, nnz),
      im: new Float64Array(buf, at.im, nnz),
      rowPtrOf: null,
      colIdxOf: null,
    };
    return this.space;
  }
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
