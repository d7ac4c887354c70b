import type { SparseComplexMatrix } from "./sparse-matrix";

/**
 * The symbolic half of a sparse LU: pivot order and fill pattern, fixed for a whole sweep.
 *
 * Invariant: with P the row order `rowPerm` and Q the column order `colPerm`, the factors of
 * P·A·Q have their nonzeros inside the patterns `lPtr/lIdx` (strictly lower, sorted ascending
 * per row) and `uPtr/uIdx` (strictly upper) — for every matrix whose nonzeros lie in A's pattern.
 */
export interface Symbolic {
  n: number;
  /** rowPerm[k] = original row pivoted at step k. */
  rowPerm: Int32Array;
  /** colPerm[k] = original column pivoted at step k. */
  colPerm: Int32Array;
  /** colPos[j] = step at which original column j is pivoted (inverse of colPerm). */
  colPos: Int32Array;
  lPtr: Int32Array;
  lIdx: Int32Array;
  uPtr: Int32Array;
  uIdx: Int32Array;
}

export type OrderingResult =
  | { ok: true; symbolic: Symbolic }
  /** No acceptable pivot at `step`: `rows`/`cols` are the original indices still unpivoted. */
  | { ok: false; step: number; rows: number[]; cols: number[] };

export interface OrderingOptions {
  /** Threshold τ of threshold pivoting: a pivot must satisfy |a_rc| ≥ τ·max_j |a_rj|. */
  pivotThreshold: number;
  /** Entries with |a| ≤ absTolerance are never pivots. */
  absTolerance: number;
  /** Rows with candidates examined before the search stops (Zlatev's restricted search). */
  searchRows: number;
}

/**
 * Markowitz ordering with threshold pivoting, by dynamic elimination on the given values.
 *
 * Method: H. M. Markowitz, "The elimination form of the inverse and its application to linear
 * programming", Management Science 3 (1957) 255–269 — choose the pivot minimising
 * (r−1)(c−1) (r, c: active row and column counts) among entries that pass a stability threshold;
 * the restricted search over a few sparsest rows follows Z. Zlatev, "On some pivotal strategies in
 * Gaussian elimination by sparse technique", SIAM J. Numer. Anal. 17 (1980); see also I. S. Duff,
 * A. M. Erisman & J. K. Reid, "Direct Methods for Sparse Matrices", ch. 7 and 9.
 * The threshold is applied along the pivot's ROW (|a_rc| ≥ τ·max_j|a_rj|), i.e. threshold partial
 * pivoting of Aᵀ; the numeric refactorization checks the same quantity, so both agree exactly.
 * Fill is recorded structurally (an update creates an entry even when it is numerically zero), so
 * the pattern holds for every frequency whose matrix has A's pattern.
 *
 * Cost: one pass of sparse elimination over array rows and columns (insertion-ordered, as the
 * search's tie-breaking needs); fine for the tens of thousands of unknowns of circuit matrices,
 * and run once per sweep.
 */
export function markowitzOrder(
  a: SparseComplexMatrix,
  re: Float64Array,
  im: Float64Array,
  opt: OrderingOptions,
): OrderingResult {
  const n = a.n;
  // Active matrix in plain arrays (no Map/Set, no per-entry objects: the analysis runs once per
  // sweep, usually before the JIT has warmed up, where a Map of [re, im] pairs cost ~0.2 s for
  // 1 000 unknowns). Every list keeps insertion order with order-preserving deletion, as a Map
  // or Set would, so the search visits rows and entries in the same order as before.
  //  rowCols[i], rowRe[i], rowIm[i]: the active entries of row i;  colRows[j]: rows with an entry in j.
  const rowCols: number[][] = [];
  const rowRe: number[][] = [];
  const rowIm: number[][] = [];
  const colRows: number[][] = [];
  for (let j = 0; j < n; j++) colRows.push([]);
  for (let i = 0; i < n; i++) {
    const cs: number[] = [];
    const rs: number[] = [];
    const is: number[] = [];
    for (let p = a.rowPtr[i]!; p < a.rowPtr[i + 1]!; p++) {
      const j = a.colIdx[p]!;
      cs.push(j);
      rs.push(re[p]!);
      is.push(im[p]!);
      colRows[j]!.push(i);
    }
    rowCols.push(cs);
    rowRe.push(rs);
    rowIm.push(is);
  }
  // Buckets of active rows by count, so the sparsest rows are searched first: doubly linked lists
  // appended at the tail (a row moved to a bucket goes last, as Set delete + add would put it).
  const head = new Int32Array(n + 1).fill(-1);
  const tail = new Int32Array(n + 1).fill(-1);
  const next = new Int32Array(n).fill(-1);
  const prev = new Int32Array(n).fill(-1);
  const rowCount = new Int32Array(n);
  const link = (i: number, cnt: number) => {
    rowCount[i] = cnt;
    prev[i] = tail[cnt]!;
    next[i] = -1;
    if (tail[cnt]! >= 0) next[tail[cnt]!] = i;
    else head[cnt] = i;
    tail[cnt] = i;
  };
  const unlink = (i: number) => {
    const cnt = rowCount[i]!;
    if (prev[i]! >= 0) next[prev[i]!] = next[i]!;
    else head[cnt] = next[i]!;
    if (next[i]! >= 0) prev[next[i]!] = prev[i]!;
    else tail[cnt] = prev[i]!;
  };
  for (let i = 0; i < n; i++) link(i, rowCols[i]!.length);
  let maxCount = 0;
  for (let i = 0; i < n; i++) maxCount = Math.max(maxCount, rowCount[i]!);
  const moveRow = (i: number, size: number) => {
    if (size > maxCount) maxCount = size;
    unlink(i);
    link(i, size);
  };
  /** Remove the first `v` from `list`, keeping the order of the rest. */
  const remove = (list: number[], v: number) => {
    const at = list.indexOf(v);
    if (at >= 0) list.splice(at, 1);
  };

  const rowPerm = new Int32Array(n);
  const colPerm = new Int32Array(n);
  const lSteps: number[][] = Array.from({ length: n }, () => []);
  const uCols: number[][] = [];
  const rowDone = new Uint8Array(n);
  const colDone = new Uint8Array(n);
  // Position of column j in the row being updated (−1 elsewhere).
  const pos = new Int32Array(n).fill(-1);

  for (let step = 0; step < n; step++) {
    let bestR = -1;
    let bestC = -1;
    let bestCost = Number.POSITIVE_INFINITY;
    let bestRatio = 0;
    let searched = 0;
    for (let cnt = 1; cnt <= maxCount && searched < opt.searchRows && bestCost > 0; cnt++) {
      for (let r = head[cnt]!; r >= 0; r = next[r]!) {
        const cs = rowCols[r]!;
        const rs = rowRe[r]!;
        const is = rowIm[r]!;
        let rowMax = 0;
        for (let t = 0; t < cs.length; t++) rowMax = Math.max(rowMax, Math.hypot(rs[t]!, is[t]!));
        if (rowMax <= opt.absTolerance) continue;
        let found = false;
        for (let t = 0; t < cs.length; t++) {
          const c = cs[t]!;
          const mag = Math.hypot(rs[t]!, is[t]!);
          if (mag <= opt.absTolerance || mag < opt.pivotThreshold * rowMax) continue;
          found = true;
          const cost = (cnt - 1) * (colRows[c]!.length - 1);
          const ratio = mag / rowMax;
          if (cost < bestCost || (cost === bestCost && ratio > bestRatio)) {
            bestCost = cost;
            bestR = r;
            bestC = c;
            bestRatio = ratio;
          }
        }
        if (found && ++searched >= opt.searchRows) break;
        if (bestCost === 0) break;
      }
    }
    if (bestR < 0) {
      const restRows: number[] = [];
      const restCols: number[] = [];
      for (let i = 0; i < n; i++) if (!rowDone[i]) restRows.push(i);
      for (let j = 0; j < n; j++) if (!colDone[j]) restCols.push(j);
      return { ok: false, step, rows: restRows, cols: restCols };
    }
    const r = bestR;
    const c = bestC;
    rowPerm[step] = r;
    colPerm[step] = c;
    rowDone[r] = 1;
    colDone[c] = 1;
    // The pivot row without the pivot: U's columns, in the row's order, and their values.
    const pCols = rowCols[r]!;
    const pRe = rowRe[r]!;
    const pIm = rowIm[r]!;
    const at = pCols.indexOf(c);
    const pivRe = pRe[at]!;
    const pivIm = pIm[at]!;
    const den = pivRe * pivRe + pivIm * pivIm;
    const u: number[] = [];
    const uRe: number[] = [];
    const uIm: number[] = [];
    for (let t = 0; t < pCols.length; t++) {
      if (t === at) continue;
      u.push(pCols[t]!);
      uRe.push(pRe[t]!);
      uIm.push(pIm[t]!);
    }
    uCols.push(u);
    const col = colRows[c]!;
    for (let e = 0; e < col.length; e++) {
      const i = col[e]!;
      if (i === r) continue;
      const cs = rowCols[i]!;
      const rs = rowRe[i]!;
      const is = rowIm[i]!;
      const ic = cs.indexOf(c);
      const aicRe = rs[ic]!;
      const aicIm = is[ic]!;
      // l = a_ic / a_rc
      const lr = (aicRe * pivRe + aicIm * pivIm) / den;
      const li = (aicIm * pivRe - aicRe * pivIm) / den;
      lSteps[i]!.push(step);
      cs.splice(ic, 1);
      rs.splice(ic, 1);
      is.splice(ic, 1);
      for (let t = 0; t < cs.length; t++) pos[cs[t]!] = t;
      for (let t = 0; t < u.length; t++) {
        const j = u[t]!;
        const dr = lr * uRe[t]! - li * uIm[t]!;
        const di = lr * uIm[t]! + li * uRe[t]!;
        const q = pos[j]!;
        if (q >= 0) {
          rs[q] = rs[q]! - dr;
          is[q] = is[q]! - di;
        } else {
          cs.push(j);
          rs.push(-dr);
          is.push(-di);
          colRows[j]!.push(i);
        }
      }
      for (let t = 0; t < cs.length; t++) pos[cs[t]!] = -1;
      moveRow(i, cs.length);
    }
    for (const j of u) remove(colRows[j]!, r);
    colRows[c] = [];
    unlink(r);
    rowCols[r] = [];
    rowRe[r] = [];
    rowIm[r] = [];
  }

  const colPos = new Int32Array(n);
  for (let k = 0; k < n; k++) colPos[colPerm[k]!] = k;
  const lPtr = new Int32Array(n + 1);
  const uPtr = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) {
    lPtr[k + 1] = lPtr[k]! + lSteps[rowPerm[k]!]!.length;
    uPtr[k + 1] = uPtr[k]! + uCols[k]!.length;
  }
  const lIdx = new Int32Array(lPtr[n]!);
  const uIdx = new Int32Array(uPtr[n]!);
  for (let k = 0; k < n; k++) {
    lIdx.set(lSteps[rowPerm[k]!]!, lPtr[k]!);
    const us = uCols[k]!.map((j) => colPos[j]!).sort((x, y) => x - y);
    uIdx.set(us, uPtr[k]!);
  }
  const symbolic: Symbolic = { n, rowPerm, colPerm, colPos, lPtr, lIdx, uPtr, uIdx };
  return { ok: true, symbolic };
}
