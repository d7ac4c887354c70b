/**
 * Noise (NETLIST.md "Noise"): the output density of a voltage probe, each source's share, and the
 * density referred to an input source.
 *
 * Method: the adjoint network (R. A. Rohrer, L. W. Nagel, R. G. Meyer & L. Weber, "Computationally
 * efficient electronic-circuit noise calculations", IEEE J. Solid-State Circuits 6(4), 1971). The
 * probe is v = dᵀ·x with x = A⁻¹·b, so v = zᵀ·b with Aᵀ·z = d: one transposed solve per frequency,
 * on the factors the sweep already has, gives the transfer from every possible excitation at once.
 * A current i injected into node a and out of node b reaches the probe as (z_a − z_b)·i; a voltage
 * added to row r of the equations (an op-amp's input noise, opamp.ts `controlRow`) as z_r·v; the
 * input source's own gain is z_k of its branch row (vsource) or z_b − z_a (isource from a to b).
 * Sources are uncorrelated, so their powers add.
 * Densities: a resistor R is a current source of 4kT/R A²/Hz across it (Johnson–Nyquist; k exact,
 * SI Brochure 9th ed.), an op-amp's en² and in² (in into each input, uncorrelated) times (1 + fc/f).
 */
import { BOLTZMANN, DEFAULT_KELVIN } from "../physics";
import type { Circuit, NoiseDef, NoiseResult, Part } from "../types";
import type { AcSolver } from "./ac";
import type { MnaSystem } from "./mna";
import { controlRow } from "./opamp";
import { type SparseRhs, sparseRhs } from "./sparse-lu-solve";

/** The circuit's temperature in kelvin (the `temperature` statement; the language defaults it to 27 °C). */
export function kelvinOf(circuit: Circuit): number {
  const t = circuit.temperature;
  return typeof t === "number" && t > 0 ? t : DEFAULT_KELVIN;
}

/** One uncorrelated source: its power gain is Σ |z[a] − z[b]|² over its terminals (−1 = gnd). */
interface Source {
  part: string;
  source: "thermal" | "en" | "in";
  terms: [number, number][];
  /** Density² is white·(1 + fc/f): V²/Hz or A²/Hz. */
  white: number;
  fc: number;
}

function sourcesOf(sys: MnaSystem, kelvin: number): Source[] {
  const ix = (name: string) => sys.nodeIndex.get(name) ?? -1;
  const out: Source[] = [];
  for (const p of sys.parts) {
    if (p.kind === "resistor" && p.value !== 0) {
      const white = (4 * BOLTZMANN * kelvin) / Math.abs(p.value);
      out.push({
        part: p.name,
        source: "thermal",
        terms: [[ix(p.nodes[0]!), ix(p.nodes[1]!)]],
        white,
        fc: 0,
      });
    } else if (p.kind === "opamp") out.push(...opampSources(p, sys, ix));
  }
  return out;
}

function opampSources(p: Part, sys: MnaSystem, ix: (n: string) => number): Source[] {
  const o = p.opamp ?? {};
  const fc = o.fc ?? 0;
  const out: Source[] = [];
  if (o.en) {
    const terms: [number, number][] = [[controlRow(p, sys.branchIndex), -1]];
    out.push({ part: p.name, source: "en", terms, white: o.en * o.en, fc });
  }
  if (o.in) {
    const terms: [number, number][] = [
      [ix(p.nodes[0]!), -1],
      [ix(p.nodes[1]!), -1],
    ];
    out.push({ part: p.name, source: "in", terms, white: o.in * o.in, fc });
  }
  return out;
}

/** What the adjoint solution gives at one frequency. */
export interface NoisePoint {
  /** Output density², V²/Hz. */
  total: number;
  /** Each source's density², in the order of `NoiseProbe.sources` (from the index `at` given to `evaluate`). */
  parts: Float64Array;
  /** |gain from the input source to the probe|², or null without `input`. */
  gain2: number | null;
}

/** One `noise` statement bound to a system: evaluates the adjoint at the solver's last solve. */
export class NoiseProbe {
  readonly def: NoiseDef;
  readonly sources: Source[];
  /** The adjoint's right-hand side: the probe's weights (+1 at its node, −1 at its reference). */
  private readonly d: SparseRhs;
  /** Unknowns: n stands for gnd. */
  private readonly n: number;
  /**
   * Sources flattened for the per-point loop: terms of source s are termStart[s]…termStart[s+1]−1,
   * between unknowns termA and termB (n for gnd).
   */
  private readonly termStart: Int32Array;
  private readonly termA: Int32Array;
  private readonly termB: Int32Array;
  /**
   * termA/termB (and the input's unknowns) as places of z in the adjoint's pivot order (see
   * `AcSolver.adjoint`; gnd at 2n, where z stays 0), mapped for the order `mappedFor` and again
   * when it changes.
   */
  private mappedFor: Int32Array | null = null;
  private placeA = new Int32Array(0);
  private placeB = new Int32Array(0);
  private placeIn: [number, number] = [0, 0];
  private readonly white: Float64Array;
  private readonly fc: Float64Array;
  /** Every source has one term and no flicker corner (`evaluate`'s short loop). */
  private readonly simple: boolean;
  private readonly input: { row: number } | { from: number; to: number } | null;

  constructor(def: NoiseDef, sys: MnaSystem, kelvin: number) {
    this.def = def;
    this.sources = sourcesOf(sys, kelvin);
    const n = sys.n;
    this.n = n;
    const g = (i: number) => (i < 0 ? n : i);
    const flat = this.sources.flatMap((x) => x.terms);
    this.termA = Int32Array.from(flat, ([a]) => g(a));
    this.termB = Int32Array.from(flat, ([, b]) => g(b));
    this.termStart = new Int32Array(this.sources.length + 1);
    this.sources.forEach((x, i) => {
      this.termStart[i + 1] = this.termStart[i]! + x.terms.length;
    });
    this.white = Float64Array.from(this.sources, (x) => x.white);
    this.fc = Float64Array.from(this.sources, (x) => x.fc);
    this.simple = this.sources.every((x) => x.terms.length === 1 && x.fc === 0);
    const dRe = new Float64Array(n);
    if (def.probe.op === "v") {
      const a = sys.nodeIndex.get(def.probe.node);
      const b = def.probe.ref === undefined ? undefined : sys.nodeIndex.get(def.probe.ref);
      if (a !== undefined) dRe[a] = 1;
      if (b !== undefined) dRe[b] = dRe[b]! - 1;
    }
    this.d = sparseRhs(dRe, new Float64Array(n));
    const src = def.input === undefined ? undefined : sys.partByName.get(def.input);
    if (!src) this.input = null;
    else if (src.kind === "vsource") this.input = { row: sys.branchIndex.get(src.name)! };
    else
      this.input = {
        from: g(sys.nodeIndex.get(src.nodes[0]!) ?? -1),
        to: g(sys.nodeIndex.get(src.nodes[1]!) ?? -1),
      };
  }

  /** The places of the terms' unknowns in a pivot order (`rowPos`); gnd (index n) at 2n. */
  private mapTo(rowPos: Int32Array): void {
    const gnd = 2 * this.n;
    const place = (i: number) => (i === this.n ? gnd : 2 * rowPos[i]!);
    this.placeA = this.termA.map(place);
    this.placeB = this.termB.map(place);
    const inp = this.input;
    this.placeIn = !inp
      ? [gnd, gnd]
      : "row" in inp
        ? [place(inp.row), gnd]
        : [place(inp.to), place(inp.from)];
    this.mappedFor = rowPos;
  }

  /**
   * The densities at frequency f; `solver` must have just solved at f. Cost: one transposed solve
   * and O(sources). `parts` receives source s's density² at index at + s·stride (a new array when
   * not given).
   */
  evaluate(
    solver: AcSolver,
    f: number,
    parts: Float64Array = new Float64Array(this.sources.length),
    at = 0,
    stride = 1,
  ): NoisePoint {
    // z in the pivot order, read at the places of the terms' unknowns (mapped once per order): no
    // pass to put z back in the unknowns' order. z at gnd's place is 0.
    const { w: z, rowPos } = solver.adjoint(this.d);
    if (rowPos !== this.mappedFor) this.mapTo(rowPos);
    const { termStart, placeA, placeB, white, fc } = this;
    let total = 0;
    if (this.simple) {
      // One term per source, no flicker corner (thermal noise of resistors, the usual case): the
      // same sums without the inner loop or the corner's factor (× 1 and 0 + x change no bit).
      for (let s = 0; s < white.length; s++) {
        const a = placeA[s]!;
        const b = placeB[s]!;
        const r = z[a]! - z[b]!;
        const i = z[a + 1]! - z[b + 1]!;
        const v = (r * r + i * i) * white[s]!;
        parts[at + s * stride] = v;
        total += v;
      }
    }
    for (let s = this.simple ? white.length : 0; s < white.length; s++) {
      let g2 = 0;
      for (let q = termStart[s]!; q < termStart[s + 1]!; q++) {
        const a = placeA[q]!;
        const b = placeB[q]!;
        const r = z[a]! - z[b]!;
        const i = z[a + 1]! - z[b + 1]!;
        g2 += r * r + i * i;
      }
      const fcs = fc[s]!;
      const v = g2 * white[s]! * (fcs === 0 ? 1 : 1 + fcs / f);
      parts[at + s * stride] = v;
      total += v;
    }
    let gain2: number | null = null;
    const [p, m] = this.placeIn;
    if (this.input) {
      const r = z[p]! - z[m]!;
      const i = z[p + 1]! - z[m + 1]!;
      gain2 = r ** 2 + i ** 2;
    }
    return { total, parts, gain2 };
  }
}

const root = (x: number): number | null => (Number.isFinite(x) && x >= 0 ? Math.sqrt(x) : null);

/** Collects a noise statement's densities over a sweep (filled point by point, in order). */
export class NoiseSweep {
  readonly probe: NoiseProbe;
  private readonly total: Float64Array;
  private readonly gain2: Float64Array;
  /**
   * Source-major density² of every source: parts[s·points + k]. Each point writes one value per
   * source (S cache lines, each reused for the next points), and `result` reads each source's
   * column in order into its own array.
   */
  private readonly parts: Float64Array;
  private readonly points: number;
  private k = 0;

  constructor(probe: NoiseProbe, points: number) {
    this.probe = probe;
    this.total = new Float64Array(points);
    this.gain2 = new Float64Array(points);
    this.parts = new Float64Array(points * probe.sources.length);
    this.points = points;
  }

  record(solver: AcSolver, f: number): void {
    const p = this.probe.evaluate(solver, f, this.parts, this.k, this.points);
    this.total[this.k] = p.total;
    this.gain2[this.k] = p.gain2 ?? 0;
    this.k++;
  }

  result(kelvin: number): NoiseResult {
    const { def, sources } = this.probe;
    const S = sources.length;
    const pts = this.k;
    // Plain loops, no closure per value: a statement over 200 parts × 1 000 points has 200 000.
    const density = new Array<number | null>(pts);
    for (let k = 0; k < pts; k++) density[k] = root(this.total[k]!);
    let inputDensity: (number | null)[] | null = null;
    if (def.input !== undefined) {
      inputDensity = new Array<number | null>(pts);
      for (let k = 0; k < pts; k++) {
        const g2 = this.gain2[k]!;
        inputDensity[k] = g2 > 0 ? root(this.total[k]! / g2) : null;
      }
    }
    // Each source's column from its run of `parts` (stored source-major), in order.
    const columns: (number | null)[][] = new Array(S);
    const parts = this.parts;
    for (let s = 0; s < S; s++) {
      const col = new Array<number | null>(pts);
      for (let k = 0, at = s * this.points; k < pts; k++, at++) col[k] = root(parts[at]!);
      columns[s] = col;
    }
    const contributions = sources.map((src, s) => ({
      part: src.part,
      source: src.source,
      density: columns[s]!,
    }));
    return {
      name: def.name,
      probe: def.text,
      density,
      inputDensity,
      input: def.input ?? null,
      contributions,
      temperature: kelvin,
    };
  }
}
