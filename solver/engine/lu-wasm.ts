/**
 * The sparse LU's inner loops as WebAssembly (lu-kernels.wat), and the memories they work in.
 *
 * Why: the command solves a netlist in a fresh process, where JavaScript runs interpreted until
 * the optimizing compiler has taken up each kernel — a first sweep's first ~35 points ran 10–25×
 * slower than the rest. WebAssembly is compiled before its first call (a baseline compile, the
 * optimized one in the background), so the kernels run near speed from the first point. The
 * arithmetic is the TypeScript's, in the same order: the same numbers bit for bit (IEEE doubles;
 * WebAssembly has no fused multiply-add; tests/solver/lu-wasm.test.ts).
 *
 * Each pivot order gets a `KernelSpace`: one WebAssembly memory holding the order's pattern and
 * plan (copied once), the staged pencil, and the factors, reciprocals and scratch that `LUFactors`
 * then uses as its own arrays (views of that memory), so the TypeScript around the kernels reads
 * the factors in place. A memory is sized once and never grows (growing would detach the views).
 */
import { LU_KERNELS_WASM } from "./lu-kernels-wasm";
import type { Symbolic } from "./markowitz";
import type { PencilMaxima } from "./pencil-maxima";
import type { Plan } from "./sparse-lu-plan";

/** The per-point entries take the header's offset (`HEADER`) and their own values only. */
type Eliminate = (h: number, tol2: number, half: number, fwd: number) => number;
type FactorPencil = (h: number, omega: number, tol2: number, half: number, fwd: number) => number;
type Solve = (h: number, nsteps: number, steps: number, xRe: number, xIm: number) => number;
type Derive = (
  h: number,
  vRe: number,
  vIm: number,
  nsteps: number,
  steps: number,
  xRe: number,
  xIm: number,
) => number;
type Adjoint = (h: number, first: number) => void;

type PencilTests = (
  n: number,
  single: number,
  rowPtr: number,
  rowG: number,
  rowC: number,
  colPtr: number,
  colG: number,
  colC: number,
  w: number,
  cm: number,
  rm: number,
) => void;

/** A sparse real matrix in CSR (the C of the pencil, for dx/ds). */
export interface RealCsr {
  ptr: Int32Array;
  idx: Int32Array;
  val: Float64Array;
}

let compiled: WebAssembly.Module | null = null;

/** The kernels' module, compiled once per process (synchronously: it is a few kilobytes). */
function kernelModule(): WebAssembly.Module {
  if (!compiled) {
    const text = atob(LU_KERNELS_WASM);
    const bytes = new Uint8Array(text.length);
    for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
    compiled = new WebAssembly.Module(bytes);
  }
  return compiled;
}

/** The kernels bound to a memory of `bytes` bytes or more (never grown). */
export function kernelsIn(bytes: number): { memory: WebAssembly.Memory; exports: WebAssembly.Exports } {
  const memory = new WebAssembly.Memory({ initial: Math.max(1, Math.ceil(bytes / PAGE)) });
  const instance = new WebAssembly.Instance(kernelModule(), { env: { memory } });
  return { memory, exports: instance.exports };
}

/** Byte offsets in a memory, handed out in order: `take(bytes)`; `size` is the total so far. */
export class Layout {
  size = 0;
  take(bytes: number): number {
    const at = this.size;
    this.size += bytes;
    return at;
  }
}

/**
 * The header at the start of each order's memory: the byte offset of every array the per-point
 * entries use, as i32 at these byte offsets (the same table is at the end of lu-kernels.wat).
 */
const HEADER = {
  n: 0,
  lPtr: 4,
  lIdx: 8,
  uPtr: 12,
  uIdx: 16,
  rowPerm: 20,
  updStart: 24,
  upd: 28,
  fac: 32,
  inv: 36,
  w: 40,
  cm: 44,
  rm: 48,
  bRe: 52,
  bIm: 56,
  offU: 60,
  offD: 64,
  colPerm: 68,
  facU: 72,
  mPtr: 76,
  mIdx: 80,
  mVal: 84,
  slotG: 88,
  cSlots: 92,
  cValues: 96,
  cCount: 100,
  single: 104,
  rowPtr: 108,
  rowG: 112,
  rowC: 116,
  colPtr: 120,
  colG: 124,
  colC: 128,
  slotBytes: 132,
} as const;

/** The header's size in bytes (a multiple of 8, so the Float64 arrays after it stay aligned). */
const HEADER_BYTES = 136;

/** Byte offsets of an order's arrays in its memory. */
interface Offsets {
  fac: number;
  inv: number;
  w: number;
  cm: number;
  rm: number;
  bRe: number;
  bIm: number;
  xRe: number;
  xIm: number;
  vRe: number;
  vIm: number;
  outputs: number;
  mVal: number;
  slotG: number;
  cValues: number;
  rowG: number;
  rowC: number;
  colG: number;
  colC: number;
  lPtr: number;
  lIdx: number;
  uPtr: number;
  uIdx: number;
  rowPerm: number;
  updStart: number;
  upd: number;
  colPerm: number;
  descending: number;
  steps: number;
  mPtr: number;
  mIdx: number;
  cSlots: number;
  rowPtr: number;
  colPtr: number;
}

const PAGE = 65536;

/**
 * dst[0…src.length) = src: `set` (a memory copy) for long vectors, an index loop for short ones,
 * where `set`'s fixed cost is most of a small circuit's per-point work (a Monte Carlo sample).
 */
function copy(dst: Float64Array, src: Float64Array): void {
  if (src.length > 32) {
    dst.set(src);
    return;
  }
  for (let i = 0; i < src.length; i++) dst[i] = src[i]!;
}

/** How many n-vectors each memory keeps for a caller's solutions (`KernelSpace.outputArrays`). */
const OUTPUTS = 8;

/** One pivot order's memory and kernels (see the module comment). */
export class KernelSpace {
  /** The factors (as `LUFactors.fac`), the pivots' reciprocals and the scratch: views of the memory. */
  readonly fac: Float64Array;
  readonly inv: Float64Array;
  readonly w: Float64Array;
  private readonly cm: Float64Array;
  private readonly rm: Float64Array;
  private readonly bRe: Float64Array;
  private readonly bIm: Float64Array;
  private readonly xRe: Float64Array;
  private readonly xIm: Float64Array;
  private readonly vRe: Float64Array;
  private readonly vIm: Float64Array;
  /** Q: the unknown of each step. */
  private readonly colPerm: Int32Array;
  /** The memory's buffer, read once (the memory never grows, and the getter is not free). */
  private readonly buffer: ArrayBuffer;
  private readonly at: Offsets;
  private readonly n: number;
  private readonly offU: number;
  private readonly offD: number;
  private readonly runEliminate: Eliminate;
  private readonly runFactorPencil: FactorPencil;
  private readonly runSolve: Solve;
  private readonly runDerive: Derive;
  private readonly runAdjoint: Adjoint;
  /** The header as i32 (`HEADER`: a field's index is its byte offset / 4). */
  private readonly header: Int32Array;
  /** The plan pencil staged (`Plan.pencilOf`), how many C slots it has, and whether it is `single`. */
  private pencilOf: PencilMaxima | null = null;
  /** The step list staged at `at.steps` (besides the whole pass at `at.descending`), and the M at `at.mPtr`. */
  private stepsOf: Int32Array | null = null;
  private mOf: RealCsr | null = null;

  /**
   * The space of order s for a matrix with `nnz` entries; `upd` is the plan's update slots (null
   * when the order factors by scatter: the space then serves the solves only).
   */
  constructor(n: number, nnz: number, s: Symbolic, updStart: Int32Array, upd: Int32Array | null) {
    this.n = n;
    this.offU = s.lIdx.length;
    this.offD = this.offU + s.uIdx.length;
    const slots = this.offD + n;
    // A pencil is staged only for an order with a plan (a scatter order refactors in TypeScript).
    const staged = upd ? slots : 0;
    // Float64 arrays first (8-byte aligned from 0), then the Int32 arrays.
    const l = new Layout();
    l.take(HEADER_BYTES);
    const f64 = (count: number) => l.take(8 * count);
    const i32 = (count: number) => l.take(4 * count);
    const at: Offsets = {
      fac: f64(2 * slots),
      inv: f64(2 * n),
      w: f64(2 * n + 2),
      cm: f64(n),
      rm: f64(n),
      bRe: f64(n),
      bIm: f64(n),
      xRe: f64(n),
      xIm: f64(n),
      vRe: f64(n),
      vIm: f64(n),
      outputs: f64(OUTPUTS * n),
      mVal: f64(nnz),
      slotG: f64(2 * staged),
      cValues: f64(staged),
      rowG: f64(nnz),
      rowC: f64(nnz),
      colG: f64(nnz),
      colC: f64(nnz),
      lPtr: i32(n + 1),
      lIdx: i32(s.lIdx.length),
      uPtr: i32(n + 1),
      uIdx: i32(s.uIdx.length),
      rowPerm: i32(n),
      updStart: i32(updStart.length),
      upd: i32(upd?.length ?? 0),
      colPerm: i32(n),
      descending: i32(n),
      steps: i32(n),
      mPtr: i32(n + 1),
      mIdx: i32(nnz),
      cSlots: i32(staged),
      rowPtr: i32(n + 1),
      colPtr: i32(n + 1),
    };
    this.at = at;
    const { memory, exports } = kernelsIn(l.size);
    this.buffer = memory.buffer;
    this.runEliminate = exports.eliminate as Eliminate;
    this.runFactorPencil = exports.factorPencil as FactorPencil;
    this.runSolve = exports.solve as Solve;
    this.runDerive = exports.derive as Derive;
    this.runAdjoint = exports.adjoint as Adjoint;
    const buf = memory.buffer;
    this.fac = new Float64Array(buf, at.fac, 2 * slots);
    this.inv = new Float64Array(buf, at.inv, 2 * n);
    this.w = new Float64Array(buf, at.w, 2 * n + 2);
    this.cm = new Float64Array(buf, at.cm, n);
    this.rm = new Float64Array(buf, at.rm, n);
    this.tests = { cm: this.cm, rm: this.rm };
    this.bRe = new Float64Array(buf, at.bRe, n);
    this.bIm = new Float64Array(buf, at.bIm, n);
    this.xRe = new Float64Array(buf, at.xRe, n);
    this.xIm = new Float64Array(buf, at.xIm, n);
    this.vRe = new Float64Array(buf, at.vRe, n);
    this.vIm = new Float64Array(buf, at.vIm, n);
    new Int32Array(buf, at.lPtr, n + 1).set(s.lPtr);
    new Int32Array(buf, at.lIdx, s.lIdx.length).set(s.lIdx);
    new Int32Array(buf, at.uPtr, n + 1).set(s.uPtr);
    new Int32Array(buf, at.uIdx, s.uIdx.length).set(s.uIdx);
    new Int32Array(buf, at.rowPerm, n).set(s.rowPerm);
    new Int32Array(buf, at.updStart, updStart.length).set(updStart);
    if (upd) new Int32Array(buf, at.upd, upd.length).set(upd);
    this.colPerm = s.colPerm;
    new Int32Array(buf, at.colPerm, n).set(s.colPerm);
    const descending = new Int32Array(buf, at.descending, n);
    for (let k = 0; k < n; k++) descending[k] = n - 1 - k;
    this.header = new Int32Array(buf, 0, HEADER_BYTES / 4);
    // Every header field from the offsets of the same name, or from the order's sizes (the staged
    // pencil's count and kind come with it, `stagePencil`).
    const values: Partial<Record<keyof typeof HEADER, number>> = {
      ...at,
      n,
      offU: this.offU,
      offD: this.offD,
      facU: at.fac + 16 * this.offU,
      slotBytes: 16 * slots,
    };
    for (const [field, byte] of Object.entries(HEADER) as [keyof typeof HEADER, number][]) {
      this.header[byte / 4] = values[field] ?? 0;
    }
  }

  /**
   * The elimination over every slot of `fac` (loaded with A's entries), with the pivot tests cm/rm
   * (`PivotTests`, in pivot order), tol2 = absTol², half = τ²/2, and with b the forward
   * substitution into w (see `eliminate` in sparse-lu-numeric.ts). The step whose pivot failed, or −1.
   */
  eliminate(
    cm: Float64Array,
    rm: Float64Array,
    tol2: number,
    half: number,
    bRe: Float64Array | null,
    bIm: Float64Array | null,
  ): number {
    copy(this.cm, cm);
    copy(this.rm, rm);
    return this.runEliminate(0, tol2, half, this.stageB(bRe, bIm));
  }

  /** b into the memory for a forward pass; 1 when there is one. */
  private stageB(bRe: Float64Array | null, bIm: Float64Array | null): number {
    if (bRe === null || bIm === null) return 0;
    copy(this.bRe, bRe);
    copy(this.bIm, bIm);
    return 1;
  }

  /** True when a lies in this memory (a vector of `outputArrays`). */
  private holds(a: Float64Array): boolean {
    return a.buffer === this.buffer;
  }

  /**
   * Eight n-vectors in this memory, for a caller's solutions and derivatives (`AcSolver`'s x, dx/ds
   * and those of a second right-hand side): a solve into them writes in place, and dx/ds reads x
   * there, with no copy in or out. The same arrays on every call.
   */
  outputArrays(): Float64Array[] {
    if (!this.outputs) {
      const { n, buffer } = this;
      this.outputs = Array.from(
        { length: OUTPUTS },
        (_, i) => new Float64Array(buffer, this.at.outputs + 8 * i * n, n),
      );
    }
    return this.outputs;
  }

  private outputs: Float64Array[] | null = null;

  /**
   * Copy a plan's pencil into the memory (its slot image of G, where C is, and the kept terms of
   * `pencilTests`), unless it is the one there already. The plan must have `slotG` (`planPencil`).
   */
  stagePencil(plan: Plan): void {
    const pen = plan.pencil!;
    if (this.pencilOf === plan.pencilOf) return;
    const at = this.at;
    const buf = this.buffer;
    new Float64Array(buf, at.slotG, plan.slotG!.length).set(plan.slotG!);
    new Int32Array(buf, at.cSlots, plan.cSlots!.length).set(plan.cSlots!);
    new Float64Array(buf, at.cValues, plan.cValues!.length).set(plan.cValues!);
    stageTerms(buf, at, pen);
    this.header[HEADER.cCount / 4] = plan.cSlots!.length;
    this.header[HEADER.single / 4] = pen.single ? 1 : 0;
    this.pencilOf = plan.pencilOf;
  }

  /**
   * A refactor at ω ≥ 0 of the staged pencil, in one call: the slots loaded with G and ω·C, the
   * tests' maxima of one Ruiz step at ω, then `eliminate` (tol2 = absTol², half = τ²/2, and b as
   * there). The step whose pivot failed, or −1; the tests used are `tests` (views, for the verdict).
   */
  factorPencil(
    omega: number,
    tol2: number,
    half: number,
    bRe: Float64Array | null,
    bIm: Float64Array | null,
  ): number {
    return this.runFactorPencil(0, omega, tol2, half, this.stageB(bRe, bIm));
  }

  /** The pivot tests `factorPencil` used last (cm, rm in pivot order; views of the memory). */
  readonly tests: { cm: Float64Array; rm: Float64Array };

  /**
   * U·z = y (y in w) over `steps` (descending; null: every step), x = Q·z there; x's other
   * entries are left as they were (see `backward` in sparse-lu-solve.ts). False when some z is not
   * finite. x in this memory (`outputArrays`) is written in place, any other x through the scratch.
   */
  backward(steps: Int32Array | null, xRe: Float64Array, xIm: Float64Array): boolean {
    const [count, stepsAt] = this.stageSteps(steps);
    const direct = this.holds(xRe) && this.holds(xIm);
    const at = this.at;
    const finite = this.runSolve(
      0,
      count,
      stepsAt,
      direct ? xRe.byteOffset : at.xRe,
      direct ? xIm.byteOffset : at.xIm,
    );
    if (!direct) this.copyOut(steps, xRe, xIm);
    return finite === 1;
  }

  /**
   * dx/ds's solve, A·x = −M·v (M real in CSR with A's pattern or less), in one call: L·y = −P·M·v
   * into w (`forwardOfProduct`), then `backward` over `steps`. v and x as in `backward`.
   */
  derive(
    m: RealCsr,
    vRe: Float64Array,
    vIm: Float64Array,
    steps: Int32Array | null,
    xRe: Float64Array,
    xIm: Float64Array,
  ): boolean {
    const at = this.at;
    if (m !== this.mOf) {
      const buf = this.buffer;
      new Int32Array(buf, at.mPtr, m.ptr.length).set(m.ptr);
      new Int32Array(buf, at.mIdx, m.idx.length).set(m.idx);
      new Float64Array(buf, at.mVal, m.val.length).set(m.val);
      this.mOf = m;
    }
    const vIn = this.holds(vRe) && this.holds(vIm);
    if (!vIn) {
      copy(this.vRe, vRe);
      copy(this.vIm, vIm);
    }
    const [count, stepsAt] = this.stageSteps(steps);
    const direct = this.holds(xRe) && this.holds(xIm);
    const finite = this.runDerive(
      0,
      vIn ? vRe.byteOffset : at.vRe,
      vIn ? vIm.byteOffset : at.vIm,
      count,
      stepsAt,
      direct ? xRe.byteOffset : at.xRe,
      direct ? xIm.byteOffset : at.xIm,
    );
    if (!direct) this.copyOut(steps, xRe, xIm);
    return finite === 1;
  }

  /** How many steps and where: the whole pass (staged once), or `steps` staged when new. */
  private stageSteps(steps: Int32Array | null): [number, number] {
    if (steps === null) return [this.n, this.at.descending];
    if (steps !== this.stepsOf) {
      new Int32Array(this.buffer, this.at.steps, steps.length).set(steps);
      this.stepsOf = steps;
    }
    return [steps.length, this.at.steps];
  }

  /** x from the scratch into a caller's arrays: all of it, or only the steps' unknowns. */
  private copyOut(steps: Int32Array | null, xRe: Float64Array, xIm: Float64Array): void {
    if (steps === null) {
      copy(xRe, this.xRe);
      copy(xIm, this.xIm);
      return;
    }
    // Only the steps' unknowns: the others keep what they held.
    const { colPerm } = this;
    for (let i = 0; i < steps.length; i++) {
      const c = colPerm[steps[i]!]!;
      xRe[c] = this.xRe[c]!;
      xIm[c] = this.xIm[c]!;
    }
  }

  /**
   * Aᵀ's two triangular passes in w, which holds Qᵀ·d (zero before step `first`): Uᵀ·y = w
   * forward, then Lᵀ·v = y backward, each skipping the steps whose entry is zero (see
   * `solveFactorsTransposedInSteps`).
   */
  transposed(first: number): void {
    this.runAdjoint(0, first);
  }
}

/** Where a pencil's kept terms go in a memory. */
interface TermOffsets {
  rowPtr: number;
  rowG: number;
  rowC: number;
  colPtr: number;
  colG: number;
  colC: number;
}

function stageTerms(buf: ArrayBufferLike, at: TermOffsets, pen: PencilMaxima): void {
  new Int32Array(buf, at.rowPtr, pen.rowPtr.length).set(pen.rowPtr);
  new Float64Array(buf, at.rowG, pen.rowG.length).set(pen.rowG);
  new Float64Array(buf, at.rowC, pen.rowC.length).set(pen.rowC);
  new Int32Array(buf, at.colPtr, pen.colPtr.length).set(pen.colPtr);
  new Float64Array(buf, at.colG, pen.colG.length).set(pen.colG);
  new Float64Array(buf, at.colC, pen.colC.length).set(pen.colC);
}

/** `pencilTests` at w ≥ 0 over the terms at `at`, into the cm and rm there. */
function testsAt(
  run: PencilTests,
  n: number,
  single: number,
  at: TermOffsets & { cm: number; rm: number },
  w: number,
): void {
  run(n, single, at.rowPtr, at.rowG, at.rowC, at.colPtr, at.colG, at.colC, w, at.cm, at.rm);
}

/** A memory for `pencilTests`, kept for the next call of the same size or smaller. */
let testsScratch: { bytes: number; memory: WebAssembly.Memory; run: PencilTests } | null = null;

/**
 * The maxima at ω = w ≥ 0 of a pencil in pivot order (`pencilInOrder`), as the LU's tests take
 * them: cm[k] = max over column k's kept terms of g + w·c, rm[k] the same over row k's — or 1
 * where that is 0 (no entry) or not finite (the factor of such a row or column stays 1).
 * `pencilTests` in lu-kernels.wat; a sweep's refactor runs it in its order's memory
 * (`KernelSpace.factorPencil`), this entry serves the other callers (a refactor by scatter, ω = ∞).
 */
export function pencilTests(pen: PencilMaxima, w: number, cm: Float64Array, rm: Float64Array): void {
  const n = cm.length;
  const l = new Layout();
  const take = (bytes: number) => l.take(bytes);
  const at = {
    cm: take(8 * n),
    rm: take(8 * n),
    rowG: take(8 * pen.rowG.length),
    rowC: take(8 * pen.rowC.length),
    colG: take(8 * pen.colG.length),
    colC: take(8 * pen.colC.length),
    rowPtr: take(4 * (n + 1)),
    colPtr: take(4 * (n + 1)),
  };
  if (!testsScratch || testsScratch.bytes < l.size) {
    const { memory, exports } = kernelsIn(l.size);
    testsScratch = { bytes: memory.buffer.byteLength, memory, run: exports.pencilTests as PencilTests };
  }
  const buf = testsScratch.memory.buffer;
  stageTerms(buf, at, pen);
  testsAt(testsScratch.run, n, pen.single ? 1 : 0, at, w);
  cm.set(new Float64Array(buf, at.cm, n));
  rm.set(new Float64Array(buf, at.rm, n));
}
