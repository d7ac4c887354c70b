/**
 * The static chart's legend: horizontal rows of entries (a sample and the trace's name), wrapped to the
 * plot's width; its height grows the top or bottom margin, as the library grows margins to fit it.
 */
import {
  dashArray,
  type LegendItem,
  type Margin,
  type MeasureText,
  num,
  type Obj,
  obj,
  type PlotBox,
  plainText,
  str,
} from "./static-scene-types";
import { symbolPath, type TraceInfo } from "./static-traces";

/** The legend's entries and extent, worked out before the plot area is known. */
export interface LegendPlan {
  spec: Obj;
  font: { size: number; color: string };
  family: string;
  traces: TraceInfo[];
  /** Row height, px. */
  rowH: number;
  rows: number;
  /** Height of the legend box, px. */
  box: number;
  y: number;
  yanchor: string;
}

/** Each entry: a 40 px sample, the name, a small gap (as the library spaces them). */
function entryWidth(t: TraceInfo, size: number, family: string, measure: MeasureText): number {
  return 40 + measure(plainText(str(t.t.name, `trace ${t.index}`)).text, size, family) + 6;
}

/** Sizes the legend at `width` × `height` px and grows `margin` (in place) until it fits. */
export function planLegend(
  layout: Obj,
  traces: readonly TraceInfo[],
  font: { family: string; size: number; color: string },
  width: number,
  height: number,
  margin: Margin,
  measure: MeasureText,
): LegendPlan {
  const legendSpec = obj(layout.legend);
  const legendFont = {
    size: num(obj(legendSpec.font).size) ?? font.size,
    color: str(obj(legendSpec.font).color, font.color),
  };
  const legendTraces = traces.filter((t) => t.t.showlegend !== false);
  const showLegend = layout.showlegend === true || (layout.showlegend !== false && legendTraces.length > 1);
  const rowH = Math.max(16, legendFont.size * 1.3) + 3;
  let legendRows = 0;
  if (showLegend && legendTraces.length > 0) {
    const avail = Math.max(100, width - margin.l - margin.r);
    let x = 0;
    legendRows = 1;
    for (const t of legendTraces) {
      const w = entryWidth(t, legendFont.size, font.family, measure);
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
  return {
    spec: legendSpec,
    font: legendFont,
    family: font.family,
    traces: legendTraces,
    rowH,
    rows: legendRows,
    box: legendBox,
    y: legendY,
    yanchor: legendYAnchor,
  };
}

/** The legend's entries, laid out in rows from the plot's left edge. */
export function legendItems(
  plan: LegendPlan,
  plot: PlotBox,
  width: number,
  margin: Margin,
  measure: MeasureText,
): LegendItem[] {
  const items: LegendItem[] = [];
  const { spec: legendSpec, font: legendFont, traces: legendTraces, rowH, rows: legendRows } = plan;
  const { box: legendBox, y: legendY, yanchor: legendYAnchor } = plan;
  if (legendRows > 0) {
    const lx = plot.x + (num(legendSpec.x) ?? 0) * plot.w;
    const anchorY = plot.y + plot.h - legendY * plot.h;
    const top = legendYAnchor === "top" ? anchorY : anchorY - legendBox;
    const avail = Math.max(100, width - margin.l - margin.r);
    let x = 0;
    let row = 0;
    for (const t of legendTraces) {
      const w = entryWidth(t, legendFont.size, plan.family, measure);
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
      items.push(item);
      x += w;
    }
  }
  return items;
}
