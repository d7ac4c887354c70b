import type { SparseComplexMatrix } from "./sparse-matrix";

/**
 * Each row's and column's largest |re| + |im| of A = G + jωC as terms |g| + ω·|c| (ω ≥ 0), kept
 * only where no other entry of the same row (column) has both a larger-or-equal |g| and |c|:
 * a dropped term is ≤ a kept one at every ω, and stays so after rounding (rounded + and × are
 * monotone), so the maximum over the kept terms is bit for bit the maximum over all entries. A
 * row of a circuit matrix keeps one or two terms, so a frequency's maxima cost O(n), not O(nnz).
 */
export interface PencilMaxima {
  rowPtr: Int32Array;
  rowG: Float64Array;
  rowC: Float64Array;
  colPtr: Int32Array;
  colG: Float64Array;
  colC: Float64Array;
  /** Every row and column keeps exactly one term (set by `pencilInOrder`): `pencilTests` is one flat pass. */
  single?: boolean;
}

export function pencilMaxima(a: SparseComplexMatrix, g: Float64Array, c: Float64Array): PencilMaxima {
  const { rowPtr, colIdx, n } = a;
  const nnz = colIdx.length;
  // Each column's entries (CSR positions, rows ascending) by a counting sort; a row's are rowPtr's.
  const colPtr = new Int32Array(n + 1);
  for (let p = 0; p < nnz; p++) colPtr[colIdx[p]! + 1]!++;
  for (let j = 0; j < n; j++) colPtr[j + 1]! += colPtr[j]!;
  const byCol = new Int32Array(nnz);
  const at = colPtr.slice(0, n);
  for (let p = 0; p < nnz; p++) byCol[at[colIdx[p]!]!++] = p;
  const byRow = new Int32Array(nnz);
  for (let p = 0; p < nnz; p++) byRow[p] = p;
  // |g| and |c| of every entry, once (the groups compare each entry with its neighbours); an
  // entry with a NaN gets |g| = −1, which marks it as left out.
  const ag = new Float64Array(nnz);
  const ac = new Float64Array(nnz);
  for (let p = 0; p < nnz; p++) {
    const nan = Number.isNaN(g[p]!) || Number.isNaN(c[p]!);
    ag[p] = nan ? -1 : Math.abs(g[p]!);
    ac[p] = Math.abs(c[p]!);
  }
  const rows = keptTerms(rowPtr, byRow, ag, ac);
  const cols = keptTerms(colPtr, byCol, ag, ac);
  return { rowPtr: rows.ptr, rowG: rows.g, rowC: rows.c, colPtr: cols.ptr, colG: cols.g, colC: cols.c };
}

/**
 * The terms (|g|, |c|) of each group (entries list[ptr[i]…ptr[i+1]) ) that no other term of the
 * group dominates — larger-or-equal in both, larger in one, or equal and earlier — NaN terms left
 * out: the Pareto front, one term per distinct pair. A group's terms in any order (the tests take
 * their maximum). `ag`, `ac`: |g| and |c| of every entry, ag < 0 for an entry with a NaN. Allocates
 * only the result and calls no function per pair (this runs once, before the JIT has warmed up).
 */
function keptTerms(
  ptr: Int32Array,
  list: Int32Array,
  ag: Float64Array,
  ac: Float64Array,
): { ptr: Int32Array; g: Float64Array; c: Float64Array } {
  const n = ptr.length - 1;
  const out = new Int32Array(n + 1);
  const gs = new Float64Array(list.length);
  const cs = new Float64Array(list.length);
  let m = 0;
  for (let i = 0; i < n; i++) {
    const e0 = ptr[i]!;
    const e1 = ptr[i + 1]!;
    if (e1 - e0 > 32) {
      // A long group (a node with many parts): sorted by |g| descending, then |c| descending, a
      // term is kept when its |c| beats every kept one's — the same front in O(m log m).
      const terms = Array.from(list.subarray(e0, e1), (p) => [ag[p]!, ac[p]!] as const)
        .filter(([x]) => x >= 0)
        .sort((u, v) => v[0] - u[0] || v[1] - u[1]);
      let bestC = -1;
      for (const [x, y] of terms) {
        if (y <= bestC) continue;
        gs[m] = x;
        cs[m] = y;
        m++;
        bestC = y;
      }
      out[i + 1] = m;
      continue;
    }
    for (let e = e0; e < e1; e++) {
      const x = ag[list[e]!]!;
      const y = ac[list[e]!]!;
      if (x < 0) continue;
      let dominated = false;
      for (let f = e0; f < e1 && !dominated; f++) {
        if (f === e) continue;
        const xf = ag[list[f]!]!;
        const yf = ac[list[f]!]!;
        if (xf < 0) continue;
        dominated = xf >= x && yf >= y && (xf > x || yf > y || f < e);
      }
      if (dominated) continue;
      gs[m] = x;
      cs[m] = y;
      m++;
    }
    out[i + 1] = m;
  }
  return { ptr: out, g: gs.slice(0, m), c: cs.slice(0, m) };
}

/**
 * The pencil's kept terms renumbered to a pivot order: row k of the result holds the terms of
 * original row rowPerm[k], column k those of original column colPerm[k] (so `pencilTests` walks
 * both in step order, without indirection).
 */
export function pencilInOrder(
  pen: PencilMaxima,
  order: { rowPerm: Int32Array; colPerm: Int32Array },
): PencilMaxima {
  const permute = (ptr: Int32Array, g: Float64Array, c: Float64Array, perm: Int32Array) => {
    const n = perm.length;
    const outPtr = new Int32Array(n + 1);
    const outG = new Float64Array(g.length);
    const outC = new Float64Array(c.length);
    let at = 0;
    for (let k = 0; k < n; k++) {
      const i = perm[k]!;
      for (let p = ptr[i]!; p < ptr[i + 1]!; p++) {
        outG[at] = g[p]!;
        outC[at] = c[p]!;
        at++;
      }
      outPtr[k + 1] = at;
    }
    return { ptr: outPtr, g: outG, c: outC };
  };
  const rows = permute(pen.rowPtr, pen.rowG, pen.rowC, order.rowPerm);
  const cols = permute(pen.colPtr, pen.colG, pen.colC, order.colPerm);
  let single = true;
  for (let k = 0; k < order.rowPerm.length && single; k++) {
    single = rows.ptr[k + 1]! - rows.ptr[k]! === 1 && cols.ptr[k + 1]! - cols.ptr[k]! === 1;
  }
  return {
    rowPtr: rows.ptr,
    rowG: rows.g,
    rowC: rows.c,
    colPtr: cols.ptr,
    colG: cols.g,
    colC: cols.c,
    single,
  };
}

/**
 * The pivot tests' maxima at ω of a pencil in pivot order (`pencilInOrder`): `pencilTests`, in
 * WebAssembly (lu-wasm.ts, `pencilTests` in lu-kernels.wat).
 */
export { pencilTests } from "./lu-wasm";
