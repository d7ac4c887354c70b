/**
 * The static chart's scene (what static-figure.tsx draws) and the small helpers its layout steps share:
 * loose readers of the figure object, text and dash conversions, and an axis' value → pixel mapping.
 */
import { plotFonts } from "./palette";
import type { AxisSpec, AxisType, Tick } from "./static-axes";

export type Obj = Record<string, unknown>;

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

/** The figure's font (layout.font, with the library's defaults). */
export interface SceneFont {
  family: string;
  size: number;
  color: string;
}

export interface Scene {
  width: number;
  height: number;
  font: SceneFont;
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

/** A figure's text where its layout names none: our type, as the chart wrapper (plotly-chart.tsx) sets it. */
export const PLOT_DEFAULTS = { family: plotFonts.sans, size: 12, color: "#444" };

export const num = (v: unknown): number | null => (typeof v === "number" && Number.isFinite(v) ? v : null);
export const obj = (v: unknown): Obj => (v && typeof v === "object" ? (v as Obj) : {});
export const str = (v: unknown, d: string): string => (typeof v === "string" ? v : d);

/** The library's "x2" → "xaxis2". */
export const axisKey = (ref: string) => `${ref[0]}axis${ref.slice(1)}`;

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

/** The plot area inside the margins, px. */
export interface PlotBox {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** The figure's margins, px (the legend and title may grow them). */
export interface Margin {
  l: number;
  r: number;
  t: number;
  b: number;
}
