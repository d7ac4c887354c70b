import type { Symbolic } from "./markowitz";
import type { PencilMaxima } from "./pencil-maxima";
import type { SparseComplexMatrix } from "./sparse-matrix";

/** Most update slots a plan records (4 bytes each); an order needing more factors by scatter. */
const PLAN_LIMIT = 1 << 22;

/**
 * Where each number of a refactor goes, for one pivot order (the factors live in one array:
 * L's entries at 0…, U's at nnz(L)…, the pivots at nnz(L)+nnz(U)…):
 *  - src[slot]: the entry of A (CSR position) that starts the slot, or −1 for fill;
 *  - upd[updStart[q] + i]: the slot that the i-th entry of U's row j (j = lIdx[q]) updates when
 *    L's entry q (row k, column j) eliminates it, i.e. the slot of (k, uIdx[uPtr[j] + i]).
 * With them a refactor needs no scatter vector: each product lands directly on its slot.
 * `aPos` (A's entry → pivot column) serves the scatter fallback when `upd` would exceed PLAN_LIMIT.
 */
export interface Plan {
  aPos: Int32Array;
  src: Int32Array;
  /** The pencil's terms in this order (step k's column, then its row), for `pencilTests`. */
  pencil: PencilMaxima | null;
  pencilOf: PencilMaxima | null;
  updStart: Int32Array;
  upd: Int32Array | null;
  /**
   * G's entries in the slots (0 at fill) of the pencil `pencilOf` (plans with `upd` only), laid out
   * as the factors (`LUFactors.fac`: real parts at 2t, the imaginary parts 0), so a copy loads them.
   */
  slotG: Float64Array | null;
  /** The slots where that pencil's C is not zero, and C there (most slots have none: fill, G only). */
  cSlots: Int32Array | null;
  cValues: Float64Array | null;
}

export function makePlan(a: SparseComplexMatrix, s: Symbolic): Plan {
  const { n, rowPtr, colIdx } = a;
  const { rowPerm, colPos, lPtr, lIdx, uPtr, uIdx } = s;
  const offU = lIdx.length;
  const offD = offU + uIdx.length;
  const aPos = new Int32Array(colIdx.length);
  for (let p = 0; p < colIdx.length; p++) aPos[p] = colPos[colIdx[p]!]!;
  const src = new Int32Array(offD + n).fill(-1);
  const updStart = new Int32Array(lIdx.length + 1);
  let total = 0;
  for (let q = 0; q < lIdx.length; q++) {
    const j = lIdx[q]!;
    total += uPtr[j + 1]! - uPtr[j]!;
    updStart[q + 1] = total;
  }
  const upd = total <= PLAN_LIMIT ? new Int32Array(total) : null;
  // slot[c] = the slot of (k, c) in the row k being planned (−1 outside its pattern).
  const slot = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    for (let q = lPtr[k]!; q < lPtr[k + 1]!; q++) slot[lIdx[q]!] = q;
    for (let t = uPtr[k]!; t < uPtr[k + 1]!; t++) slot[uIdx[t]!] = offU + t;
    slot[k] = offD + k;
    const r = rowPerm[k]!;
    for (let p = rowPtr[r]!; p < rowPtr[r + 1]!; p++) src[slot[aPos[p]!]!] = p;
    if (upd) {
      for (let q = lPtr[k]!; q < lPtr[k + 1]!; q++) {
        const j = lIdx[q]!;
        let m = updStart[q]!;
        for (let t = uPtr[j]!; t < uPtr[j + 1]!; t++) upd[m++] = slot[uIdx[t]!]!;
      }
    }
    for (let q = lPtr[k]!; q < lPtr[k + 1]!; q++) slot[lIdx[q]!] = -1;
    for (let t = uPtr[k]!; t < uPtr[k + 1]!; t++) slot[uIdx[t]!] = -1;
    slot[k] = -1;
  }
  return {
    aPos,
    src,
    updStart,
    upd,
    pencil: null,
    pencilOf: null,
    slotG: null,
    cSlots: null,
    cValues: null,
  };
}

/**
 * Bind the plan to a pencil G + s·C (G, C in A's CSR order): its maxima terms in this order, and
 * (with update slots) G and C laid out in the factors' slots, so a refactor loads them by copying.
 */
export function planPencil(
  plan: Plan,
  pen: PencilMaxima & { g: Float64Array; c: Float64Array },
  inOrder: PencilMaxima,
): void {
  plan.pencil = inOrder;
  plan.pencilOf = pen;
  plan.slotG = null;
  plan.cSlots = null;
  plan.cValues = null;
  if (!plan.upd) return;
  const { g, c } = pen;
  const { src } = plan;
  const sg = new Float64Array(2 * src.length);
  let count = 0;
  for (let t = 0; t < src.length; t++) {
    const p = src[t]!;
    if (p < 0) continue;
    sg[2 * t] = g[p]!;
    if (c[p] !== 0) count++;
  }
  plan.slotG = sg;
  const cSlots = new Int32Array(count);
  const cValues = new Float64Array(count);
  count = 0;
  for (let t = 0; t < src.length; t++) {
    const p = src[t]!;
    if (p < 0 || c[p] === 0) continue;
    cSlots[count] = t;
    cValues[count++] = c[p]!;
  }
  plan.cSlots = cSlots;
  plan.cValues = cValues;
}
