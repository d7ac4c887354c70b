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

/** A CSR pattern built from triplets, with the position each triplet landed on. */
export interface TripletPattern {
  n: number;
  rowPtr: Int32Array;
  colIdx: Int32Array;
  /** slot[t] is the CSR position of triplet t (duplicates share a slot and are summed by the caller). */
  slot: Int32Array;
}

/**
 * Build a CSR pattern from (row, col) triplets. Duplicates are merged.
 * Cost: O(t log t) for t triplets (one sort of the keys).
 */
export function patternFromTriplets(
  n: number,
  rows: ArrayLike<number>,
  cols: ArrayLike<number>,
): TripletPattern {
  const t = rows.length;
  if (cols.length !== t) throw new RangeError("rows and cols differ in length");
  const order = Array.from({ length: t }, (_, k) => k);
  order.sort((a, b) => (rows[a] ?? 0) - (rows[b] ?? 0) || (cols[a] ?? 0) - (cols[b] ?? 0));
  const rowPtr = new Int32Array(n + 1);
  const colList: number[] = [];
  const slot = new Int32Array(t);
  let lastR = -1;
  let lastC = -1;
  for (const k of order) {
    const r = rows[k] ?? 0;
    const c = cols[k] ?? 0;
    if (r < 0 || r >= n || c < 0 || c >= n)
      throw new RangeError(`entry (${r}, ${c}) outside a ${n}×${n} matrix`);
    if (r !== lastR || c !== lastC) {
      colList.push(c);
      rowPtr[r + 1] = (rowPtr[r + 1] ?? 0) + 1;
      lastR = r;
      lastC = c;
    }
    slot[k] = colList.length - 1;
  }
  for (let i = 0; i < n; i++) rowPtr[i + 1] = (rowPtr[i + 1] ?? 0) + (rowPtr[i] ?? 0);
  return { n, rowPtr, colIdx: Int32Array.from(colList), slot };
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
  const p = patternFromTriplets(n, rows, cols);
  const nnz = p.colIdx.length;
  const outRe = new Float64Array(nnz);
  const outIm = new Float64Array(nnz);
  for (let t = 0; t < rows.length; t++) {
    const s = p.slot[t] ?? 0;
    outRe[s] = (outRe[s] ?? 0) + (vr[t] ?? 0);
    outIm[s] = (outIm[s] ?? 0) + (vi[t] ?? 0);
  }
  return { n, rowPtr: p.rowPtr, colIdx: p.colIdx, re: outRe, im: outIm };
}
