/**
 * A plotly-style figure (data + layout) laid out as plain shapes for a static SVG (static-figure.tsx),
 * drawn from the very same figure object the interactive chart gets, so the page shows the plot before
 * the charting library has loaded. Covers what our figures use: cartesian subplots (domains, overlaying
 * right-hand axes, matched axes), log/linear/category axes, line and marker scatter traces (null = a
 * gap), bars, line/rect shapes, annotations, a horizontal legend and a title. Pure: no DOM, no library.
 *
 * The steps live beside it: static-scene-types.ts (the scene and shared helpers), static-traces.ts,
 * static-ranges.ts (axes and their ranges), static-axis-items.ts (grid, ticks, titles), static-decor.ts
 * (shapes, annotations, title) and static-legend.ts.
 */
import { addAxisItems, addSubplots } from "./static-axis-items";
import { annotationItems, shapeItems, titleItem } from "./static-decor";
import { legendItems, planLegend } from "./static-legend";
import { axisIds, axisSpec, buildAxes, collectAxisData } from "./static-ranges";
import {
  estimateText,
  type MeasureText,
  num,
  type Obj,
  obj,
  PLOT_DEFAULTS,
  type Scene,
  type StaticFigureInput,
  str,
} from "./static-scene-types";
import { traceInfo, traceItems } from "./static-traces";

export {
  type AxisModel,
  dashArray,
  estimateText,
  type LegendItem,
  type LineItem,
  type MarkerItem,
  type MeasureText,
  plainText,
  type RectItem,
  type Scene,
  type StaticFigureInput,
  scalePx,
  type TextItem,
  type TraceItem,
  toPx,
} from "./static-scene-types";
export { linePath, symbolPath } from "./static-traces";

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
  const ids = axisIds(layout, traces);

  // Margins, then the legend pushes them (the library grows margins to fit its legend).
  const m = obj(layout.margin);
  const margin = { l: num(m.l) ?? 80, r: num(m.r) ?? 80, t: num(m.t) ?? 100, b: num(m.b) ?? 80 };
  const legend = planLegend(layout, traces, font, width, height, margin, measure);
  const plot = {
    x: margin.l,
    y: margin.t,
    w: Math.max(10, width - margin.l - margin.r),
    h: Math.max(10, height - margin.t - margin.b),
  };

  const shapes = (Array.isArray(layout.shapes) ? layout.shapes : []).map(obj);
  const annotations = (Array.isArray(layout.annotations) ? layout.annotations : []).map(obj);
  const col = collectAxisData(traces, shapes, annotations, bargap, font, measure);
  const axes = buildAxes(ids, (id) => axisSpec(layout, id), col, plot);

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
  const clipOf = addSubplots(scene, axes, traces, layout);
  addAxisItems(scene, axes, plot, measure);
  const { below, above } = shapeItems(shapes, axes, plot);
  scene.below.push(...below);
  scene.above.push(...above);
  scene.traces.push(...traceItems(traces, axes, clipOf, bargap));
  scene.texts.push(...annotationItems(annotations, axes, plot, font, measure));
  const title = titleItem(layout, font, width, margin);
  if (title) scene.texts.push(title);
  scene.legend.push(...legendItems(legend, plot, width, margin, measure));
  return scene;
}
