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
 * and run once per sweep — usually before the JIT has seen it, so the per-step work lives in
 * small functions (the row search, the row update, the buckets) that the engine optimizes after
 * a few hundred steps, rather than in one large loop it would compile on the side for longer
 * than the analysis takes, and each entry's squared magnitude is kept beside it (and each row's
 * largest) instead of being recomputed every time the search passes the row.
 */
export function markowitzOrder(
  a: SparseComplexMatrix,
  re: Float64Array,
  im: Float64Array,
  opt: OrderingOptions,
): OrderingResult {
  const n = a.n;
  const act = new Active(a, re, im);
  const rowPerm = new Int32Array(n);
  const colPerm = new Int32Array(n);
  const lSteps: number[][] = [];
  for (let i = 0; i < n; i++) lSteps.push([]);
  const uCols: number[][] = [];
  const rowDone = new Uint8Array(n);
  const colDone = new Uint8Array(n);
  // Position of column j in the row being updated (−1 elsewhere).
  const pos = new Int32Array(n).fill(-1);
  // The tests squared (see `scanRow`).
  const abs2 = opt.absTolerance * opt.absTolerance;
  const tau2 = opt.pivotThreshold * opt.pivotThreshold;
  const best: Best = { r: -1, c: -1, cost: 0, ratio: 0 };

  for (let step = 0; step < n; step++) {
    searchPivot(act, opt.searchRows, abs2, tau2, best);
    if (best.r < 0) {
      const restRows: number[] = [];
      const restCols: number[] = [];
      for (let i = 0; i < n; i++) if (!rowDone[i]) restRows.push(i);
      for (let j = 0; j < n; j++) if (!colDone[j]) restCols.push(j);
      return { ok: false, step, rows: restRows, cols: restCols };
    }
    const r = best.r;
    const c = best.c;
    rowPerm[step] = r;
    colPerm[step] = c;
    rowDone[r] = 1;
    colDone[c] = 1;
    // The pivot row without the pivot: U's columns, in the row's order, and their values.
    const pCols = act.cols[r]!;
    const pRe = act.re[r]!;
    const pIm = act.im[r]!;
    const at = pCols.indexOf(c);
    const pivot = new Pivot(c, pRe[at]!, pIm[at]!);
    for (let t = 0; t < pCols.length; t++) {
      if (t === at) continue;
      pivot.cols.push(pCols[t]!);
      pivot.re.push(pRe[t]!);
      pivot.im.push(pIm[t]!);
    }
    uCols.push(pivot.cols);
    const col = act.colRows[c]!;
    for (let e = 0; e < col.length; e++) {
      const i = col[e]!;
      if (i === r) continue;
      lSteps[i]!.push(step);
      updateRow(act, i, pivot, pos);
    }
    act.retire(r, c, pivot.cols);
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
    sortedSteps(uCols[k]!, colPos, uIdx, uPtr[k]!);
  }
  const symbolic: Symbolic = { n, rowPerm, colPerm, colPos, lPtr, lIdx, uPtr, uIdx };
  return { ok: true, symbolic };
}

/** The search's best pivot so far (one object for the whole ordering). */
interface Best {
  r: number;
  c: number;
  cost: number;
  ratio: number;
}

/** A pivot a_rc and the rest of its row (U's row of this step). */
class Pivot {
  readonly cols: number[] = [];
  readonly re: number[] = [];
  readonly im: number[] = [];
  /** |a_rc|². */
  readonly den: number;
  constructor(
    readonly c: number,
    readonly pivRe: number,
    readonly pivIm: number,
  ) {
    this.den = pivRe * pivRe + pivIm * pivIm;
  }
}

/**
 * The active matrix in plain arrays (no Map/Set, no per-entry objects): the entries of row i are
 * cols[i], re[i], im[i] and their squared magnitudes m2[i]; colRows[j] lists the rows with an entry
 * in column j. Every list keeps insertion order with order-preserving deletion, as a Map or Set
 * would, so the search visits rows and entries in a fixed order. Rows sit in buckets by count
 * (doubly linked lists appended at the tail: a row moved to a bucket goes last), so the sparsest
 * are searched first.
 */
class Active {
  readonly cols: number[][] = [];
  readonly re: number[][] = [];
  readonly im: number[][] = [];
  readonly m2: number[][] = [];
  readonly colRows: number[][] = [];
  /** Largest squared magnitude of each row, −1 when the row changed since it was computed. */
  readonly rowMax2: Float64Array;
  readonly head: Int32Array;
  readonly tail: Int32Array;
  readonly next: Int32Array;
  readonly prev: Int32Array;
  readonly count: Int32Array;
  maxCount = 0;

  constructor(a: SparseComplexMatrix, re: Float64Array, im: Float64Array) {
    const n = a.n;
    for (let j = 0; j < n; j++) this.colRows.push([]);
    for (let i = 0; i < n; i++) {
      const cs: number[] = [];
      const rs: number[] = [];
      const is: number[] = [];
      const ms: number[] = [];
      for (let p = a.rowPtr[i]!; p < a.rowPtr[i + 1]!; p++) {
        const j = a.colIdx[p]!;
        cs.push(j);
        rs.push(re[p]!);
        is.push(im[p]!);
        ms.push(re[p]! * re[p]! + im[p]! * im[p]!);
        this.colRows[j]!.push(i);
      }
      this.cols.push(cs);
      this.re.push(rs);
      this.im.push(is);
      this.m2.push(ms);
    }
    this.rowMax2 = new Float64Array(n).fill(-1);
    this.head = new Int32Array(n + 1).fill(-1);
    this.tail = new Int32Array(n + 1).fill(-1);
    this.next = new Int32Array(n).fill(-1);
    this.prev = new Int32Array(n).fill(-1);
    this.count = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const cnt = this.cols[i]!.length;
      this.link(i, cnt);
      if (cnt > this.maxCount) this.maxCount = cnt;
    }
  }

  link(i: number, cnt: number): void {
    const { tail, next, prev } = this;
    this.count[i] = cnt;
    prev[i] = tail[cnt]!;
    next[i] = -1;
    if (tail[cnt]! >= 0) next[tail[cnt]!] = i;
    else this.head[cnt] = i;
    tail[cnt] = i;
  }

  unlink(i: number): void {
    const { next, prev } = this;
    const cnt = this.count[i]!;
    if (prev[i]! >= 0) next[prev[i]!] = next[i]!;
    else this.head[cnt] = next[i]!;
    if (next[i]! >= 0) prev[next[i]!] = prev[i]!;
    else this.tail[cnt] = prev[i]!;
  }

  /** Row i changed: its largest magnitude is stale, and it goes last in the bucket of its count. */
  changed(i: number): void {
    const size = this.cols[i]!.length;
    if (size > this.maxCount) this.maxCount = size;
    this.rowMax2[i] = -1;
    this.unlink(i);
    this.link(i, size);
  }

  /** Row r was pivoted on column c: r leaves the buckets, and the columns of U's row forget r. */
  retire(r: number, c: number, uCols: number[]): void {
    for (let t = 0; t < uCols.length; t++) {
      const list = this.colRows[uCols[t]!]!;
      const at = list.indexOf(r);
      if (at >= 0) list.splice(at, 1);
    }
    this.colRows[c] = [];
    this.unlink(r);
    this.cols[r] = [];
    this.re[r] = [];
    this.im[r] = [];
    this.m2[r] = [];
  }
}

/**
 * The pivot of the next step into `best` (best.r = −1 when no entry passes): the sparsest rows
 * first, `searchRows` rows that have a candidate, the least Markowitz cost, ties to the larger
 * |a_rc| / max_j |a_rj|.
 */
function searchPivot(act: Active, searchRows: number, abs2: number, tau2: number, best: Best): void {
  best.r = -1;
  best.c = -1;
  best.cost = Number.POSITIVE_INFINITY;
  best.ratio = 0;
  let searched = 0;
  const { head, next } = act;
  for (let cnt = 1; cnt <= act.maxCount && searched < searchRows && best.cost > 0; cnt++) {
    for (let r = head[cnt]!; r >= 0; r = next[r]!) {
      if (scanRow(act, r, cnt, abs2, tau2, best) && ++searched >= searchRows) break;
      if (best.cost === 0) break;
    }
  }
}

/**
 * Row r's candidates (count `cnt`) against `best`; true when the row has one. The tests compare
 * squares: |a|² ≤ abs² (zero) and |a|² < τ²·max_j |a_rj|² (threshold), the same verdicts as on
 * the magnitudes (the values are equilibrated, their largest near 1: no square overflows, and one
 * that underflows is far below the zero bound either way).
 */
function scanRow(act: Active, r: number, cnt: number, abs2: number, tau2: number, best: Best): boolean {
  const cs = act.cols[r]!;
  const ms = act.m2[r]!;
  let rowMax2 = act.rowMax2[r]!;
  if (rowMax2 < 0) {
    rowMax2 = 0;
    for (let t = 0; t < ms.length; t++) if (ms[t]! > rowMax2) rowMax2 = ms[t]!;
    act.rowMax2[r] = rowMax2;
  }
  if (rowMax2 <= abs2) return false;
  const bound2 = tau2 * rowMax2;
  let found = false;
  for (let t = 0; t < cs.length; t++) {
    const m2 = ms[t]!;
    if (m2 <= abs2 || m2 < bound2) continue;
    found = true;
    const c = cs[t]!;
    const cost = (cnt - 1) * (act.colRows[c]!.length - 1);
    const ratio = m2 / rowMax2;
    if (cost < best.cost || (cost === best.cost && ratio > best.ratio)) {
      best.cost = cost;
      best.r = r;
      best.c = c;
      best.ratio = ratio;
    }
  }
  return found;
}

/**
 * Eliminate column `pivot.c` from row i: l = a_ic / a_rc, then row i −= l·(pivot row), an entry
 * created wherever the pivot row has one and row i has none (structural fill, even when it is
 * numerically zero). `pos` is −1 everywhere before and after.
 */
function updateRow(act: Active, i: number, pivot: Pivot, pos: Int32Array): void {
  const cs = act.cols[i]!;
  const rs = act.re[i]!;
  const is = act.im[i]!;
  const ms = act.m2[i]!;
  const ic = cs.indexOf(pivot.c);
  const aicRe = rs[ic]!;
  const aicIm = is[ic]!;
  const { pivRe, pivIm, den } = pivot;
  const lr = (aicRe * pivRe + aicIm * pivIm) / den;
  const li = (aicIm * pivRe - aicRe * pivIm) / den;
  cs.splice(ic, 1);
  rs.splice(ic, 1);
  is.splice(ic, 1);
  ms.splice(ic, 1);
  for (let t = 0; t < cs.length; t++) pos[cs[t]!] = t;
  const u = pivot.cols;
  const uRe = pivot.re;
  const uIm = pivot.im;
  for (let t = 0; t < u.length; t++) {
    const j = u[t]!;
    const dr = lr * uRe[t]! - li * uIm[t]!;
    const di = lr * uIm[t]! + li * uRe[t]!;
    const q = pos[j]!;
    if (q >= 0) {
      const xr = rs[q]! - dr;
      const xi = is[q]! - di;
      rs[q] = xr;
      is[q] = xi;
      ms[q] = xr * xr + xi * xi;
    } else {
      cs.push(j);
      rs.push(-dr);
      is.push(-di);
      ms.push(dr * dr + di * di);
      act.colRows[j]!.push(i);
    }
  }
  for (let t = 0; t < cs.length; t++) pos[cs[t]!] = -1;
  act.changed(i);
}

/** U's row of one step as pivot steps (colPos of its columns), ascending, into out from `at`. */
function sortedSteps(cols: number[], colPos: Int32Array, out: Int32Array, at: number): void {
  // Insertion sort: a row of U has a handful of entries.
  for (let t = 0; t < cols.length; t++) {
    const v = colPos[cols[t]!]!;
    let k = at + t;
    while (k > at && out[k - 1]! > v) {
      out[k] = out[k - 1]!;
      k--;
    }
    out[k] = v;
  }
}
