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
  /** Density² at f: V²/Hz or A²/Hz. */
  psd: (f: number) => number;
}

function sourcesOf(sys: MnaSystem, kelvin: number): Source[] {
  const ix = (name: string) => sys.nodeIndex.get(name) ?? -1;
  const out: Source[] = [];
  for (const p of sys.parts) {
    if (p.kind === "resistor" && p.value !== 0) {
      const g = (4 * BOLTZMANN * kelvin) / Math.abs(p.value);
      out.push({
        part: p.name,
        source: "thermal",
        terms: [[ix(p.nodes[0]!), ix(p.nodes[1]!)]],
        psd: () => g,
      });
    } else if (p.kind === "opamp") out.push(...opampSources(p, sys, ix));
  }
  return out;
}

function opampSources(p: Part, sys: MnaSystem, ix: (n: string) => number): Source[] {
  const o = p.opamp ?? {};
  const fc = o.fc ?? 0;
  const flicker = (x: number) => (f: number) => x * x * (1 + fc / f);
  const out: Source[] = [];
  if (o.en)
    out.push({
      part: p.name,
      source: "en",
      terms: [[controlRow(p, sys.branchIndex), -1]],
      psd: flicker(o.en),
    });
  if (o.in) {
    out.push({
      part: p.name,
      source: "in",
      terms: [
        [ix(p.nodes[0]!), -1],
        [ix(p.nodes[1]!), -1],
      ],
      psd: flicker(o.in),
    });
  }
  return out;
}

/** What the adjoint solution gives at one frequency. */
export interface NoisePoint {
  /** Output density², V²/Hz. */
  total: number;
  /** Each source's density², in the order of `NoiseProbe.sources`. */
  parts: number[];
  /** |gain from the input source to the probe|², or null without `input`. */
  gain2: number | null;
}

/** One `noise` statement bound to a system: evaluates the adjoint at the solver's last solve. */
export class NoiseProbe {
  readonly def: NoiseDef;
  readonly sources: Source[];
  private readonly dRe: Float64Array;
  private readonly dIm: Float64Array;
  private readonly zRe: Float64Array;
  private readonly zIm: Float64Array;
  private readonly input: { row: number } | { from: number; to: number } | null;

  constructor(def: NoiseDef, sys: MnaSystem, kelvin: number) {
    this.def = def;
    this.sources = sourcesOf(sys, kelvin);
    const n = sys.n;
    this.dRe = new Float64Array(n);
    this.dIm = new Float64Array(n);
    this.zRe = new Float64Array(n);
    this.zIm = new Float64Array(n);
    if (def.probe.op === "v") {
      const a = sys.nodeIndex.get(def.probe.node);
      const b = def.probe.ref === undefined ? undefined : sys.nodeIndex.get(def.probe.ref);
      if (a !== undefined) this.dRe[a] = 1;
      if (b !== undefined) this.dRe[b] = this.dRe[b]! - 1;
    }
    const src = def.input === undefined ? undefined : sys.partByName.get(def.input);
    if (!src) this.input = null;
    else if (src.kind === "vsource") this.input = { row: sys.branchIndex.get(src.name)! };
    else
      this.input = {
        from: sys.nodeIndex.get(src.nodes[0]!) ?? -1,
        to: sys.nodeIndex.get(src.nodes[1]!) ?? -1,
      };
  }

  /** The densities at frequency f; `solver` must have just solved at f. Cost: one transposed solve. */
  evaluate(solver: AcSolver, f: number): NoisePoint {
    const { zRe, zIm } = this;
    solver.adjoint(this.dRe, this.dIm, zRe, zIm);
    const zr = (i: number) => (i < 0 ? 0 : zRe[i]!);
    const zi = (i: number) => (i < 0 ? 0 : zIm[i]!);
    let total = 0;
    const parts = new Array<number>(this.sources.length);
    for (let s = 0; s < this.sources.length; s++) {
      const src = this.sources[s]!;
      let g2 = 0;
      for (const [a, b] of src.terms) {
        const r = zr(a) - zr(b);
        const i = zi(a) - zi(b);
        g2 += r * r + i * i;
      }
      const v = g2 * src.psd(f);
      parts[s] = v;
      total += v;
    }
    let gain2: number | null = null;
    const inp = this.input;
    if (inp && "row" in inp) gain2 = zr(inp.row) ** 2 + zi(inp.row) ** 2;
    else if (inp) gain2 = (zr(inp.to) - zr(inp.from)) ** 2 + (zi(inp.to) - zi(inp.from)) ** 2;
    return { total, parts, gain2 };
  }
}

const root = (x: number): number | null => (Number.isFinite(x) && x >= 0 ? Math.sqrt(x) : null);

/** Collects a noise statement's densities over a sweep (filled point by point, in order). */
export class NoiseSweep {
  readonly probe: NoiseProbe;
  private readonly points: NoisePoint[] = [];

  constructor(probe: NoiseProbe) {
    this.probe = probe;
  }

  record(solver: AcSolver, f: number): void {
    this.points.push(this.probe.evaluate(solver, f));
  }

  result(kelvin: number): NoiseResult {
    const { def, sources } = this.probe;
    const pts = this.points;
    return {
      name: def.name,
      probe: def.text,
      density: pts.map((p) => root(p.total)),
      inputDensity:
        def.input === undefined
          ? null
          : pts.map((p) => (p.gain2 !== null && p.gain2 > 0 ? root(p.total / p.gain2) : null)),
      input: def.input ?? null,
      contributions: sources.map((s, i) => ({
        part: s.part,
        source: s.source,
        density: pts.map((p) => root(p.parts[i]!)),
      })),
      temperature: kelvin,
    };
  }
}
