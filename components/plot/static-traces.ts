/**
 * Traces of the static chart: each trace's data as read from the figure, bar geometry, marker symbols,
 * line paths, and the drawn item of every trace (its polyline, markers or bars).
 */
import {
  type AxisModel,
  dashArray,
  num,
  type Obj,
  obj,
  scalePx,
  str,
  type TraceItem,
  toPx,
} from "./static-scene-types";

export interface TraceInfo {
  index: number;
  t: Obj;
  type: string;
  xref: string;
  yref: string;
  x: unknown[];
  y: unknown[];
  horizontal: boolean;
}

export function traceInfo(t: Obj, index: number): TraceInfo {
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
export function barGeometry(tr: TraceInfo, bargap: number) {
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

/** The drawn item of each trace (lines, markers or bars), in `traces` order; `clipOf` names its subplot. */
export function traceItems(
  traces: readonly TraceInfo[],
  axes: ReadonlyMap<string, AxisModel>,
  clipOf: (xref: string, yref: string) => number,
  bargap: number,
): TraceItem[] {
  const items: TraceItem[] = [];
  for (const tr of traces) {
    const xa = axes.get(tr.xref);
    const ya = axes.get(tr.yref);
    const clip = clipOf(tr.xref, tr.yref);
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
      items.push(item);
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
    items.push(item);
  }
  return items;
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
