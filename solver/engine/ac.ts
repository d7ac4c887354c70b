import { floatingNodes, voltageLoop } from "./floating";
import { assemble, type MnaSystem } from "./mna";
import { SparseComplexLU } from "./sparse-lu";
import type { SparseRhs } from "./sparse-lu-solve";

/** "1.59155 kHz": a frequency with an SI prefix, 6 significant digits. */
export function formatHz(f: number): string {
  if (f === 0) return "0 Hz";
  const prefixes: [number, string][] = [
    [1e9, "G"],
    [1e6, "M"],
    [1e3, "k"],
    [1, ""],
    [1e-3, "m"],
  ];
  for (const [scale, p] of prefixes) {
    if (Math.abs(f) >= scale) return `${Number((f / scale).toPrecision(6))} ${p}Hz`;
  }
  return `${Number(f.toPrecision(6))} Hz`;
}

/**
 * Solves one MNA system at any frequency, reusing a single sparse LU whose ordering is analysed
 * at the first frequency solved (normally the first point of the sweep) — see SparseComplexLU.
 * After `solveAt(f)` the solution is in xRe/xIm; `derivative()` then fills dxRe/dxIm with
 * dx/ds = −A(s)⁻¹·C·x using the same factors (one extra solve, no refactorization).
 * A system with a second right-hand side (`sys.second`, a loop measured by double injection)
 * gets its solution in x2Re/x2Im (and dx2Re/dx2Im) from the same factors: one more solve each.
 */
export class AcSolver {
  sys: MnaSystem;
  /**
   * The solution and its derivative. From the first solve on they are arrays in the LU's memory
   * (`SparseComplexLU.solutionArrays`), which the solves write in place: read them through the
   * solver each time, not kept from before the first solve.
   */
  xRe: Float64Array;
  xIm: Float64Array;
  dxRe: Float64Array;
  dxIm: Float64Array;
  /** Solution for `sys.second` (zeros when the system has none), and its derivative. */
  x2Re: Float64Array;
  x2Im: Float64Array;
  dx2Re: Float64Array;
  dx2Im: Float64Array;
  private lu: SparseComplexLU | null = null;
  /** The system whose G and C the LU's pencil maxima were computed from (a rebind changes it). */
  private pencilOf: MnaSystem | null = null;
  /** C's nonzeros only, in CSR order (dx/ds multiplies by C; most of A's entries have none). */
  private cRows: Int32Array | null = null;
  private cCols = new Int32Array(0);
  private cVals = new Float64Array(0);
  private cMatrix: { ptr: Int32Array; idx: Int32Array; val: Float64Array } | null = null;
  /** Angular frequency of the last successful solve. */
  omega = 0;

  constructor(sys: MnaSystem) {
    this.sys = sys;
    this.xRe = new Float64Array(sys.n);
    this.xIm = new Float64Array(sys.n);
    this.dxRe = new Float64Array(sys.n);
    this.dxIm = new Float64Array(sys.n);
    this.x2Re = new Float64Array(sys.n);
    this.x2Im = new Float64Array(sys.n);
    this.dx2Re = new Float64Array(sys.n);
    this.dx2Im = new Float64Array(sys.n);
  }

  /**
   * Take a system with new values but the same sparsity pattern (a Monte Carlo sample of the
   * same netlist): the pivot order analysed so far is kept, so the next solves only refactor
   * numbers. Returns false (and changes nothing) when the pattern differs.
   */
  rebind(sys: MnaSystem): boolean {
    const a = this.sys.matrix;
    const b = sys.matrix;
    if (sys.n !== this.sys.n || b.colIdx.length !== a.colIdx.length) return false;
    for (let i = 0; i <= sys.n; i++) if (a.rowPtr[i] !== b.rowPtr[i]) return false;
    for (let p = 0; p < a.colIdx.length; p++) if (a.colIdx[p] !== b.colIdx[p]) return false;
    // The LU holds a reference to the first system's matrix (pattern + value scratch): keep it.
    this.sys = { ...sys, matrix: a };
    return true;
  }

  /** Keep x, dx/ds (and those of the second right-hand side) in the LU's arrays, as they are. */
  private adoptSolutionArrays(out: Float64Array[] | null): void {
    if (!out) return;
    const own = [this.xRe, this.xIm, this.dxRe, this.dxIm, this.x2Re, this.x2Im, this.dx2Re, this.dx2Im];
    for (const [i, a] of own.entries()) out[i]!.set(a);
    [this.xRe, this.xIm, this.dxRe, this.dxIm, this.x2Re, this.x2Im, this.dx2Re, this.dx2Im] = out as [
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
    ];
  }

  /** How many frequencies needed their own pivot order. */
  get repivots(): number {
    return this.lu?.repivots ?? 0;
  }

  /** Solve at f (Hz). Returns null, or the reason the equations have no unique solution there. */
  solveAt(f: number): string | null {
    const sys = this.sys;
    if (sys.n === 0) return "the circuit has no nodes besides gnd";
    const omega = 2 * Math.PI * f;
    let ok: boolean;
    if (!this.lu) {
      assemble(sys, f);
      this.lu = new SparseComplexLU(sys.matrix);
      this.adoptSolutionArrays(this.lu.solutionArrays());
      this.lu.setPencil(sys.g, sys.c);
      this.pencilOf = sys;
      ok = !this.lu.isSingular();
    } else {
      if (this.pencilOf !== sys) {
        this.lu.setPencil(sys.g, sys.c);
        this.pencilOf = sys;
      }
      // Reads G and C itself; sys.matrix's values are written only when a frequency re-pivots.
      // Given b, it substitutes forward as it eliminates, so the solve below goes backward only.
      ok = this.lu.refactorAt(omega, sys.bRe, sys.bIm);
    }
    if (!ok) return this.singularReason(f);
    let finite = this.lu.solve(sys.bRe, sys.bIm, this.xRe, this.xIm);
    if (sys.second) finite = this.lu.solve(sys.second.bRe, sys.second.bIm, this.x2Re, this.x2Im) && finite;
    this.omega = omega;
    if (!finite) return this.singularReason(f);
    return null;
  }

  /**
   * z with A(s)ᵀ·z = d (d by its nonzero entries) at the last solved frequency (requires a
   * successful solveAt): the adjoint solve of noise analysis (noise.ts), reusing the factors. z is
   * left in the pivot order: z_i at 2·rowPos[i] (real) and 2·rowPos[i] + 1 (imaginary) of `w`,
   * until the next solve (`SparseComplexLU.solveTransposedInSteps`). Cost: one solve.
   */
  adjoint(d: SparseRhs): { w: Float64Array; rowPos: Int32Array } {
    return this.lu!.solveTransposedInSteps(d);
  }

  /**
   * dx/ds at the last solved frequency (requires a successful solveAt). Cost: one solve, less
   * its backward pass outside what `deriveOnly` asked for.
   */
  derivative(): void {
    this.derive(this.xRe, this.xIm, this.dxRe, this.dxIm, this.wantDx);
    if (this.sys.second) this.derive(this.x2Re, this.x2Im, this.dx2Re, this.dx2Im, this.wantDx2);
  }

  /** The unknowns whose dx/ds (and dx2/ds) `derivative` computes; null: every unknown. */
  private wantDx: Int32Array | null = null;
  private wantDx2: Int32Array | null = null;

  /**
   * Let `derivative` compute dx/ds only at the unknowns `dx` and dx2/ds only at `dx2` (what the
   * traces read from this system, `derivativesRead`): the backward pass then covers only the
   * steps those depend on. dxRe/dxIm (dx2Re/dx2Im) hold stale numbers at every other unknown.
   */
  deriveOnly(dx: Int32Array, dx2: Int32Array): void {
    this.wantDx = dx;
    this.wantDx2 = dx2;
  }

  /** d = −A⁻¹·C·x (the right-hand sides do not depend on s), −C·x formed inside the solve. */
  private derive(
    xRe: Float64Array,
    xIm: Float64Array,
    dRe: Float64Array,
    dIm: Float64Array,
    want: Int32Array | null,
  ): void {
    if (want !== null && want.length === 0) return;
    if (this.cRows === null || this.cOf !== this.sys) this.compactC();
    this.lu!.solveProduct(this.cMatrix!, xRe, xIm, dRe, dIm, want);
  }

  private cOf: MnaSystem | null = null;

  /** C without its zeros, as row pointers, columns and values. */
  private compactC(): void {
    const { matrix, c, n } = this.sys;
    const { rowPtr, colIdx } = matrix;
    const rows = new Int32Array(n + 1);
    const cols: number[] = [];
    const vals: number[] = [];
    for (let i = 0; i < n; i++) {
      for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
        if (c[p] === 0) continue;
        cols.push(colIdx[p]!);
        vals.push(c[p]!);
      }
      rows[i + 1] = cols.length;
    }
    this.cRows = rows;
    this.cCols = Int32Array.from(cols);
    this.cVals = Float64Array.from(vals);
    this.cMatrix = { ptr: rows, idx: this.cCols, val: this.cVals };
    this.cOf = this.sys;
  }

  private singularReason(f: number): string {
    const floating = floatingNodes(this.sys, f);
    if (floating.length > 0) {
      const list = floating.slice(0, 8).join(", ") + (floating.length > 8 ? ", …" : "");
      return (
        `at ${formatHz(f)} the circuit has no unique solution: node${floating.length > 1 ? "s" : ""} ` +
        `${list} ${floating.length > 1 ? "have" : "has"} no path to gnd through parts that conduct at this frequency`
      );
    }
    const loop = voltageLoop(this.sys, f);
    if (loop.length > 0) {
      return (
        `at ${formatHz(f)} the circuit equations are singular: ${loop.join(", ")} form a loop of parts that ` +
        "each fix a voltage (voltage sources, controlled sources, op-amp outputs), so their currents are undetermined"
      );
    }
    const cols = this.lu?.singularColumns ?? [];
    const names = cols
      .slice(0, 4)
      .map((j) => this.sys.unknownLabels[j] ?? `unknown ${j}`)
      .join(", ");
    return (
      `at ${formatHz(f)} the circuit equations are singular to working precision, even with rows and columns ` +
      `scaled (a cut set of current sources, an op-amp without feedback, or a natural frequency exactly here?)` +
      `${names ? `; undetermined: ${names}` : ""}`
    );
  }
}
