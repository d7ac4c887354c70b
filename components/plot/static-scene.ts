/**
 * A plotly-style figure (data + layout) laid out as plain shapes for a static SVG (static-figure.tsx),
 * drawn from the very same figure object the interactive chart gets, so the page shows the plot before
 * the charting library has loaded. Covers what our figures use: cartesian subplots (domains, overlaying
 * right-hand axes, matched axes), log/linear/category axes, line and marker scatter traces (null = a
 * gap), bars, line/rect shapes, annotations, a horizontal legend and a title. Pure: no DOM, no library.
 */
import { type AxisSpec, type AxisType, givenTicks, linearTicks, logTicks, type Tick } from "./static-axes";

type Obj = Record<string, unknown>;

/** The figure as the interactive chart gets it (plotly's `Data[]` and `Partial<Layout>`, loosely typed). */
export interface StaticFigureInput {
  data: readonly object[];
  layout: object;
}

export interface TextItem {
  x: number;
  y: number;
  text: string;
  size: number;
  color: string;
  family?: string;
  anchor: "start" | "middle" | "end";
  bold?: boolean;
  /** Degrees (−90: reads bottom to top). */
  rotate?: number;
  /** A filled box behind the text. */
  box?: { x: number; y: number; w: number; h: number; fill: string };
}

export interface LineItem {
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  color: string;
  width: number;
  dash?: string;
  opacity?: number;
}

export interface RectItem {
  x: number;
  y: number;
  w: number;
  h: number;
  fill: string;
  stroke?: string;
  strokeWidth?: number;
  opacity?: number;
}

export interface MarkerItem {
  x: number;
  y: number;
  /** Path of the symbol centred on 0,0. */
  d: string;
  fill: string;
  stroke: string;
  strokeWidth: number;
}

export interface TraceItem {
  /** Index of the trace in `data`. */
  index: number;
  clip: number;
  /** The polyline (several "M…L…" runs when there are gaps); empty when the trace draws none. */
  path: string;
  color: string;
  width: number;
  dash?: string;
  markers: MarkerItem[];
  bars: RectItem[];
}

export interface LegendItem {
  x: number;
  y: number;
  text: string;
  size: number;
  color: string;
  /** The sample: a line segment (with dash) or a marker symbol. */
  line?: { color: string; width: number; dash?: string };
  marker?: MarkerItem;
  bar?: string;
}

export interface Scene {
  width: number;
  height: number;
  font: { family: string; size: number; color: string };
  /** Clip rectangles of the subplots, by index. */
  clips: RectItem[];
  plotBgs: RectItem[];
  grid: LineItem[];
  zero: LineItem[];
  /** Axis lines (where an axis has a line colour). */
  axisLines: LineItem[];
  below: (LineItem | RectItem)[];
  traces: TraceItem[];
  above: (LineItem | RectItem)[];
  texts: TextItem[];
  legend: LegendItem[];
  /** Each axis as laid out (type, range on its scale, ticks), by id ("x", "y2" …). */
  axes: Record<string, Pick<AxisModel, "type" | "range" | "ticks" | "start" | "length">>;
}

/** Width of a text in px; the default guesses from the character count (the client measures). */
export type MeasureText = (text: string, size: number, family: string) => number;
export const estimateText: MeasureText = (text, size) => text.length * size * 0.56;

const PLOT_DEFAULTS = { family: '"Open Sans", verdana, arial, sans-serif', size: 12, color: "#444" };

const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
const obj = (v: unknown): Obj => (v && typeof v === "object" ? (v as Obj) : {});
const str = (v: unknown, d: string): string => (typeof v === "string" ? v : d);

/** The library's "x2" → "xaxis2". */
const axisKey = (ref: string) => `${ref[0]}axis${ref.slice(1)}`;

/** Text as the library shows it: our `<b>`/`<br>` markup out, entities back to characters. */
export function plainText(html: string): { text: string; bold: boolean } {
  const bold = /<b>/i.test(html);
  const text = html
    .replace(/<br\s*\/?>/gi, " ")
    .replace(/<[^>]*>/g, "")
    .replaceAll("&lt;", "<")
    .replaceAll("&gt;", ">")
    .replaceAll("&quot;", '"')
    .replaceAll("&#39;", "'")
    .replaceAll("&amp;", "&");
  return { text, bold };
}

/** The library's dash patterns, scaled by the line width (at least 3 px). */
export function dashArray(dash: unknown, width: number): string | undefined {
  const w = Math.max(width, 3);
  switch (dash) {
    case "dot":
      return `${w},${w}`;
    case "dash":
      return `${3 * w},${3 * w}`;
    case "longdash":
      return `${5 * w},${5 * w}`;
    case "dashdot":
      return `${3 * w},${w},${w},${w}`;
    case "longdashdot":
      return `${5 * w},${2 * w},${w},${2 * w}`;
    default:
      return typeof dash === "string" && /^[\d.,\spx]+$/.test(dash) ? dash.replaceAll("px", "") : undefined;
  }
}

const r2 = (v: number) => Math.round(v * 100) / 100;

/** A marker symbol's outline, centred on 0,0, for a marker `size` px across. */
export function symbolPath(symbol: string, size: number): string {
  const r = size / 2;
  const base = symbol.replace(/-open$/, "");
  switch (base) {
    case "square":
      return `M${r2(r)},${r2(r)}H${r2(-r)}V${r2(-r)}H${r2(r)}Z`;
    case "diamond": {
      const d = r2(r * 1.3);
      return `M${d},0L0,${d}L${-d},0L0,${-d}Z`;
    }
    case "triangle-up": {
      const t = r2((r * 2) / Math.sqrt(3));
      const h = r2(r / 2);
      return `M${-t},${h}H${t}L0,${r2(-r)}Z`;
    }
    case "x-thin": {
      const x = r2(r);
      return `M${x},${x}L${-x},${-x}M${x},${-x}L${-x},${x}`;
    }
    case "star": {
      const pts: string[] = [];
      for (let i = 0; i < 10; i++) {
        const rr = i % 2 === 0 ? r * 1.2 : r * 0.5;
        const a = (Math.PI / 5) * i - Math.PI / 2;
        pts.push(`${r2(rr * Math.cos(a))},${r2(rr * Math.sin(a))}`);
      }
      return `M${pts.join("L")}Z`;
    }
    default:
      return `M${r2(r)},0A${r2(r)},${r2(r)} 0 1,1 0,${r2(-r)}A${r2(r)},${r2(r)} 0 0,1 ${r2(r)},0Z`;
  }
}

/** One axis, laid out: its scale (log10 on a log axis), its pixel span and its ticks. */
export interface AxisModel {
  id: string;
  letter: "x" | "y";
  type: AxisType;
  spec: AxisSpec & Obj;
  /** Range on the axis' scale, [start, end]. */
  range: [number, number];
  /** Pixel position of the range's start and its length (y grows downward: start = bottom). */
  start: number;
  length: number;
  categories: string[];
  ticks: Tick[];
}

/** Where a value lands on the axis (null when it cannot be drawn, e.g. ≤ 0 on a log axis). */
export function toPx(ax: AxisModel, value: unknown): number | null {
  let v: number | null;
  if (ax.type === "category") {
    const i = typeof value === "string" ? ax.categories.indexOf(value) : -1;
    v = i >= 0 ? i : num(value);
  } else if (ax.type === "log") {
    const n = num(value);
    v = n !== null && n > 0 ? Math.log10(n) : null;
  } else v = num(value);
  return v === null ? null : scalePx(ax, v);
}

/** Pixel of a position already on the axis' scale (log10 on a log axis). */
export function scalePx(ax: AxisModel, at: number): number {
  const [a, b] = ax.range;
  const f = b === a ? 0.5 : (at - a) / (b - a);
  return ax.letter === "x" ? ax.start + f * ax.length : ax.start - f * ax.length;
}

function axisType(spec: Obj, values: unknown[]): AxisType {
  if (spec.type === "log") return "log";
  if (spec.type === "category") return "category";
  if (spec.type === "linear") return "linear";
  const first = values.find((v) => v !== null && v !== undefined);
  return typeof first === "string" ? "category" : "linear";
}

interface TraceInfo {
  index: number;
  t: Obj;
  type: string;
  xref: string;
  yref: string;
  x: unknown[];
  y: unknown[];
  horizontal: boolean;
}

function traceInfo(t: Obj, index: number): TraceInfo {
  const type = str(t.type, "scatter");
  const y = Array.isArray(t.y) ? (t.y as unknown[]) : [];
  let x = Array.isArray(t.x) ? (t.x as unknown[]) : [];
  if (x.length === 0 && y.length > 0) x = y.map((_, i) => i);
  return {
    index,
    t,
    type,
    xref: str(t.xaxis, "x"),
    yref: str(t.yaxis, "y"),
    x,
    y,
    horizontal: type === "bar" && t.orientation === "h",
  };
}

/** Bar positions and spans: explicit widths, or 0.8 of the closest spacing. */
function barGeometry(tr: TraceInfo, bargap: number) {
  const pos = tr.horizontal ? tr.y : tr.x;
  const val = tr.horizontal ? tr.x : tr.y;
  const w = tr.t.width;
  const numeric = pos.map((p) => num(p));
  let step = 1;
  const sorted = numeric.filter((p): p is number => p !== null).sort((a, b) => a - b);
  for (let i = 1; i < sorted.length; i++) {
    const d = sorted[i]! - sorted[i - 1]!;
    if (d > 0) step = i === 1 ? d : Math.min(step, d);
  }
  const width = (i: number) =>
    Array.isArray(w) ? (num(w[i]) ?? step * (1 - bargap)) : (num(w) ?? step * (1 - bargap));
  // The slot a bar sits in (what the auto range spans): its own width when given, else the spacing.
  const slot = (i: number) => (Array.isArray(w) || num(w) !== null ? width(i) : step);
  const base = num(tr.t.base) ?? 0;
  return { pos, val, width, slot, base };
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

interface Collected {
  values: number[];
  /** Positions (on the axis' scale) that need this many pixels clear on each side (annotation text). */
  pads: { at: number; px: number }[];
  padLo: boolean;
  padHi: boolean;
  tozero: boolean;
  categories: string[];
  raw: unknown[];
}

/** Lays the figure out at `width` × `height` px. */
export function layoutScene(
  figure: StaticFigureInput,
  width: number,
  height: number,
  measure: MeasureText = estimateText,
): Scene {
  const layout = figure.layout as Obj;
  const fontIn = obj(layout.font);
  const font = {
    family: str(fontIn.family, PLOT_DEFAULTS.family),
    size: num(fontIn.size) ?? PLOT_DEFAULTS.size,
    color: str(fontIn.color, PLOT_DEFAULTS.color),
  };
  const traces = figure.data.map((t, i) => traceInfo(obj(t), i)).filter((t) => t.t.visible !== false);
  const bargap = num(layout.bargap) ?? 0.2;

  // Axes in use: every axis key in the layout and every axis a trace refers to.
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
  const specOf = (id: string) => obj(layout[axisKey(id)]) as AxisSpec & Obj;

  // Margins, then the legend and title push them (the library grows margins to fit its legend).
  const m = obj(layout.margin);
  const margin = { l: num(m.l) ?? 80, r: num(m.r) ?? 80, t: num(m.t) ?? 100, b: num(m.b) ?? 80 };
  const legendSpec = obj(layout.legend);
  const legendFont = {
    size: num(obj(legendSpec.font).size) ?? font.size,
    color: str(obj(legendSpec.font).color, font.color),
  };
  const legendTraces = traces.filter((t) => t.t.showlegend !== false);
  const showLegend = layout.showlegend === true || (layout.showlegend !== false && legendTraces.length > 1);
  // Each entry: a 40 px sample, the name, a small gap (as the library spaces them).
  const entryWidth = (t: TraceInfo) =>
    40 + measure(plainText(str(t.t.name, `trace ${t.index}`)).text, legendFont.size, font.family) + 6;
  const rowH = Math.max(16, legendFont.size * 1.3) + 3;
  let legendRows = 0;
  if (showLegend && legendTraces.length > 0) {
    const avail = Math.max(100, width - margin.l - margin.r);
    let x = 0;
    legendRows = 1;
    for (const t of legendTraces) {
      const w = entryWidth(t);
      if (x > 0 && x + w > avail) {
        legendRows++;
        x = 0;
      }
      x += w;
    }
  }
  // The legend box (rows, 5 px padding above and below) plus the 12 px the library keeps clear of the edge.
  const legendBox = legendRows > 0 ? legendRows * rowH + 10 : 0;
  const legendH = legendRows > 0 ? legendBox + 12 : 0;
  const legendY = num(legendSpec.y) ?? 1;
  const legendYAnchor = str(legendSpec.yanchor, legendY < 0 ? "top" : "bottom");
  if (legendH > 0) {
    if (legendY <= 0 && legendYAnchor === "top") {
      // Legend top at bottom + |y|·plotH below the plot: grow b until it fits.
      const need = (legendH + -legendY * (height - margin.t)) / (1 + -legendY);
      margin.b = Math.max(margin.b, need);
    } else if (legendY >= 1 && legendYAnchor === "bottom") {
      const need = (legendH + (legendY - 1) * (height - margin.b)) / (1 + (legendY - 1));
      margin.t = Math.max(margin.t, need);
    }
  }
  const plot = {
    x: margin.l,
    y: margin.t,
    w: Math.max(10, width - margin.l - margin.r),
    h: Math.max(10, height - margin.t - margin.b),
  };

  // Gather each axis' data: trace values, bar extents, shapes on data axes.
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
  const shapes = (Array.isArray(layout.shapes) ? layout.shapes : []).map(obj);
  for (const s of shapes) {
    const xr = str(s.xref, "x");
    const yr = str(s.yref, "y");
    if (xr !== "paper")
      for (const k of ["x0", "x1"]) if (num(s[k]) !== null) col(xr).values.push(s[k] as number);
    if (yr !== "paper")
      for (const k of ["y0", "y1"]) if (num(s[k]) !== null) col(yr).values.push(s[k] as number);
  }

  // Annotations on data axes stretch the auto range until their text fits (half its size each side).
  const annotations = (Array.isArray(layout.annotations) ? layout.annotations : []).map(obj);
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

  // Build the axes: type, pixel span, range.
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

  const scene: Scene = {
    width,
    height,
    font,
    clips: [],
    plotBgs: [],
    grid: [],
    zero: [],
    axisLines: [],
    below: [],
    traces: [],
    above: [],
    texts: [],
    legend: [],
    axes: Object.fromEntries(
      [...axes.values()].map((a) => [
        a.id,
        { type: a.type, range: a.range, ticks: a.ticks, start: a.start, length: a.length },
      ]),
    ),
  };

  // Subplots: each (x, y) pair a trace or an axis anchor names.
  const subplotKey = (x: string, y: string) => `${x}|${y}`;
  const subplots = new Map<string, number>();
  const addSubplot = (x: string, y: string) => {
    const k = subplotKey(x, y);
    if (subplots.has(k)) return subplots.get(k)!;
    const xa = axes.get(x);
    const ya = axes.get(y);
    if (!xa || !ya) return -1;
    const i = scene.clips.length;
    scene.clips.push({ x: xa.start, y: ya.start - ya.length, w: xa.length, h: ya.length, fill: "none" });
    subplots.set(k, i);
    return i;
  };
  for (const t of traces) addSubplot(t.xref, t.yref);
  for (const ax of axes.values()) {
    if (ax.letter === "x") addSubplot(ax.id, str(ax.spec.anchor, "y"));
  }
  const plotBg = str(layout.plot_bgcolor, "#fff");
  for (const ax of axes.values()) {
    if (ax.letter !== "y" || ax.spec.overlaying) continue;
    const xs = [...axes.values()].filter((x) => x.letter === "x" && str(x.spec.anchor, "y") === ax.id);
    const xa = xs[0] ?? axes.get("x");
    if (xa)
      scene.plotBgs.push({ x: xa.start, y: ax.start - ax.length, w: xa.length, h: ax.length, fill: plotBg });
  }

  // Grid, zero lines, tick labels and titles of each axis.
  for (const ax of axes.values()) {
    const s = ax.spec;
    const counter = ax.letter === "x" ? axes.get(str(s.anchor, "y")) : undefined;
    const ys =
      ax.letter === "y"
        ? [...axes.values()].filter((x) => x.letter === "x" && str(x.spec.anchor, "y") === ax.id)
        : [];
    const crossX = ax.letter === "y" ? (ys[0] ?? axes.get("x")) : undefined;
    const span =
      ax.letter === "x"
        ? counter
          ? [counter.start - counter.length, counter.start]
          : [plot.y, plot.y + plot.h]
        : crossX
          ? [crossX.start, crossX.start + crossX.length]
          : [plot.x, plot.x + plot.w];
    const gridColor = str(s.gridcolor, "#eee");
    const showGrid = s.showgrid !== false && !s.overlaying;
    const tf = obj(s.tickfont);
    const tickSize = num(tf.size) ?? font.size;
    const tickColor = str(tf.color, font.color);
    const tickFamily = str(tf.family, font.family);
    const right = s.side === "right";
    let widest = 0;
    for (const t of ax.ticks) {
      const p = scalePx(ax, t.at);
      if (showGrid) {
        scene.grid.push(
          ax.letter === "x"
            ? { x1: p, y1: span[0]!, x2: p, y2: span[1]!, color: gridColor, width: 1 }
            : { x1: span[0]!, y1: p, x2: span[1]!, y2: p, color: gridColor, width: 1 },
        );
      }
      if (s.showticklabels === false) continue;
      const size = t.minor ? tickSize * 0.75 : tickSize;
      const label = t.label.replace(/^-/, "−");
      widest = Math.max(widest, measure(label, size, tickFamily));
      scene.texts.push(
        ax.letter === "x"
          ? {
              x: p,
              y: span[1]! + 3 + size,
              text: label,
              size,
              color: tickColor,
              family: tickFamily,
              anchor: "middle",
            }
          : {
              x: right ? span[1]! + 3 : span[0]! - 3,
              y: p + size * 0.35,
              text: label,
              size,
              color: tickColor,
              family: tickFamily,
              anchor: right ? "start" : "end",
            },
      );
    }
    // The library draws the axis line whenever a line colour is given (showline defaults to it).
    const lineColor = typeof s.linecolor === "string" ? s.linecolor : null;
    if (s.showline === true || (s.showline !== false && lineColor)) {
      const lw = num(s.linewidth) ?? 1;
      const color = lineColor ?? "#444";
      if (ax.letter === "x") {
        const y = s.side === "top" ? span[0]! - lw / 2 : span[1]! + lw / 2;
        scene.axisLines.push({
          x1: ax.start - lw,
          y1: y,
          x2: ax.start + ax.length + lw,
          y2: y,
          color,
          width: lw,
        });
      } else {
        const x = right ? span[1]! + lw / 2 : span[0]! - lw / 2;
        scene.axisLines.push({ x1: x, y1: ax.start, x2: x, y2: ax.start - ax.length, color, width: lw });
      }
    }
    const [lo, hi] = [Math.min(...ax.range), Math.max(...ax.range)];
    if (ax.type === "linear" && s.zeroline !== false && 0 >= lo && 0 <= hi) {
      const p = scalePx(ax, 0);
      const color = str(s.zerolinecolor, "#444");
      scene.zero.push(
        ax.letter === "x"
          ? { x1: p, y1: span[0]!, x2: p, y2: span[1]!, color, width: 1 }
          : { x1: span[0]!, y1: p, x2: span[1]!, y2: p, color, width: 1 },
      );
    }
    const title = obj(s.title);
    const titleText = typeof s.title === "string" ? s.title : str(title.text, "");
    if (titleText) {
      const titleFont = obj(title.font);
      const size = num(titleFont.size) ?? Math.round(font.size * 1.2);
      const color = str(titleFont.color, font.color);
      const { text, bold } = plainText(titleText);
      if (ax.letter === "x") {
        const labelled = s.showticklabels !== false && ax.ticks.length > 0;
        scene.texts.push({
          x: ax.start + ax.length / 2,
          // The library sets the title's top two tick-label heights and 10 px below the plot.
          y: span[1]! + (labelled ? 2 * tickSize : 4) + 10 + size * 0.8,
          text,
          bold,
          size,
          color,
          family: font.family,
          anchor: "middle",
        });
      } else {
        // A right-hand (overlaying Δ) axis' title sits close to the plot, as the library places it;
        // the left one clear of the widest tick label. Both kept inside the figure.
        const edge = right
          ? Math.min(span[1]! + 17 + size, width - 2)
          : Math.max(span[0]! - widest - 11, size);
        scene.texts.push({
          x: edge,
          y: ax.start - ax.length / 2,
          text,
          bold,
          size,
          color,
          family: font.family,
          anchor: "middle",
          rotate: -90,
        });
      }
    }
  }

  // Shapes: vertical lines, limits, bands (on data or paper coordinates).
  const px = (ref: string, v: unknown, letter: "x" | "y"): number | null => {
    if (ref === "paper") {
      const n = num(v);
      if (n === null) return null;
      return letter === "x" ? plot.x + n * plot.w : plot.y + plot.h - n * plot.h;
    }
    const ax = axes.get(ref);
    return ax ? toPx(ax, v) : null;
  };
  for (const s of shapes) {
    const xr = str(s.xref, "x");
    const yr = str(s.yref, "y");
    const x0 = px(xr, s.x0, "x");
    const x1 = px(xr, s.x1, "x");
    const y0 = px(yr, s.y0, "y");
    const y1 = px(yr, s.y1, "y");
    if (x0 === null || x1 === null || y0 === null || y1 === null) continue;
    const line = obj(s.line);
    const lw = num(line.width) ?? 2;
    const opacity = num(s.opacity) ?? undefined;
    const target = s.layer === "below" ? scene.below : scene.above;
    if (s.type === "rect") {
      target.push({
        x: Math.min(x0, x1),
        y: Math.min(y0, y1),
        w: Math.abs(x1 - x0),
        h: Math.abs(y1 - y0),
        fill: str(s.fillcolor, "rgba(0,0,0,0)"),
        stroke: lw > 0 ? str(line.color, "#444") : undefined,
        strokeWidth: lw > 0 ? lw : undefined,
        opacity,
      });
    } else if (s.type === "line" || s.type === undefined) {
      target.push({
        x1: x0,
        y1: y0,
        x2: x1,
        y2: y1,
        color: str(line.color, "#444"),
        width: lw,
        dash: dashArray(line.dash, lw),
        opacity,
      });
    }
  }

  // Traces.
  for (const tr of traces) {
    const xa = axes.get(tr.xref);
    const ya = axes.get(tr.yref);
    const clip = subplots.get(subplotKey(tr.xref, tr.yref)) ?? -1;
    if (!xa || !ya) continue;
    const t = tr.t;
    const line = obj(t.line);
    const marker = obj(t.marker);
    const item: TraceItem = {
      index: tr.index,
      clip,
      path: "",
      color: str(line.color, str(marker.color, "#444")),
      width: num(line.width) ?? 2,
      dash: dashArray(line.dash, num(line.width) ?? 2),
      markers: [],
      bars: [],
    };
    if (tr.type === "bar") {
      const g = barGeometry(tr, bargap);
      const mline = obj(marker.line);
      g.pos.forEach((p, i) => {
        const v = num(g.val[i]);
        if (v === null) return;
        const w = g.width(i);
        const pa = tr.horizontal ? ya : xa;
        const va = tr.horizontal ? xa : ya;
        const c = pa.type === "category" && typeof p === "string" ? pa.categories.indexOf(p) : num(p);
        if (c === null || c < 0) return;
        const p0 = scalePx(pa, c - w / 2);
        const p1 = scalePx(pa, c + w / 2);
        const v0 = toPx(va, g.base);
        const v1 = toPx(va, g.base + v);
        if (v0 === null || v1 === null) return;
        const fill = Array.isArray(marker.color) ? str(marker.color[i], "#444") : str(marker.color, "#444");
        const rect = tr.horizontal
          ? { x: Math.min(v0, v1), y: Math.min(p0, p1), w: Math.abs(v1 - v0), h: Math.abs(p1 - p0) }
          : { x: Math.min(p0, p1), y: Math.min(v0, v1), w: Math.abs(p1 - p0), h: Math.abs(v1 - v0) };
        item.bars.push({
          ...rect,
          fill,
          stroke: num(mline.width) ? str(mline.color, "#fff") : undefined,
          strokeWidth: num(mline.width) ?? undefined,
        });
      });
      item.color = Array.isArray(marker.color) ? str(marker.color[0], "#444") : str(marker.color, "#444");
      scene.traces.push(item);
      continue;
    }
    const mode = str(t.mode, tr.x.length > 20 ? "lines" : "lines+markers");
    if (mode.includes("lines")) item.path = linePath(tr.x, tr.y, xa, ya, t.connectgaps === true);
    if (mode.includes("markers")) {
      const size = num(marker.size) ?? 6;
      const symbol = str(marker.symbol, "circle");
      const open = symbol.endsWith("-open") || symbol.includes("thin");
      const mline = obj(marker.line);
      const d = symbolPath(symbol, size);
      for (let i = 0; i < tr.x.length; i++) {
        const x = toPx(xa, tr.x[i]);
        const y = toPx(ya, tr.y[i]);
        if (x === null || y === null) continue;
        const color = Array.isArray(marker.color) ? str(marker.color[i], "#444") : str(marker.color, "#444");
        const lineColor = Array.isArray(mline.color) ? str(mline.color[i], color) : str(mline.color, color);
        item.markers.push({
          x,
          y,
          d,
          fill: open ? "none" : color,
          stroke: open ? lineColor : str(mline.color, "none"),
          strokeWidth: num(mline.width) ?? (open ? 1 : 0),
        });
      }
      if (!mode.includes("lines")) item.color = str(marker.color, "#444");
    }
    scene.traces.push(item);
  }

  // Annotations (marker labels, cursor letters, limit labels).
  for (const a of annotations) {
    const xr = str(a.xref, "x");
    const yr = str(a.yref, "y");
    const axX = axes.get(xr);
    const axY = axes.get(yr);
    // On a log axis an annotation's x is already log10 of the value.
    const x =
      xr === "paper"
        ? px("paper", a.x, "x")
        : axX
          ? num(a.x) === null
            ? null
            : axX.type === "log"
              ? scalePx(axX, a.x as number)
              : toPx(axX, a.x)
          : null;
    const y =
      yr === "paper"
        ? px("paper", a.y, "y")
        : axY
          ? num(a.y) === null
            ? null
            : axY.type === "log"
              ? scalePx(axY, a.y as number)
              : toPx(axY, a.y)
          : null;
    if (x === null || y === null) continue;
    const f = obj(a.font);
    const size = num(f.size) ?? font.size;
    const family = str(f.family, font.family);
    const { text, bold } = plainText(str(a.text, ""));
    const pad = num(a.borderpad) ?? 1;
    const w = measure(text, size, family) * (bold ? 1.06 : 1) + 2 * pad;
    const h = size * 1.3 + 2 * pad;
    const cy = y - (num(a.yshift) ?? 0);
    const yanchor = str(a.yanchor, "middle");
    const top = yanchor === "bottom" ? cy - h : yanchor === "top" ? cy : cy - h / 2;
    const xanchor = str(a.xanchor, "center");
    const left = xanchor === "left" ? x : xanchor === "right" ? x - w : x - w / 2;
    const bg = typeof a.bgcolor === "string" ? a.bgcolor : null;
    scene.texts.push({
      x: left + w / 2,
      y: top + pad + size * 1.0,
      text,
      bold,
      size,
      color: str(f.color, font.color),
      family,
      anchor: "middle",
      box: bg ? { x: left, y: top, w, h, fill: bg } : undefined,
    });
  }

  // Title (histograms).
  const title = obj(layout.title);
  const titleText = typeof layout.title === "string" ? layout.title : str(title.text, "");
  if (titleText) {
    const f = obj(title.font);
    const size = num(f.size) ?? Math.round(font.size * 1.4);
    const tx = num(title.x) ?? 0.5;
    scene.texts.push({
      x: tx * width,
      y: margin.t / 2 + size * 0.12,
      text: plainText(titleText).text,
      size,
      color: str(f.color, font.color),
      family: font.family,
      anchor: tx < 1 / 3 ? "start" : tx > 2 / 3 ? "end" : "middle",
    });
  }

  // Legend: horizontal rows from the plot's left edge.
  if (legendRows > 0) {
    const lx = plot.x + (num(legendSpec.x) ?? 0) * plot.w;
    const anchorY = plot.y + plot.h - legendY * plot.h;
    const top = legendYAnchor === "top" ? anchorY : anchorY - legendBox;
    const avail = Math.max(100, width - margin.l - margin.r);
    let x = 0;
    let row = 0;
    for (const t of legendTraces) {
      const w = entryWidth(t);
      if (x > 0 && x + w > avail) {
        row++;
        x = 0;
      }
      const cy = top + 5 + row * rowH + rowH / 2;
      const ox = lx + x;
      const line = obj(t.t.line);
      const marker = obj(t.t.marker);
      const mode = str(t.t.mode, "lines");
      const item: LegendItem = {
        x: ox + 40,
        y: cy + legendFont.size * 0.35,
        text: plainText(str(t.t.name, `trace ${t.index}`)).text,
        size: legendFont.size,
        color: legendFont.color,
      };
      if (t.type === "bar") item.bar = str(marker.color, "#444");
      else if (mode.includes("lines")) {
        const lw = Math.min(num(line.width) ?? 2, 5);
        item.line = { color: str(line.color, "#444"), width: lw, dash: dashArray(line.dash, lw) };
      }
      if (mode.includes("markers") && t.type !== "bar") {
        const symbol = str(marker.symbol, "circle");
        const open = symbol.endsWith("-open") || symbol.includes("thin");
        const mline = obj(marker.line);
        const color = str(marker.color, "#444");
        item.marker = {
          x: ox + 20,
          y: cy,
          d: symbolPath(symbol, Math.min(num(marker.size) ?? 6, 16)),
          fill: open ? "none" : color,
          stroke: open ? color : str(mline.color, "none"),
          strokeWidth: num(mline.width) ?? (open ? 1 : 0),
        };
      }
      scene.legend.push(item);
      x += w;
    }
  }
  return scene;
}

/**
 * The polyline of one trace: points in order, a run broken wherever a value is missing (null, or
 * ≤ 0 on a log axis) unless `connectGaps`; a single point between gaps draws nothing, as in the library.
 */
export function linePath(
  xs: readonly unknown[],
  ys: readonly unknown[],
  xa: AxisModel,
  ya: AxisModel,
  connectGaps = false,
): string {
  const runs: string[] = [];
  let run: string[] = [];
  const flush = () => {
    if (run.length > 1) runs.push(`M${run.join("L")}`);
    run = [];
  };
  const n = Math.min(xs.length, ys.length);
  for (let i = 0; i < n; i++) {
    const x = toPx(xa, xs[i]);
    const y = toPx(ya, ys[i]);
    if (x === null || y === null) {
      if (!connectGaps) flush();
      continue;
    }
    run.push(`${x.toFixed(1)},${y.toFixed(1)}`);
  }
  flush();
  return runs.join("");
}
