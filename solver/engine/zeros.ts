/**
 * Zeros of the transfer from the netlist's one independent source to a probe (NETLIST.md "Zeros").
 *
 * Method: the transmission zeros are the finite s where the bordered MNA pencil
 *   [ G + s·C   b ]
 *   [   cᵀ      0 ]
 * is singular (b the source's excitation pattern, cᵀ the probe's read-out row): by Cramer's rule its
 * determinant is det(G + s·C)·(−cᵀ(G + s·C)⁻¹b), i.e. the numerator of the transfer. The bordered
 * pencil is a network matrix of the same form, so `computePoles` (shift-invert, infinite
 * eigenvalues dropped) finds its finite generalized eigenvalues unchanged.
 * Infinite eigenvalues: the bordered pencil has more of them than the network (the transfer's
 * relative degree), in Jordan blocks, which rounding scatters to large finite values of size
 * ε^(1/k) — above any fixed drop threshold. So every candidate is verified on the transfer itself:
 * a zero z of H has |H(z)| ≪ |H(z·(1 + δ))| (δ = 1e-3: the ratio is ~1e-7 for a computed simple
 * zero, ~1 for a point of the infinite cluster, where H behaves like s^−k). Candidates with a ratio
 * above 1e-2, and those where G + z·C is singular (a zero cancelled by a pole: not a zero of the
 * transfer), are dropped. A zero within 1e-9·|z| of the jω axis is put on it (notches are exact
 * there). A capacitor's current adds a zero at s = 0 (i = s·C·v).
 */
import type { Part, Probe, ZeroResult } from "../types";
import type { MnaSystem } from "./mna";
import { computePoles } from "./poles";
import { SparseComplexLU } from "./sparse-lu";
import { csrFromTriplets } from "./sparse-matrix";

/** The read-out row cᵀ of a probe as (index, weight) pairs, and zeros at s = 0 it adds; null if unsupported. */
function readout(sys: MnaSystem, p: Probe): { c: [number, number][]; atOrigin: number } | null {
  const ix = (n: string | undefined) => (n === undefined ? undefined : sys.nodeIndex.get(n));
  const pair = (a: string | undefined, b: string | undefined, w: number): [number, number][] => {
    const out: [number, number][] = [];
    const i = ix(a);
    const j = ix(b);
    if (i !== undefined) out.push([i, w]);
    if (j !== undefined) out.push([j, -w]);
    return out;
  };
  if (p.op === "v") return { c: pair(p.node, p.ref, 1), atOrigin: 0 };
  if (p.op !== "i") return null;
  const part = sys.partByName.get(p.part) as Part | undefined;
  if (!part) return null;
  const k = sys.branchIndex.get(part.name);
  if (k !== undefined) return { c: [[k, 1]], atOrigin: 0 };
  const [a, b, c, d] = part.nodes;
  switch (part.kind) {
    case "resistor":
      return { c: pair(a, b, 1 / part.value), atOrigin: 0 };
    case "capacitor":
      return { c: pair(a, b, part.value), atOrigin: 1 };
    case "vccs":
      return { c: pair(c, d, part.value), atOrigin: 0 };
    case "cccs": {
      const s = sys.branchIndex.get(part.sense ?? "");
      return s === undefined ? null : { c: [[s, part.value]], atOrigin: 0 };
    }
    default:
      return null;
  }
}

/** The excitation pattern b of the one independent source. */
function excitation(sys: MnaSystem, src: Part): [number, number][] {
  const k = sys.branchIndex.get(src.name);
  if (k !== undefined) return [[k, 1]];
  const out: [number, number][] = [];
  const a = sys.nodeIndex.get(src.nodes[0]!);
  const b = sys.nodeIndex.get(src.nodes[1]!);
  if (a !== undefined) out.push([a, -1]);
  if (b !== undefined) out.push([b, 1]);
  return out;
}

/**
 * The finite zeros from `src` to the probe, or a reason. `scaleHz` places the shifts (as for poles).
 */
export function computeZeros(
  sys: MnaSystem,
  src: Part,
  probe: Probe,
  probeText: string,
  scaleHz: number,
): ZeroResult[] | string {
  const ro = readout(sys, probe);
  if (!ro) return `zeros: ${probeText} cannot be read as one row of the equations`;
  const n = sys.n;
  const rows: number[] = [];
  const cols: number[] = [];
  const gv: number[] = [];
  const cv: number[] = [];
  const { rowPtr, colIdx } = sys.matrix;
  for (let i = 0; i < n; i++) {
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
      rows.push(i);
      cols.push(colIdx[p]!);
      gv.push(sys.g[p]!);
      cv.push(sys.c[p]!);
    }
  }
  // Scale the border like the matrix so the pencil is not lopsided.
  const big = Math.max(1e-300, ...sys.g.map(Math.abs));
  const cmax = Math.max(1e-300, ...ro.c.map(([, w]) => Math.abs(w)));
  const add = (i: number, j: number, w: number) => {
    rows.push(i);
    cols.push(j);
    gv.push(w);
    cv.push(0);
  };
  for (const [i, w] of excitation(sys, src)) add(i, n, w * big);
  for (const [j, w] of ro.c) add(n, j, (w / cmax) * big);
  const pat = csrFromTriplets(n + 1, rows, cols, gv, cv);
  const { a: g, b: c } = pat;
  const bordered: MnaSystem = {
    ...sys,
    n: n + 1,
    matrix: {
      n: n + 1,
      rowPtr: pat.rowPtr,
      colIdx: pat.colIdx,
      re: new Float64Array(g.length),
      im: new Float64Array(g.length),
    },
    g,
    c,
  };
  const found = computePoles(bordered, scaleHz);
  if (found === null) return "zeros: no regular shift found; the transfer may be identically zero";
  const b = excitation(sys, src);
  const h = (sr: number, si: number) => transferAt(sys, b, ro.c, sr, si);
  const zeros: ZeroResult[] = [];
  for (const z of found) {
    const here = h(z.re, z.im);
    const near = h(z.re * 1.001, z.im * 1.001);
    if (here === null || near === null || !(here <= 1e-2 * near)) continue;
    const re = Math.abs(z.re) <= 1e-9 * Math.hypot(z.re, z.im) ? 0 : z.re;
    const w = Math.hypot(re, z.im);
    zeros.push({
      probe: probeText,
      re,
      im: z.im,
      frequencyHz: z.frequencyHz,
      q: re === 0 ? null : w / (-2 * re),
    });
  }
  for (let k = 0; k < ro.atOrigin; k++)
    zeros.unshift({ probe: probeText, re: 0, im: 0, frequencyHz: 0, q: null });
  return zeros;
}

/** |cᵀ(G + s·C)⁻¹b| at complex s = sr + j·si, or null where G + s·C is singular. */
function transferAt(
  sys: MnaSystem,
  b: [number, number][],
  c: [number, number][],
  sr: number,
  si: number,
): number | null {
  const { rowPtr, colIdx } = sys.matrix;
  const re = Float64Array.from(sys.g, (g, p) => g + sr * sys.c[p]!);
  const im = Float64Array.from(sys.c, (x) => si * x);
  const lu = new SparseComplexLU({ n: sys.n, rowPtr, colIdx, re, im });
  if (lu.isSingular()) return null;
  const xr = new Float64Array(sys.n);
  const xi = new Float64Array(sys.n);
  for (const [i, w] of b) xr[i] = xr[i]! + w;
  lu.solve(xr, xi);
  let yr = 0;
  let yi = 0;
  for (const [j, w] of c) {
    yr += w * xr[j]!;
    yi += w * xi[j]!;
  }
  const m = Math.hypot(yr, yi);
  return Number.isFinite(m) ? m : null;
}
