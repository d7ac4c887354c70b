/**
 * Compressed sparse row (CSR) storage of a square complex matrix with split real/imaginary arrays.
 *
 * Entries of one row are sorted by column and unique. Values live in two Float64Arrays so the hot
 * loops touch plain numbers only (no per-entry objects).
 */
export interface SparseComplexMatrix {
  n: number;
  /** rowPtr[i]…rowPtr[i+1]−1 are the positions of row i (length n+1). */
  rowPtr: Int32Array;
  /** Column of each stored entry. */
  colIdx: Int32Array;
  re: Float64Array;
  im: Float64Array;
}

/** A CSR matrix built from triplets: its pattern and two value arrays (see `csrFromTriplets`). */
export interface TripletCsr {
  n: number;
  rowPtr: Int32Array;
  colIdx: Int32Array;
  /** The triplets' first and second values summed per entry, in triplet order. */
  a: Float64Array;
  b: Float64Array;
}

/**
 * A CSR matrix from (row, col) triplets with two values each (G and C, or re and im): entries at
 * one place are merged, their values summed in the order the triplets come (so the same sums as
 * adding them up triplet by triplet).
 * Order: the triplets sorted by row, then column, stably (a counting sort by row, then an insertion
 * sort of each row by column: rows of a circuit matrix hold a handful of entries); the sums are
 * made in the same pass. The matrix is built once per system, usually before the JIT has seen this
 * code, where a general sort with a comparator called for every pair, or a second pass over the
 * triplets to sum them, cost as much as the rest of the system's assembly.
 * Cost: O(t + n + Σ row²) for t triplets (O(t) for circuit matrices).
 */
export function csrFromTriplets(
  n: number,
  rows: ArrayLike<number>,
  cols: ArrayLike<number>,
  va: ArrayLike<number>,
  vb: ArrayLike<number>,
): TripletCsr {
  const t = rows.length;
  if (cols.length !== t || va.length !== t || vb.length !== t)
    throw new RangeError("triplet arrays differ in length");
  // start[r] = first place of row r in `order`.
  const start = new Int32Array(n + 1);
  for (let k = 0; k < t; k++) {
    const r = rows[k]!;
    const c = cols[k]!;
    if (!(r >= 0 && r < n && c >= 0 && c < n))
      throw new RangeError(`entry (${r}, ${c}) outside a ${n}×${n} matrix`);
    start[r + 1]!++;
  }
  for (let i = 0; i < n; i++) start[i + 1] = start[i + 1]! + start[i]!;
  const order = new Int32Array(t);
  const fill = start.slice(0, n);
  for (let k = 0; k < t; k++) order[fill[rows[k]!]!++] = k;
  const rowPtr = new Int32Array(n + 1);
  const colIdx = new Int32Array(t);
  const sa = new Float64Array(t);
  const sb = new Float64Array(t);
  let nnz = 0;
  for (let i = 0; i < n; i++) {
    const a = start[i]!;
    const b = start[i + 1]!;
    // Stable insertion sort of row i by column.
    for (let p = a + 1; p < b; p++) {
      const k = order[p]!;
      const c = cols[k]!;
      let q = p;
      while (q > a && cols[order[q - 1]!]! > c) {
        order[q] = order[q - 1]!;
        q--;
      }
      order[q] = k;
    }
    let lastC = -1;
    for (let p = a; p < b; p++) {
      const k = order[p]!;
      const c = cols[k]!;
      if (c !== lastC) {
        colIdx[nnz++] = c;
        lastC = c;
      }
      // Stable: an entry's triplets come in triplet order (0 + x as the first sum, as adding up).
      sa[nnz - 1] = sa[nnz - 1]! + va[k]!;
      sb[nnz - 1] = sb[nnz - 1]! + vb[k]!;
    }
    rowPtr[i + 1] = nnz;
  }
  return { n, rowPtr, colIdx: colIdx.slice(0, nnz), a: sa.slice(0, nnz), b: sb.slice(0, nnz) };
}

/** A sparse complex matrix from dense re/im rows (tests and small cases). Zeros are not stored. */
export function sparseFromDense(re: number[][], im?: number[][]): SparseComplexMatrix {
  const n = re.length;
  const rows: number[] = [];
  const cols: number[] = [];
  const vr: number[] = [];
  const vi: number[] = [];
  for (let i = 0; i < n; i++) {
    const row = re[i] ?? [];
    if (row.length !== n) throw new RangeError("matrix is not square");
    for (let j = 0; j < n; j++) {
      const a = row[j] ?? 0;
      const b = im?.[i]?.[j] ?? 0;
      if (a !== 0 || b !== 0) {
        rows.push(i);
        cols.push(j);
        vr.push(a);
        vi.push(b);
      }
    }
  }
  const m = csrFromTriplets(n, rows, cols, vr, vi);
  return { n, rowPtr: m.rowPtr, colIdx: m.colIdx, re: m.a, im: m.b };
}
