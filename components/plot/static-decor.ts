/**
 * Decorations of the static chart: shapes (vertical lines, limits, bands), annotations (marker labels,
 * cursor letters, limit labels) and the figure's title, on data or paper coordinates.
 */
import {
  type AxisModel,
  dashArray,
  type LineItem,
  type Margin,
  type MeasureText,
  num,
  type Obj,
  obj,
  type PlotBox,
  plainText,
  type RectItem,
  type SceneFont,
  scalePx,
  str,
  type TextItem,
  toPx,
} from "./static-scene-types";

/** A position on data (`ref` an axis id) or paper coordinates, in px; null when it cannot be drawn. */
function refPx(
  axes: ReadonlyMap<string, AxisModel>,
  plot: PlotBox,
  ref: string,
  v: unknown,
  letter: "x" | "y",
): number | null {
  if (ref === "paper") {
    const n = num(v);
    if (n === null) return null;
    return letter === "x" ? plot.x + n * plot.w : plot.y + plot.h - n * plot.h;
  }
  const ax = axes.get(ref);
  return ax ? toPx(ax, v) : null;
}

/**
 * `refPx` for an annotation: on an axis only a number places it, and on a log axis that number is
 * already log10 of the value.
 */
function annotationPx(
  axes: ReadonlyMap<string, AxisModel>,
  plot: PlotBox,
  ref: string,
  v: unknown,
  letter: "x" | "y",
): number | null {
  if (ref === "paper") return refPx(axes, plot, ref, v, letter);
  const ax = axes.get(ref);
  const n = num(v);
  if (!ax || n === null) return null;
  return ax.type === "log" ? scalePx(ax, n) : toPx(ax, v);
}

/** Shapes as lines and rectangles, split by layer (below or above the traces). */
export function shapeItems(
  shapes: readonly Obj[],
  axes: ReadonlyMap<string, AxisModel>,
  plot: PlotBox,
): { below: (LineItem | RectItem)[]; above: (LineItem | RectItem)[] } {
  const below: (LineItem | RectItem)[] = [];
  const above: (LineItem | RectItem)[] = [];
  const px = (ref: string, v: unknown, letter: "x" | "y") => refPx(axes, plot, ref, v, letter);
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
    const target = s.layer === "below" ? below : above;
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
  return { below, above };
}

/** The annotations' texts (with their boxes where they have a background). */
export function annotationItems(
  annotations: readonly Obj[],
  axes: ReadonlyMap<string, AxisModel>,
  plot: PlotBox,
  font: SceneFont,
  measure: MeasureText,
): TextItem[] {
  const texts: TextItem[] = [];
  for (const a of annotations) {
    const x = annotationPx(axes, plot, str(a.xref, "x"), a.x, "x");
    const y = annotationPx(axes, plot, str(a.yref, "y"), a.y, "y");
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
    texts.push({
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
  return texts;
}

/** The figure's title (histograms), centred over the top margin; null without one. */
export function titleItem(layout: Obj, font: SceneFont, width: number, margin: Margin): TextItem | null {
  const title = obj(layout.title);
  const titleText = typeof layout.title === "string" ? layout.title : str(title.text, "");
  if (!titleText) return null;
  const f = obj(title.font);
  const size = num(f.size) ?? Math.round(font.size * 1.4);
  const tx = num(title.x) ?? 0.5;
  return {
    x: tx * width,
    y: margin.t / 2 + size * 0.12,
    text: plainText(titleText).text,
    size,
    color: str(f.color, font.color),
    family: font.family,
    anchor: tx < 1 / 3 ? "start" : tx > 2 / 3 ? "end" : "middle",
  };
}
