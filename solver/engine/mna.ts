import { DEFAULT_KELVIN, thermalVoltage } from "../physics";
import { GROUND, type NetlistError, type Part } from "../types";
import { pole2Key, stampOpamp } from "./opamp";
import { patternFromTriplets, type SparseComplexMatrix } from "./sparse-matrix";

/**
 * Modified nodal analysis: A(s) = G + s·C, unknowns x = [node voltages; branch currents].
 *
 * Rows 0…nodes−1 are Kirchhoff's current law at each node (sum of currents LEAVING the node
 * through its parts equals the injected source current on the right-hand side); the following
 * rows are the branch equations of parts whose current is an unknown (vsource, inductor, vcvs,
 * ccvs, opamp). G and C are real and share one CSR pattern, so a sweep assembles
 * re = G, im = ω·C per frequency with no further allocation.
 * Method: C.-W. Ho, A. E. Ruehli & P. A. Brennan, "The modified nodal approach to network
 * analysis", IEEE Trans. Circuits and Systems 22(6), 1975.
 */
export interface MnaSystem {
  /** Number of unknowns. */
  n: number;
  nodeCount: number;
  nodeIndex: Map<string, number>;
  /** Unknown index of the branch current of a part (vsource, inductor, vcvs, ccvs, opamp). */
  branchIndex: Map<string, number>;
  /** A readable name for each unknown (diagnostics). */
  unknownLabels: string[];
  parts: Part[];
  partByName: Map<string, Part>;
  /** Pattern plus per-frequency value scratch (re, im). */
  matrix: SparseComplexMatrix;
  g: Float64Array;
  c: Float64Array;
  bRe: Float64Array;
  bIm: Float64Array;
  /**
   * A second right-hand side over the same matrix, or null: the current sources passed to
   * buildMna as `second` (a loop measured by double injection solves both with one factorization).
   */
  second: { bRe: Float64Array; bIm: Float64Array } | null;
}

export type MnaBuild = { ok: true; system: MnaSystem } | { ok: false; errors: NetlistError[] };

const BRANCH_KINDS = new Set(["vsource", "inductor", "vcvs", "ccvs", "opamp"]);

function partError(part: Part, message: string, hint?: string): NetlistError {
  return { line: part.span.line, column: part.span.column, endColumn: part.span.endColumn, message, hint };
}

/**
 * Build the MNA system of a flat part list. `second`: current sources that excite a second
 * right-hand side instead of the first (they add nothing to the matrix, so both right-hand sides
 * share its factors); their nodes must be nodes of `parts` or `nodes`. Never throws on user input.
 */
export function buildMna(parts: Part[], nodes: string[], second: Part[] = []): MnaBuild {
  const errors: NetlistError[] = [];
  const nodeIndex = new Map<string, number>();
  const labels: string[] = [];
  const addNode = (name: string) => {
    if (name === GROUND || nodeIndex.has(name)) return;
    nodeIndex.set(name, nodeIndex.size);
    labels.push(`node ${name}`);
  };
  for (const name of nodes) addNode(name);
  for (const p of parts) for (const name of p.nodes) addNode(name);
  const nodeCount = nodeIndex.size;
  const branchIndex = new Map<string, number>();
  const partByName = new Map<string, Part>();
  for (const p of parts) {
    partByName.set(p.name, p);
    if (BRANCH_KINDS.has(p.kind)) {
      branchIndex.set(p.name, nodeCount + branchIndex.size);
      labels.push(p.kind === "opamp" ? `output current of ${p.name}` : `current of ${p.name}`);
    }
  }
  // An op-amp with a second pole has one internal unknown: its first stage's output (opamp.ts).
  for (const p of parts) {
    if (p.kind === "opamp" && p.opamp?.pole2 !== undefined) {
      branchIndex.set(pole2Key(p.name), nodeCount + branchIndex.size);
      labels.push(`first-stage output of ${p.name}`);
    }
  }
  const n = nodeCount + branchIndex.size;
  const rows: number[] = [];
  const cols: number[] = [];
  const gv: number[] = [];
  const cv: number[] = [];
  const bRe = new Float64Array(n);
  const bIm = new Float64Array(n);
  const ix = (name: string | undefined) =>
    name === undefined || name === GROUND ? -1 : nodeIndex.get(name)!;
  const stamp = (r: number, c: number, g: number, cap: number) => {
    if (r < 0 || c < 0 || (g === 0 && cap === 0)) return;
    rows.push(r);
    cols.push(c);
    gv.push(g);
    cv.push(cap);
  };
  const twoTerm = (a: number, b: number, g: number, cap: number) => {
    stamp(a, a, g, cap);
    stamp(b, b, g, cap);
    stamp(a, b, -g, -cap);
    stamp(b, a, -g, -cap);
  };
  /** Branch current k leaves node a and enters node b; its row gets v(a) − v(b). */
  const branch = (k: number, a: number, b: number) => {
    stamp(a, k, 1, 0);
    stamp(b, k, -1, 0);
    stamp(k, a, 1, 0);
    stamp(k, b, -1, 0);
  };
  const senseOf = (p: Part): number => {
    const k = p.sense === undefined ? undefined : branchIndex.get(p.sense);
    const sp = p.sense === undefined ? undefined : partByName.get(p.sense);
    if (k === undefined || !sp || (sp.kind !== "vsource" && sp.kind !== "inductor")) {
      errors.push(
        partError(
          p,
          `${p.name}: the sensed part "${p.sense ?? ""}" is not a vsource or inductor of this circuit`,
        ),
      );
      return -1;
    }
    return k;
  };
  const need: Record<string, number> = {
    resistor: 2,
    capacitor: 2,
    inductor: 2,
    vsource: 2,
    isource: 2,
    vcvs: 4,
    vccs: 4,
    ccvs: 2,
    cccs: 2,
    opamp: 3,
    diode: 2,
  };

  for (const p of parts) {
    if (p.nodes.length !== need[p.kind]) {
      errors.push(
        partError(p, `${p.name}: a ${p.kind} has ${need[p.kind]} terminals, got ${p.nodes.length}`),
      );
      continue;
    }
    if (!Number.isFinite(p.value)) {
      errors.push(partError(p, `${p.name}: the value is not a finite number`));
      continue;
    }
    const [a, b, c, d] = p.nodes.map(ix) as [number, number, number, number];
    const k = branchIndex.get(p.name) ?? -1;
    const phase = ((p.phaseDeg ?? 0) * Math.PI) / 180;
    switch (p.kind) {
      case "resistor":
        if (p.value === 0) {
          errors.push(
            partError(p, `${p.name}: a resistor of 0 Ω has no conductance`, "join the two nodes instead"),
          );
          break;
        }
        twoTerm(a, b, 1 / p.value, 0);
        break;
      case "capacitor":
        twoTerm(a, b, 0, p.value);
        break;
      case "inductor":
        branch(k, a, b);
        stamp(k, k, 0, -p.value);
        break;
      case "vsource":
        branch(k, a, b);
        bRe[k] = p.value * Math.cos(phase);
        bIm[k] = p.value * Math.sin(phase);
        break;
      case "isource":
        injectCurrent(bRe, bIm, a, b, p.value, phase);
        break;
      case "vcvs":
        branch(k, a, b);
        stamp(k, c, -p.value, 0);
        stamp(k, d, p.value, 0);
        break;
      case "vccs":
        stamp(a, c, p.value, 0);
        stamp(a, d, -p.value, 0);
        stamp(b, c, -p.value, 0);
        stamp(b, d, p.value, 0);
        break;
      case "ccvs": {
        const s = senseOf(p);
        if (s < 0) break;
        branch(k, a, b);
        stamp(k, s, -p.value, 0);
        break;
      }
      case "cccs": {
        const s = senseOf(p);
        if (s < 0) break;
        stamp(a, s, p.value, 0);
        stamp(b, s, -p.value, 0);
        break;
      }
      case "diode":
        // Unbiased: the small-signal conductance is/(n·Vt), practically open (NETLIST.md).
        twoTerm(a, b, diodeConductance(p), 0);
        break;
      case "opamp":
        for (const problem of stampOpamp(p, k, branchIndex.get(pole2Key(p.name)) ?? -1, a, b, c, stamp))
          errors.push(partError(p, problem));
        break;
    }
  }
  let secondRhs: MnaSystem["second"] = null;
  if (second.length > 0) {
    secondRhs = { bRe: new Float64Array(n), bIm: new Float64Array(n) };
    for (const p of second) {
      const known = p.nodes.every((name) => name === GROUND || nodeIndex.has(name));
      if (p.kind !== "isource" || p.nodes.length !== 2 || !known) {
        errors.push(
          partError(
            p,
            `${p.name}: only a current source between known nodes can drive the second right-hand side`,
          ),
        );
        continue;
      }
      const [a, b] = p.nodes.map(ix) as [number, number];
      injectCurrent(secondRhs.bRe, secondRhs.bIm, a, b, p.value, ((p.phaseDeg ?? 0) * Math.PI) / 180);
    }
  }
  if (errors.length > 0) return { ok: false, errors };
  const pat = patternFromTriplets(n, rows, cols);
  const nnz = pat.colIdx.length;
  const g = new Float64Array(nnz);
  const cc = new Float64Array(nnz);
  for (let t = 0; t < rows.length; t++) {
    const s = pat.slot[t]!;
    g[s] = g[s]! + gv[t]!;
    cc[s] = cc[s]! + cv[t]!;
  }
  const matrix: SparseComplexMatrix = {
    n,
    rowPtr: pat.rowPtr,
    colIdx: pat.colIdx,
    re: new Float64Array(nnz),
    im: new Float64Array(nnz),
  };
  return {
    ok: true,
    system: {
      n,
      nodeCount,
      nodeIndex,
      branchIndex,
      unknownLabels: labels,
      parts,
      partByName,
      matrix,
      g,
      c: cc,
      bRe,
      bIm,
      second: secondRhs,
    },
  };
}

/** The small-signal conductance of an unbiased diode, is/(n·Vt). */
export function diodeConductance(p: Part): number {
  const d = p.diode ?? { is: 1e-14, n: 1, kelvin: DEFAULT_KELVIN };
  return d.is / (d.n * thermalVoltage(d.kelvin));
}

/** A current source of `value`∠`phase` flowing from node a through the source to node b (−1 = gnd). */
function injectCurrent(
  bRe: Float64Array,
  bIm: Float64Array,
  a: number,
  b: number,
  value: number,
  phase: number,
) {
  const ir = value * Math.cos(phase);
  const ii = value * Math.sin(phase);
  if (a >= 0) {
    bRe[a] = bRe[a]! - ir;
    bIm[a] = bIm[a]! - ii;
  }
  if (b >= 0) {
    bRe[b] = bRe[b]! + ir;
    bIm[b] = bIm[b]! + ii;
  }
}

/** Fill matrix.re/im with A(j·2πf) = G + j·2πf·C. Cost O(nnz). */
export function assemble(sys: MnaSystem, f: number): void {
  const w = 2 * Math.PI * f;
  const { re, im } = sys.matrix;
  const { g, c } = sys;
  for (let p = 0; p < g.length; p++) {
    re[p] = g[p]!;
    im[p] = w * c[p]!;
  }
}
