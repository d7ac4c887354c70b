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
  /** rowPos[i] = step at which original row i is pivoted (inverse of rowPerm). */
  rowPos: Int32Array;
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
  /**
   * Stop the search at rows that cannot beat or tie the best pivot found (default true; the same
   * pivots either way — false is the plain search, which tests compare it with).
   */
  prune?: boolean;
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
 * and run once per sweep — usually before the JIT has seen it. So the active matrix lives in a
 * few typed arrays allocated once (no array per row or column, nothing to collect), the per-step
 * work is in small functions (the row search, the row update, the buckets) that the engine
 * optimizes after a few hundred steps, and each entry's squared magnitude is kept beside it (and
 * each row's largest) instead of being recomputed every time the search passes the row.
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
  // L's pattern as (row, step) pairs in the order of elimination, U's rows as columns per step.
  const lRow: number[] = [];
  const lStep: number[] = [];
  const uStart = new Int32Array(n + 1);
  let uCols = new Int32Array(Math.max(16, a.colIdx.length));
  const rowDone = new Uint8Array(n);
  const colDone = new Uint8Array(n);
  // Position of column j in the row being updated (−1 elsewhere).
  const pos = new Int32Array(n).fill(-1);
  // The tests squared (see `scanRow`).
  const abs2 = opt.absTolerance * opt.absTolerance;
  const tau2 = opt.pivotThreshold * opt.pivotThreshold;
  const best: Best = { r: -1, c: -1, cost: 0, ratio: 0 };

  for (let step = 0; step < n; step++) {
    searchPivot(act, opt.searchRows, abs2, tau2, best, opt.prune !== false);
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
    // U's row of this step: the pivot row's other columns, in the row's order.
    const p0 = act.rowStart[r]!;
    const p1 = p0 + act.rowLen[r]!;
    let at = p0;
    while (act.col[at] !== c) at++;
    const u0 = uStart[step]!;
    if (u0 + (p1 - p0) > uCols.length) uCols = grow(uCols, u0 + (p1 - p0));
    let u1 = u0;
    for (let p = p0; p < p1; p++) if (p !== at) uCols[u1++] = act.col[p]!;
    uStart[step + 1] = u1;
    // Every other row with an entry in column c: l = a_ic / a_rc, row −= l·(pivot row).
    const cs0 = act.colStart[c]!;
    const cs1 = cs0 + act.colLen[c]!;
    for (let e = cs0; e < cs1; e++) {
      const i = act.colRow[e]!;
      if (i === r) continue;
      lRow.push(i);
      lStep.push(step);
      updateRow(act, i, r, at, pos);
    }
    act.retire(r, c, at);
  }

  const colPos = new Int32Array(n);
  for (let k = 0; k < n; k++) colPos[colPerm[k]!] = k;
  const rowPos = new Int32Array(n);
  for (let k = 0; k < n; k++) rowPos[rowPerm[k]!] = k;
  // L's rows by a counting sort on the step each row was pivoted at: within a row the steps come
  // in the order they happened, ascending.
  const lPtr = new Int32Array(n + 1);
  for (let q = 0; q < lRow.length; q++) lPtr[rowPos[lRow[q]!]! + 1]!++;
  for (let k = 0; k < n; k++) lPtr[k + 1] = lPtr[k + 1]! + lPtr[k]!;
  const lIdx = new Int32Array(lRow.length);
  const fill = lPtr.slice(0, n);
  for (let q = 0; q < lRow.length; q++) lIdx[fill[rowPos[lRow[q]!]!]!++] = lStep[q]!;
  const uPtr = new Int32Array(n + 1);
  const uIdx = new Int32Array(uStart[n]!);
  for (let k = 0; k < n; k++) {
    uPtr[k + 1] = uStart[k + 1]!;
    sortedSteps(uCols, uStart[k]!, uStart[k + 1]!, colPos, uIdx);
  }
  const symbolic: Symbolic = { n, rowPerm, colPerm, colPos, rowPos, lPtr, lIdx, uPtr, uIdx };
  return { ok: true, symbolic };
}

/** The search's best pivot so far (one object for the whole ordering). */
interface Best {
  r: number;
  c: number;
  cost: number;
  ratio: number;
}

/** A typed array with at least `size` places, the old contents first. */
function grow<T extends Int32Array | Float64Array>(old: T, size: number): T {
  const bigger = new (old.constructor as new (length: number) => T)(Math.max(size, 2 * old.length));
  bigger.set(old);
  return bigger;
}

/**
 * The active matrix, in typed arrays allocated once: row i's entries are the places
 * rowStart[i] … rowStart[i] + rowLen[i] − 1 of col/re/im/m2 (column, value, squared magnitude),
 * with room up to rowCap[i]; column j's rows are the places colStart[j] … + colLen[j] − 1 of
 * colRow. A row or column that outgrows its room moves to the end of its pool with twice the room
 * (the pools grow by doubling). Every list keeps insertion order with order-preserving deletion,
 * so the search visits rows and entries in a fixed order. Rows sit in buckets by count (doubly
 * linked lists appended at the tail: a row moved to a bucket goes last), so the sparsest are
 * searched first.
 */
class Active {
  col: Int32Array;
  re: Float64Array;
  im: Float64Array;
  m2: Float64Array;
  /** First unused place of the entry pool. */
  top: number;
  readonly rowStart: Int32Array;
  readonly rowLen: Int32Array;
  readonly rowCap: Int32Array;
  colRow: Int32Array;
  colTop: number;
  readonly colStart: Int32Array;
  readonly colLen: Int32Array;
  readonly colCap: Int32Array;
  /** Largest squared magnitude of each row, −1 when the row changed since it was computed. */
  readonly rowMax2: Float64Array;
  readonly head: Int32Array;
  readonly tail: Int32Array;
  readonly next: Int32Array;
  readonly prev: Int32Array;
  readonly count: Int32Array;
  maxCount = 0;
  /**
   * How many columns hold exactly one active entry. While none does, every candidate of a row with
   * cnt entries costs at least cnt − 1 (each column has two or more), which lets the search stop
   * before rows that cannot beat or tie the best found.
   */
  singleCols = 0;

  constructor(a: SparseComplexMatrix, re: Float64Array, im: Float64Array) {
    const n = a.n;
    const nnz = a.colIdx.length;
    // Room for a few fill entries per row and column before one has to move.
    const room = 4;
    this.col = new Int32Array(2 * (nnz + room * n));
    this.re = new Float64Array(this.col.length);
    this.im = new Float64Array(this.col.length);
    this.m2 = new Float64Array(this.col.length);
    this.rowStart = new Int32Array(n);
    this.rowLen = new Int32Array(n);
    this.rowCap = new Int32Array(n);
    let top = 0;
    const perCol = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const p0 = a.rowPtr[i]!;
      const p1 = a.rowPtr[i + 1]!;
      this.rowStart[i] = top;
      this.rowLen[i] = p1 - p0;
      this.rowCap[i] = p1 - p0 + room;
      for (let p = p0; p < p1; p++) {
        const t = top + p - p0;
        const x = re[p]!;
        const y = im[p]!;
        this.col[t] = a.colIdx[p]!;
        this.re[t] = x;
        this.im[t] = y;
        this.m2[t] = x * x + y * y;
        perCol[a.colIdx[p]!]!++;
      }
      top += p1 - p0 + room;
    }
    this.top = top;
    this.colRow = new Int32Array(2 * (nnz + room * n));
    this.colStart = new Int32Array(n);
    this.colLen = new Int32Array(n);
    this.colCap = new Int32Array(n);
    let ct = 0;
    for (let j = 0; j < n; j++) {
      this.colStart[j] = ct;
      this.colCap[j] = perCol[j]! + room;
      ct += perCol[j]! + room;
    }
    this.colTop = ct;
    for (let i = 0; i < n; i++) {
      for (let p = a.rowPtr[i]!; p < a.rowPtr[i + 1]!; p++) {
        const j = a.colIdx[p]!;
        this.colRow[this.colStart[j]! + this.colLen[j]!++] = i;
      }
    }
    for (let j = 0; j < n; j++) if (this.colLen[j] === 1) this.singleCols++;
    this.rowMax2 = new Float64Array(n).fill(-1);
    this.head = new Int32Array(n + 1).fill(-1);
    this.tail = new Int32Array(n + 1).fill(-1);
    this.next = new Int32Array(n).fill(-1);
    this.prev = new Int32Array(n).fill(-1);
    this.count = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      const cnt = this.rowLen[i]!;
      this.link(i, cnt);
      if (cnt > this.maxCount) this.maxCount = cnt;
    }
  }

  /** Append an entry (column j, value x + iy) to row i, moving the row if it is full. */
  pushEntry(i: number, j: number, x: number, y: number): void {
    if (this.rowLen[i] === this.rowCap[i]) this.moveRow(i);
    const t = this.rowStart[i]! + this.rowLen[i]!++;
    this.col[t] = j;
    this.re[t] = x;
    this.im[t] = y;
    this.m2[t] = x * x + y * y;
  }

  /** Row i to the end of the pool with twice its room. */
  private moveRow(i: number): void {
    const len = this.rowLen[i]!;
    const cap = 2 * this.rowCap[i]! + 4;
    if (this.top + cap > this.col.length) {
      const size = this.top + cap;
      this.col = grow(this.col, size);
      this.re = grow(this.re, size);
      this.im = grow(this.im, size);
      this.m2 = grow(this.m2, size);
    }
    const from = this.rowStart[i]!;
    this.col.copyWithin(this.top, from, from + len);
    this.re.copyWithin(this.top, from, from + len);
    this.im.copyWithin(this.top, from, from + len);
    this.m2.copyWithin(this.top, from, from + len);
    this.rowStart[i] = this.top;
    this.rowCap[i] = cap;
    this.top += cap;
  }

  /** Remove the entry at place t of row i, keeping the order of the rest. */
  removeEntry(i: number, t: number): void {
    const end = this.rowStart[i]! + this.rowLen[i]! - 1;
    for (let p = t; p < end; p++) {
      this.col[p] = this.col[p + 1]!;
      this.re[p] = this.re[p + 1]!;
      this.im[p] = this.im[p + 1]!;
      this.m2[p] = this.m2[p + 1]!;
    }
    this.rowLen[i]!--;
  }

  /** Append row i to column j's list, moving the list if it is full. */
  pushColRow(j: number, i: number): void {
    if (this.colLen[j] === 1) this.singleCols--;
    else if (this.colLen[j] === 0) this.singleCols++;
    if (this.colLen[j] === this.colCap[j]) {
      const len = this.colLen[j]!;
      const cap = 2 * this.colCap[j]! + 4;
      if (this.colTop + cap > this.colRow.length) this.colRow = grow(this.colRow, this.colTop + cap);
      const from = this.colStart[j]!;
      this.colRow.copyWithin(this.colTop, from, from + len);
      this.colStart[j] = this.colTop;
      this.colCap[j] = cap;
      this.colTop += cap;
    }
    this.colRow[this.colStart[j]! + this.colLen[j]!++] = i;
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
    const size = this.rowLen[i]!;
    if (size > this.maxCount) this.maxCount = size;
    this.rowMax2[i] = -1;
    this.unlink(i);
    this.link(i, size);
  }

  /**
   * Row r was pivoted on column c (entry place `at`): r leaves the buckets, and the columns of
   * U's row forget r.
   */
  retire(r: number, c: number, at: number): void {
    const p0 = this.rowStart[r]!;
    const p1 = p0 + this.rowLen[r]!;
    for (let p = p0; p < p1; p++) {
      if (p === at) continue;
      const j = this.col[p]!;
      const s0 = this.colStart[j]!;
      const s1 = s0 + this.colLen[j]!;
      let e = s0;
      while (e < s1 && this.colRow[e] !== r) e++;
      if (e === s1) continue;
      for (; e < s1 - 1; e++) this.colRow[e] = this.colRow[e + 1]!;
      const len = --this.colLen[j]!;
      if (len === 1) this.singleCols++;
      else if (len === 0) this.singleCols--;
    }
    if (this.colLen[c] === 1) this.singleCols--;
    this.colLen[c] = 0;
    this.unlink(r);
    this.rowLen[r] = 0;
  }
}

/**
 * The pivot of the next step into `best` (best.r = −1 when no entry passes): the sparsest rows
 * first, `searchRows` rows that have a candidate, the least Markowitz cost, ties to the larger
 * |a_rc| / max_j |a_rj|. With `prune`, rows of cnt entries are not visited once cnt − 1 exceeds the
 * best cost while no column has a single entry (they cost at least cnt − 1): the same pivot, and on
 * a chain of sections half the rows scanned (the 1 000-section ladder's ordering 7.8 → 5.7 ms in a
 * fresh process).
 */
function searchPivot(
  act: Active,
  searchRows: number,
  abs2: number,
  tau2: number,
  best: Best,
  prune: boolean,
): void {
  best.r = -1;
  best.c = -1;
  best.cost = Number.POSITIVE_INFINITY;
  best.ratio = 0;
  let searched = 0;
  const { head, next } = act;
  for (let cnt = 1; cnt <= act.maxCount && searched < searchRows && best.cost > 0; cnt++) {
    // No row from here on can beat or tie the best: each costs at least cnt − 1 (no single columns).
    if (prune && act.singleCols === 0 && cnt - 1 > best.cost) break;
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
  const p0 = act.rowStart[r]!;
  const p1 = p0 + act.rowLen[r]!;
  const ms = act.m2;
  let rowMax2 = act.rowMax2[r]!;
  if (rowMax2 < 0) {
    rowMax2 = 0;
    for (let p = p0; p < p1; p++) if (ms[p]! > rowMax2) rowMax2 = ms[p]!;
    act.rowMax2[r] = rowMax2;
  }
  if (rowMax2 <= abs2) return false;
  const bound2 = tau2 * rowMax2;
  let found = false;
  for (let p = p0; p < p1; p++) {
    const m2 = ms[p]!;
    if (m2 <= abs2 || m2 < bound2) continue;
    found = true;
    const c = act.col[p]!;
    const cost = (cnt - 1) * (act.colLen[c]! - 1);
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
 * Eliminate the pivot's column from row i: l = a_ic / a_rc, then row i −= l·(pivot row r, its
 * pivot at entry place `at`), an entry created wherever the pivot row has one and row i has none
 * (structural fill, even when it is numerically zero). `pos` is −1 everywhere before and after.
 */
function updateRow(act: Active, i: number, r: number, at: number, pos: Int32Array): void {
  const c = act.col[at]!;
  let ic = act.rowStart[i]!;
  while (act.col[ic] !== c) ic++;
  const aicRe = act.re[ic]!;
  const aicIm = act.im[ic]!;
  const pivRe = act.re[at]!;
  const pivIm = act.im[at]!;
  const den = pivRe * pivRe + pivIm * pivIm;
  const lr = (aicRe * pivRe + aicIm * pivIm) / den;
  const li = (aicIm * pivRe - aicRe * pivIm) / den;
  act.removeEntry(i, ic);
  const q0 = act.rowStart[i]!;
  for (let q = 0; q < act.rowLen[i]!; q++) pos[act.col[q0 + q]!] = q;
  // The pivot row's places stay put while row i changes (only row i may move in the pool).
  const p0 = act.rowStart[r]!;
  const p1 = p0 + act.rowLen[r]!;
  for (let p = p0; p < p1; p++) {
    if (p === at) continue;
    const j = act.col[p]!;
    const ur = act.re[p]!;
    const ui = act.im[p]!;
    const dr = lr * ur - li * ui;
    const di = lr * ui + li * ur;
    const q = pos[j]!;
    if (q >= 0) {
      const t = act.rowStart[i]! + q;
      const xr = act.re[t]! - dr;
      const xi = act.im[t]! - di;
      act.re[t] = xr;
      act.im[t] = xi;
      act.m2[t] = xr * xr + xi * xi;
    } else {
      act.pushEntry(i, j, -dr, -di);
      act.pushColRow(j, i);
    }
  }
  const t0 = act.rowStart[i]!;
  for (let q = 0; q < act.rowLen[i]!; q++) pos[act.col[t0 + q]!] = -1;
  act.changed(i);
}

/** U's row of one step (columns cols[from…to)) as pivot steps, ascending, into out[from…to). */
function sortedSteps(cols: Int32Array, from: number, to: number, colPos: Int32Array, out: Int32Array): void {
  // Insertion sort: a row of U has a handful of entries.
  for (let t = from; t < to; t++) {
    const v = colPos[cols[t]!]!;
    let k = t;
    while (k > from && out[k - 1]! > v) {
      out[k] = out[k - 1]!;
      k--;
    }
    out[k] = v;
  }
}
