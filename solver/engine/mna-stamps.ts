import { DEFAULT_KELVIN, thermalVoltage } from "../physics";
import type { NetlistError, Part } from "../types";
import { pole2Key, stampOpamp } from "./opamp";

/** The unknowns of an MNA system (see `MnaSystem`): node voltages, then branch currents. */
export interface Unknowns {
  n: number;
  nodeCount: number;
  nodeIndex: Map<string, number>;
  branchIndex: Map<string, number>;
  partByName: Map<string, Part>;
  /** Unknown index of a node name (−1 for ground or no node). */
  ix: (name: string | undefined) => number;
}

/** Where the stamps of the parts go: the triplets of G and C, the right-hand side, the errors. */
export interface StampTarget {
  stamps: Stamps;
  bRe: Float64Array;
  bIm: Float64Array;
  errors: NetlistError[];
}

export function partError(part: Part, message: string, hint?: string): NetlistError {
  return { line: part.span.line, column: part.span.column, endColumn: part.span.endColumn, message, hint };
}

/**
 * The (row, column, G, C) triplets in the order the parts stamp them; entries at the same place
 * are summed when the pattern is built. Rows or columns of ground (−1) and zero pairs are dropped.
 */
export class Stamps {
  readonly rows: number[] = [];
  readonly cols: number[] = [];
  readonly gv: number[] = [];
  readonly cv: number[] = [];

  /** G[r][c] += g, C[r][c] += cap (a property, so it can be handed to `stampOpamp`). */
  readonly stamp = (r: number, c: number, g: number, cap: number): void => {
    if (r < 0 || c < 0 || (g === 0 && cap === 0)) return;
    this.rows.push(r);
    this.cols.push(c);
    this.gv.push(g);
    this.cv.push(cap);
  };

  /** An admittance g + s·cap between nodes a and b. */
  twoTerm(a: number, b: number, g: number, cap: number): void {
    this.stamp(a, a, g, cap);
    this.stamp(b, b, g, cap);
    this.stamp(a, b, -g, -cap);
    this.stamp(b, a, -g, -cap);
  }

  /** Branch current k leaves node a and enters node b; its row gets v(a) − v(b). */
  branch(k: number, a: number, b: number): void {
    this.stamp(a, k, 1, 0);
    this.stamp(b, k, -1, 0);
    this.stamp(k, a, 1, 0);
    this.stamp(k, b, -1, 0);
  }
}

/** The kinds with a branch current among the unknowns. */
export const BRANCH_KINDS = new Set(["vsource", "inductor", "vcvs", "ccvs", "opamp"]);

const TERMINALS: Record<string, number> = {
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

/** Stamp one part of the netlist into `to`; a problem with it goes to `to.errors` instead. */
export function stampPart(p: Part, u: Unknowns, to: StampTarget): void {
  const { stamps: s, errors } = to;
  if (p.nodes.length !== TERMINALS[p.kind]) {
    errors.push(
      partError(p, `${p.name}: a ${p.kind} has ${TERMINALS[p.kind]} terminals, got ${p.nodes.length}`),
    );
    return;
  }
  if (!Number.isFinite(p.value)) {
    errors.push(partError(p, `${p.name}: the value is not a finite number`));
    return;
  }
  // Indexed, no array per part: this runs once per part, mostly before the JIT has warmed up.
  const nodes = p.nodes;
  const a = u.ix(nodes[0]);
  const b = u.ix(nodes[1]);
  const c = nodes.length > 2 ? u.ix(nodes[2]) : -1;
  const d = nodes.length > 3 ? u.ix(nodes[3]) : -1;
  const k = BRANCH_KINDS.has(p.kind) ? (u.branchIndex.get(p.name) ?? -1) : -1;
  switch (p.kind) {
    case "resistor":
      if (p.value === 0) {
        errors.push(
          partError(p, `${p.name}: a resistor of 0 Ω has no conductance`, "join the two nodes instead"),
        );
        break;
      }
      s.twoTerm(a, b, 1 / p.value, 0);
      break;
    case "capacitor":
      s.twoTerm(a, b, 0, p.value);
      break;
    case "inductor":
      s.branch(k, a, b);
      s.stamp(k, k, 0, -p.value);
      break;
    case "vsource": {
      const phase = ((p.phaseDeg ?? 0) * Math.PI) / 180;
      s.branch(k, a, b);
      to.bRe[k] = p.value * Math.cos(phase);
      to.bIm[k] = p.value * Math.sin(phase);
      break;
    }
    case "isource":
      injectCurrent(to.bRe, to.bIm, a, b, p.value, ((p.phaseDeg ?? 0) * Math.PI) / 180);
      break;
    case "diode":
      // Unbiased: the small-signal conductance is/(n·Vt), practically open (NETLIST.md).
      s.twoTerm(a, b, diodeConductance(p), 0);
      break;
    case "opamp":
      for (const problem of stampOpamp(p, k, u.branchIndex.get(pole2Key(p.name)) ?? -1, a, b, c, s.stamp))
        errors.push(partError(p, problem));
      break;
    default:
      stampControlled(p, u, to, [a, b, c, d], k);
  }
}

/** The controlled sources (vcvs, vccs, ccvs, cccs): part of `stampPart`. */
function stampControlled(
  p: Part,
  u: Unknowns,
  to: StampTarget,
  [a, b, c, d]: [number, number, number, number],
  k: number,
): void {
  const s = to.stamps;
  switch (p.kind) {
    case "vcvs":
      s.branch(k, a, b);
      s.stamp(k, c, -p.value, 0);
      s.stamp(k, d, p.value, 0);
      break;
    case "vccs":
      s.stamp(a, c, p.value, 0);
      s.stamp(a, d, -p.value, 0);
      s.stamp(b, c, -p.value, 0);
      s.stamp(b, d, p.value, 0);
      break;
    case "ccvs": {
      const sense = senseOf(p, u, to.errors);
      if (sense < 0) break;
      s.branch(k, a, b);
      s.stamp(k, sense, -p.value, 0);
      break;
    }
    case "cccs": {
      const sense = senseOf(p, u, to.errors);
      if (sense < 0) break;
      s.stamp(a, sense, p.value, 0);
      s.stamp(b, sense, -p.value, 0);
      break;
    }
  }
}

/** The unknown of the current a ccvs or cccs senses, or −1 (with an error) when there is none. */
function senseOf(p: Part, u: Unknowns, errors: NetlistError[]): number {
  const k = p.sense === undefined ? undefined : u.branchIndex.get(p.sense);
  const sp = p.sense === undefined ? undefined : u.partByName.get(p.sense);
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
}

/** The small-signal conductance of an unbiased diode, is/(n·Vt). */
export function diodeConductance(p: Part): number {
  const d = p.diode ?? { is: 1e-14, n: 1, kelvin: DEFAULT_KELVIN };
  return d.is / (d.n * thermalVoltage(d.kelvin));
}

/** A current source of `value`∠`phase` flowing from node a through the source to node b (−1 = gnd). */
export function injectCurrent(
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
