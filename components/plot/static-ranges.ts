/**
 * Axes of the static chart as laid out: which axes the figure uses, the data each one must show
 * (trace values, bar extents, shapes, annotation text), and from that each axis' type, pixel span,
 * range (given, matched, categories or auto) and ticks.
 */
import { type AxisSpec, type AxisType, givenTicks, linearTicks, logTicks } from "./static-axes";
import {
  type AxisModel,
  axisKey,
  type MeasureText,
  num,
  type Obj,
  obj,
  type PlotBox,
  plainText,
  str,
} from "./static-scene-types";
import { barGeometry, type TraceInfo } from "./static-traces";

function axisType(spec: Obj, values: unknown[]): AxisType {
  if (spec.type === "log") return "log";
  if (spec.type === "category") return "category";
  if (spec.type === "linear") return "linear";
  const first = values.find((v) => v !== null && v !== undefined);
  return typeof first === "string" ? "category" : "linear";
}

/** The library pads auto ranges by 5 % of the axis length at each padded end. */
const PAD = 0.05 / 0.9;

function autorange(
  values: number[],
  opts: { padLo: boolean; padHi: boolean; tozero: boolean },
): [number, number] | null {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const v of values) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (opts.tozero) {
    lo = Math.min(lo, 0);
    hi = Math.max(hi, 0);
  }
  if (!(hi >= lo)) return null;
  if (hi === lo) return [lo - 1, hi + 1];
  const span = hi - lo;
  return [
    opts.padLo && !(opts.tozero && lo === 0) ? lo - span * PAD : lo,
    opts.padHi && !(opts.tozero && hi === 0) ? hi + span * PAD : hi,
  ];
}

export interface Collected {
  values: number[];
  /** Positions (on the axis' scale) that need this many pixels clear on each side (annotation text). */
  pads: { at: number; px: number }[];
  padLo: boolean;
  padHi: boolean;
  tozero: boolean;
  categories: string[];
  raw: unknown[];
}

/** Axes in use: every axis key in the layout and every axis a trace refers to. */
export function axisIds(layout: Obj, traces: readonly TraceInfo[]): Set<string> {
  const ids = new Set<string>();
  for (const k of Object.keys(layout)) {
    const m = /^([xy])axis(\d*)$/.exec(k);
    if (m) ids.add(`${m[1]}${m[2]}`);
  }
  for (const t of traces) {
    ids.add(t.xref);
    ids.add(t.yref);
  }
  if (ids.size === 0) ids.add("x").add("y");
  return ids;
}

/** An axis' layout entry ("x2" → `layout.xaxis2`). */
export const axisSpec = (layout: Obj, id: string) => obj(layout[axisKey(id)]) as AxisSpec & Obj;

/** Each axis' data: trace values, bar extents, shapes on data axes, annotation text to keep clear. */
export function collectAxisData(
  traces: readonly TraceInfo[],
  shapes: readonly Obj[],
  annotations: readonly Obj[],
  bargap: number,
  font: { family: string; size: number },
  measure: MeasureText,
): (id: string) => Collected {
  const data = new Map<string, Collected>();
  const col = (id: string) => {
    let c = data.get(id);
    if (!c) {
      c = { values: [], pads: [], padLo: false, padHi: false, tozero: false, categories: [], raw: [] };
      data.set(id, c);
    }
    return c;
  };
  for (const tr of traces) {
    const cx = col(tr.xref);
    const cy = col(tr.yref);
    cx.raw.push(...tr.x);
    cy.raw.push(...tr.y);
    if (tr.type === "bar") {
      const cpos = tr.horizontal ? cy : cx;
      const cval = tr.horizontal ? cx : cy;
      const g = barGeometry(tr, bargap);
      g.pos.forEach((p, i) => {
        const n = num(p);
        if (n !== null) cpos.values.push(n - g.slot(i) / 2, n + g.slot(i) / 2);
        const v = num(g.val[i]);
        if (v !== null) {
          cval.values.push(v + g.base, g.base);
          if (v >= 0) cval.padHi = true;
          else cval.padLo = true;
        }
      });
      cval.tozero = g.base === 0;
      continue;
    }
    const mode = str(tr.t.mode, tr.x.length > 20 ? "lines" : "lines+markers");
    const markers = mode.includes("markers");
    for (const v of tr.x) if (num(v) !== null) cx.values.push(v as number);
    for (const v of tr.y) if (num(v) !== null) cy.values.push(v as number);
    cy.padLo = cy.padHi = true;
    if (markers) cx.padLo = cx.padHi = true;
  }
  for (const s of shapes) {
    const xr = str(s.xref, "x");
    const yr = str(s.yref, "y");
    if (xr !== "paper")
      for (const k of ["x0", "x1"]) if (num(s[k]) !== null) col(xr).values.push(s[k] as number);
    if (yr !== "paper")
      for (const k of ["y0", "y1"]) if (num(s[k]) !== null) col(yr).values.push(s[k] as number);
  }

  // Annotations on data axes stretch the auto range until their text fits (half its size each side).
  for (const a of annotations) {
    const text = plainText(str(a.text, "")).text;
    const size = num(obj(a.font).size) ?? font.size;
    const w = measure(text, size, str(obj(a.font).family, font.family)) / 2 + (num(a.borderpad) ?? 1) + 1;
    const xr = str(a.xref, "x");
    const yr = str(a.yref, "y");
    if (xr !== "paper" && num(a.x) !== null) col(xr).pads.push({ at: a.x as number, px: w });
    if (yr !== "paper" && num(a.y) !== null)
      col(yr).pads.push({ at: a.y as number, px: (size * 1.3) / 2 + 1 });
  }
  return col;
}

/** Builds the axes: type, pixel span, range (equal scales where asked), ticks. */
export function buildAxes(
  ids: ReadonlySet<string>,
  specOf: (id: string) => AxisSpec & Obj,
  col: (id: string) => Collected,
  plot: PlotBox,
): Map<string, AxisModel> {
  const axes = new Map<string, AxisModel>();
  const order = [...ids].sort((a, b) => {
    const rank = (id: string) => (specOf(id).matches || specOf(id).overlaying ? 1 : 0);
    return rank(a) - rank(b);
  });
  for (const id of order) {
    const spec = specOf(id);
    const letter = id[0] as "x" | "y";
    const c = col(id);
    const over = typeof spec.overlaying === "string" ? axes.get(spec.overlaying) : undefined;
    const domain = Array.isArray(spec.domain) ? (spec.domain as number[]) : [0, 1];
    const d0 = over ? 0 : (domain[0] ?? 0);
    const d1 = over ? 1 : (domain[1] ?? 1);
    const type = axisType(spec, c.raw);
    const start = over ? over.start : letter === "x" ? plot.x + d0 * plot.w : plot.y + plot.h - d0 * plot.h;
    const length = over ? over.length : (d1 - d0) * (letter === "x" ? plot.w : plot.h);
    const categories: string[] = [];
    if (type === "category")
      for (const v of c.raw) if (typeof v === "string" && !categories.includes(v)) categories.push(v);
    let range: [number, number] | null = null;
    const given = Array.isArray(spec.range) ? spec.range.map((v) => num(v)) : null;
    const matched = typeof spec.matches === "string" ? axes.get(spec.matches) : undefined;
    if (matched) range = [...matched.range];
    else if (
      spec.autorange !== true &&
      given &&
      given[0] !== null &&
      given[1] !== null &&
      given[0] !== undefined &&
      given[1] !== undefined
    ) {
      range = [given[0], given[1]];
    } else if (type === "category") range = [-0.5, Math.max(0, categories.length - 1) + 0.5];
    else {
      // Matched axes share one range over both axes' data.
      const sharing = [...ids].filter((o) => specOf(o).matches === id).map((o) => col(o));
      const all = [c, ...sharing];
      const values = all.flatMap((a) => a.values);
      const scaled = type === "log" ? values.filter((v) => v > 0).map(Math.log10) : values;
      range =
        autorange(scaled, {
          padLo: all.some((a) => a.padLo),
          padHi: all.some((a) => a.padHi),
          tozero: type !== "log" && (all.some((a) => a.tozero) || spec.rangemode === "tozero"),
        }) ?? (type === "log" ? [0, 1] : [-1, 1]);
      // Annotation positions are on the axis' scale already (log10 on a log axis).
      const pads = all.flatMap((a) => a.pads);
      let r: [number, number] = range;
      for (let pass = 0; pass < 3 && pads.length > 0; pass++) {
        const perPx: number = (r[1] - r[0]) / Math.max(1, length);
        for (const p of pads) r = [Math.min(r[0], p.at - p.px * perPx), Math.max(r[1], p.at + p.px * perPx)];
      }
      range = r;
    }
    axes.set(id, { id, letter, type, spec, range, start, length, categories, ticks: [] });
  }
  // Equal scales (pole map): widen the range of the axis with more pixels per unit.
  for (const ax of axes.values()) {
    const other = typeof ax.spec.scaleanchor === "string" ? axes.get(ax.spec.scaleanchor) : undefined;
    if (!other) continue;
    const pa = ax.length / Math.abs(ax.range[1] - ax.range[0]);
    const pb = other.length / Math.abs(other.range[1] - other.range[0]);
    const widen = pa > pb ? ax : other;
    const target = Math.min(pa, pb);
    const mid = (widen.range[0] + widen.range[1]) / 2;
    const half = widen.length / target / 2;
    widen.range = widen.range[1] >= widen.range[0] ? [mid - half, mid + half] : [mid + half, mid - half];
  }
  for (const ax of axes.values()) {
    const [a, b] = ax.range;
    const lo = Math.min(a, b);
    const hi = Math.max(a, b);
    const s = ax.spec;
    if (Array.isArray(s.tickvals)) ax.ticks = givenTicks(ax.type, s.tickvals, s.ticktext as unknown[]);
    else if (ax.type === "category") ax.ticks = ax.categories.map((label, i) => ({ at: i, label }));
    else if (ax.type === "log") ax.ticks = logTicks(lo, hi, s, ax.length, ax.letter);
    else ax.ticks = linearTicks(lo, hi, s, ax.length, ax.letter);
    ax.ticks = ax.ticks.filter((t) => t.at >= lo - 1e-9 && t.at <= hi + 1e-9);
  }
  return axes;
}
