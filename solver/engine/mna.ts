import { GROUND, type NetlistError, type Part } from "../types";
import { BRANCH_KINDS, injectCurrent, partError, Stamps, stampPart, type Unknowns } from "./mna-stamps";
import { pole2Key } from "./opamp";
import { csrFromTriplets, type SparseComplexMatrix } from "./sparse-matrix";

export { diodeConductance } from "./mna-stamps";

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

/**
 * Build the MNA system of a flat part list. `second`: current sources that excite a second
 * right-hand side instead of the first (they add nothing to the matrix, so both right-hand sides
 * share its factors); their nodes must be nodes of `parts` or `nodes`. Never throws on user input.
 * Stamps per part kind: `stampPart` (mna-stamps.ts).
 */
export function buildMna(parts: Part[], nodes: string[], second: Part[] = []): MnaBuild {
  const errors: NetlistError[] = [];
  const { unknowns: u, labels } = numberUnknowns(parts, nodes);
  const stamps = new Stamps();
  const bRe = new Float64Array(u.n);
  const bIm = new Float64Array(u.n);
  for (const p of parts) stampPart(p, u, { stamps, bRe, bIm, errors });
  const secondRhs = second.length > 0 ? secondRightHandSide(second, u, errors) : null;
  if (errors.length > 0) return { ok: false, errors };
  const { matrix, g, c } = sumTriplets(u.n, stamps);
  const { n, nodeCount, nodeIndex, branchIndex, partByName } = u;
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
      c,
      bRe,
      bIm,
      second: secondRhs,
    },
  };
}

/**
 * Number the unknowns: the nodes (those of `nodes` first, then in order of appearance), then the
 * branch currents of the parts that have one, then each two-pole op-amp's internal node.
 */
function numberUnknowns(parts: Part[], nodes: string[]): { unknowns: Unknowns; labels: string[] } {
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
  const ix = (name: string | undefined) =>
    name === undefined || name === GROUND ? -1 : nodeIndex.get(name)!;
  return { unknowns: { n, nodeCount, nodeIndex, branchIndex, partByName, ix }, labels };
}

/** The second right-hand side: current sources between known nodes only. */
function secondRightHandSide(second: Part[], u: Unknowns, errors: NetlistError[]): MnaSystem["second"] {
  const rhs = { bRe: new Float64Array(u.n), bIm: new Float64Array(u.n) };
  for (const p of second) {
    const known = p.nodes.every((name) => name === GROUND || u.nodeIndex.has(name));
    if (p.kind !== "isource" || p.nodes.length !== 2 || !known) {
      errors.push(
        partError(
          p,
          `${p.name}: only a current source between known nodes can drive the second right-hand side`,
        ),
      );
      continue;
    }
    const [a, b] = p.nodes.map(u.ix) as [number, number];
    injectCurrent(rhs.bRe, rhs.bIm, a, b, p.value, ((p.phaseDeg ?? 0) * Math.PI) / 180);
  }
  return rhs;
}

/** The CSR pattern of the triplets and G, C in it (entries at one place summed, in stamp order). */
function sumTriplets(
  n: number,
  s: Stamps,
): { matrix: SparseComplexMatrix; g: Float64Array; c: Float64Array } {
  const m = csrFromTriplets(n, s.rows, s.cols, s.gv, s.cv);
  const nnz = m.colIdx.length;
  const matrix: SparseComplexMatrix = {
    n,
    rowPtr: m.rowPtr,
    colIdx: m.colIdx,
    re: new Float64Array(nnz),
    im: new Float64Array(nnz),
  };
  return { matrix, g: m.a, c: m.b };
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
