/**
 * Axes of the static chart as drawn: the subplots (clip rectangles and backgrounds) and each axis' grid,
 * zero line, tick labels, axis line and title.
 */
import {
  type AxisModel,
  type MeasureText,
  num,
  type Obj,
  obj,
  type PlotBox,
  plainText,
  type Scene,
  scalePx,
  str,
} from "./static-scene-types";
import type { TraceInfo } from "./static-traces";

/**
 * Adds the subplots to `scene` (a clip rectangle for each (x, y) pair a trace or an axis anchor names,
 * a background for each row) and returns the clip index of an (x, y) pair (−1: none).
 */
export function addSubplots(
  scene: Scene,
  axes: ReadonlyMap<string, AxisModel>,
  traces: readonly TraceInfo[],
  layout: Obj,
): (x: string, y: string) => number {
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
  return (x, y) => subplots.get(subplotKey(x, y)) ?? -1;
}

/** Adds each axis' grid, zero line, tick labels, axis line and title to `scene`. */
export function addAxisItems(
  scene: Scene,
  axes: ReadonlyMap<string, AxisModel>,
  plot: PlotBox,
  measure: MeasureText,
): void {
  const { font, width } = scene;
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
      const item = { text, bold, size, color, family: font.family, anchor: "middle" as const };
      if (ax.letter === "x") {
        const labelled = s.showticklabels !== false && ax.ticks.length > 0;
        scene.texts.push({
          ...item,
          x: ax.start + ax.length / 2,
          // The library sets the title's top two tick-label heights and 10 px below the plot.
          y: span[1]! + (labelled ? 2 * tickSize : 4) + 10 + size * 0.8,
        });
      } else {
        // A right-hand (overlaying Δ) axis' title sits close to the plot, as the library places it;
        // the left one clear of the widest tick label. Both kept inside the figure.
        const edge = right
          ? Math.min(span[1]! + 17 + size, width - 2)
          : Math.max(span[0]! - widest - 11, size);
        scene.texts.push({ ...item, x: edge, y: ax.start - ax.length / 2, rotate: -90 });
      }
    }
  }
}
