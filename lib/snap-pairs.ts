/**
 * Standard R and C pairs for a target frequency (client-safe, pure). The networks:
 *  - a single RC section and the bridge (Wien) network with equal parts: f = 1/(2πRC)
 *    (CHECKS.md §1 and §2, OAFE §16.2 and §15.7.1);
 *  - the three-section phase-shift network (series C, shunt R): f = 1/(2π√6·RC) (CHECKS.md §7).
 * For every standard C in range the ideal R = RC/C is snapped to the R series (the nearest value
 * and its two neighbours, within the R range); pairs are ranked by |frequency error|.
 */
import { E_SERIES, type SeriesName } from "@/solver/lang/eseries";

export type SnapNetwork = "rc" | "bridge" | "phase-shift";

export const SNAP_NETWORKS: { id: SnapNetwork; label: string; formula: string; k: number }[] = [
  { id: "rc", label: "Single RC section", formula: "f = 1/(2πRC)", k: 1 },
  { id: "bridge", label: "Bridge network, equal parts", formula: "f = 1/(2πRC)", k: 1 },
  { id: "phase-shift", label: "Three-section phase shift", formula: "f = 1/(2π√6·RC)", k: Math.sqrt(6) },
];

/** The series names in the solver's order (solver/lang/eseries.ts declares them). */
export const SERIES_NAMES = Object.keys(E_SERIES) as SeriesName[];

export interface SnapRequest {
  targetHz: number;
  network: SnapNetwork;
  rSeries: SeriesName;
  cSeries: SeriesName;
  /** Ohms, inclusive. Default 1 kΩ … 1 MΩ. */
  rRange?: [number, number];
  /** Farads, inclusive. Default 100 pF … 1 µF. */
  cRange?: [number, number];
  /** How many pairs to return (default 12). */
  limit?: number;
}

export interface SnapPair {
  r: number;
  c: number;
  frequencyHz: number;
  /** (f − target)/target in percent. */
  errorPct: number;
}

export const DEFAULT_R_RANGE: [number, number] = [1e3, 1e6];
export const DEFAULT_C_RANGE: [number, number] = [100e-12, 1e-6];

/** The network's frequency of R and C. */
export function networkFrequency(network: SnapNetwork, r: number, c: number): number {
  const k = SNAP_NETWORKS.find((n) => n.id === network)?.k ?? 1;
  return 1 / (2 * Math.PI * k * r * c);
}

/** Every value of a series within [min, max] (inclusive, relative slack 1e-9), ascending. */
export function seriesInRange(series: SeriesName, min: number, max: number): number[] {
  if (!(min > 0) || !(max >= min)) return [];
  const out: number[] = [];
  const lo = Math.floor(Math.log10(min)) - 1;
  const hi = Math.ceil(Math.log10(max)) + 1;
  for (let d = lo; d <= hi; d++) {
    for (const m of E_SERIES[series]) {
      const v = Number((m * 10 ** d).toPrecision(12));
      if (v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9)) out.push(v);
    }
  }
  return out.sort((a, b) => a - b);
}

/**
 * Standard pairs ranked by |error|; ties (the same R·C product) go to the R nearest the middle
 * of the R range on a log scale — a mid-range resistor stays clear of the source and load
 * impedances at both ends (common practice).
 */
export function rankPairs(req: SnapRequest): SnapPair[] {
  const [rMin, rMax] = req.rRange ?? DEFAULT_R_RANGE;
  const [cMin, cMax] = req.cRange ?? DEFAULT_C_RANGE;
  if (!(req.targetHz > 0) || !Number.isFinite(req.targetHz)) return [];
  const k = SNAP_NETWORKS.find((n) => n.id === req.network)?.k ?? 1;
  const rc = 1 / (2 * Math.PI * k * req.targetHz);
  const rs = seriesInRange(req.rSeries, rMin, rMax);
  const cs = seriesInRange(req.cSeries, cMin, cMax);
  if (rs.length === 0 || cs.length === 0) return [];
  const mid = Math.sqrt(rMin * rMax);
  const pairs: SnapPair[] = [];
  for (const c of cs) {
    const ideal = rc / c;
    // Index of the first R ≥ ideal; take it and its neighbours.
    let i = rs.findIndex((r) => r >= ideal);
    if (i < 0) i = rs.length;
    for (const j of [i - 2, i - 1, i, i + 1]) {
      const r = rs[j];
      if (r === undefined) continue;
      const f = 1 / (2 * Math.PI * k * r * c);
      pairs.push({ r, c, frequencyHz: f, errorPct: ((f - req.targetHz) / req.targetHz) * 100 });
    }
  }
  const key = (p: SnapPair) => Math.abs(Math.log(p.r / mid));
  pairs.sort((a, b) => {
    const d = Math.abs(a.errorPct) - Math.abs(b.errorPct);
    return Math.abs(d) > 1e-9 ? d : key(a) - key(b);
  });
  const seen = new Set<string>();
  const out: SnapPair[] = [];
  for (const p of pairs) {
    const id = `${p.r}|${p.c}`;
    if (seen.has(id)) continue;
    seen.add(id);
    out.push(p);
    if (out.length >= (req.limit ?? 12)) break;
  }
  return out;
}

const SI: [number, string][] = [
  [1e9, "G"],
  [1e6, "M"],
  [1e3, "k"],
  [1, ""],
  [1e-3, "m"],
  [1e-6, "u"],
  [1e-9, "n"],
  [1e-12, "p"],
];

/** A value in the netlist's own notation: 16000 → "16k", 1e-8 → "10n", 4.7e-9 → "4.7n". */
export function netlistNumber(x: number): string {
  if (x === 0) return "0";
  const [scale, p] = SI.find(([s]) => Math.abs(x) >= s * (1 - 1e-9)) ?? SI[SI.length - 1]!;
  return `${Number((x / scale).toPrecision(6))}${p}`;
}

/** The `let` lines the editor inserts for a pair. */
export function pairLets(
  pair: Pick<SnapPair, "r" | "c">,
  names: { r: string; c: string } = { r: "R", c: "C" },
) {
  return `let ${names.r} = ${netlistNumber(pair.r)}\nlet ${names.c} = ${netlistNumber(pair.c)}\n`;
}

/**
 * Names for an inserted pair that no part, node, let or block of the netlist already uses: `R`/`C`
 * when free, else `R_snap`/`C_snap`, `R_snap2`/`C_snap2`, … (both of a pair share the suffix).
 */
export function freePairNames(netlist: string, base: { r: string; c: string } = { r: "R", c: "C" }) {
  const used = new Set(netlist.match(/[A-Za-z_][A-Za-z0-9_.]*/g) ?? []);
  for (let k = 0; ; k++) {
    const suffix = k === 0 ? "" : k === 1 ? "_snap" : `_snap${k}`;
    const names = { r: `${base.r}${suffix}`, c: `${base.c}${suffix}` };
    if (!used.has(names.r) && !used.has(names.c)) return names;
  }
}
