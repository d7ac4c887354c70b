/**
 * The traces of a Bode figure: run traces and overlays as lines, bench data as open symbols, comment
 * pins as diamonds. Each series gives two traces, magnitude on row 1 and phase on row 2.
 */
import type { Data } from "plotly.js";
import { sampleTrace } from "@/lib/trace-math";
import { formatHz, hoverTexts } from "./hover-format";
import { plotColors, traceColor } from "./palette";
import { plotText } from "./plot-text";
import type { BodeOverlay, BodePin, BodeSeries } from "./types";

/** Above this many points a trace is drawn with WebGL. */
export const GL_THRESHOLD = 2000;

/** Bench data sets in turn: each its own open symbol, so two sets never look alike. */
const BENCH_SYMBOLS = [
  "circle-open",
  "square-open",
  "diamond-open",
  "triangle-up-open",
  "x-thin-open",
  "star-open",
];

function lineTrace(
  s: BodeSeries,
  row: 1 | 2,
  opts: {
    color: string;
    dash: string;
    group: string;
    showLegend: boolean;
    legendName: string;
    width: number;
    /** Differences go on their own Δ axes (right-hand side of each row). */
    delta?: boolean;
  },
): Data {
  const gl = s.frequencies.length > GL_THRESHOLD;
  const y = row === 1 ? s.magnitudeDb : s.phaseDeg;
  return {
    type: gl ? "scattergl" : "scatter",
    mode: "lines",
    name: plotText(opts.legendName),
    legendgroup: opts.group,
    showlegend: opts.showLegend,
    meta: [plotText(s.name)],
    x: s.frequencies,
    y,
    xaxis: row === 1 ? "x" : "x2",
    yaxis: opts.delta ? (row === 1 ? "y3" : "y4") : row === 1 ? "y" : "y2",
    line: { color: opts.color, width: opts.width, dash: opts.dash },
    connectgaps: false,
    // Our own label text ("1.6982 kHz  ·  −3.01 dB"), built once per figure.
    text: hoverTexts(s.frequencies, y, row),
    hovertemplate: "%{text}<extra>%{meta[0]}</extra>",
  } as Data;
}

/** The run's traces as solid lines, overlays dashed (differences dotted, on the Δ axes). */
export function seriesTraces(series: readonly BodeSeries[], overlays: readonly BodeOverlay[]): Data[] {
  const data: Data[] = [];
  series.forEach((s, i) => {
    const color = traceColor(i);
    const common = { color, dash: "solid", group: `t:${s.name}`, legendName: s.name, width: 2 };
    data.push(lineTrace(s, 1, { ...common, showLegend: true }));
    data.push(lineTrace(s, 2, { ...common, showLegend: false }));
  });
  overlays.forEach((s, i) => {
    const difference = s.role === "difference";
    const color = s.color ?? (difference ? plotColors.difference : traceColor(i));
    const dash = s.dash ?? (difference ? "dot" : "dash");
    const common = { color, dash, group: `o:${s.name}`, legendName: s.name, width: 1.5, delta: difference };
    data.push(lineTrace(s, 1, { ...common, showLegend: true }));
    data.push(lineTrace(s, 2, { ...common, showLegend: false }));
  });
  return data;
}

/** Bench data sets as markers, one open symbol per set. */
export function benchTraces(measurements: readonly BodeSeries[]): Data[] {
  const data: Data[] = [];
  measurements.forEach((s, i) => {
    for (const row of [1, 2] as const) {
      data.push({
        type: s.frequencies.length > GL_THRESHOLD ? "scattergl" : "scatter",
        mode: "markers",
        name: plotText(s.name),
        legendgroup: `m:${s.name}`,
        showlegend: row === 1,
        meta: [plotText(s.name)],
        x: s.frequencies,
        y: row === 1 ? s.magnitudeDb : s.phaseDeg,
        xaxis: row === 1 ? "x" : "x2",
        yaxis: row === 1 ? "y" : "y2",
        marker: { color: plotColors.measurement, size: 6, symbol: BENCH_SYMBOLS[i % BENCH_SYMBOLS.length] },
        text: hoverTexts(s.frequencies, row === 1 ? s.magnitudeDb : s.phaseDeg, row),
        hovertemplate: "%{text}<extra>bench: %{meta[0]}</extra>",
      } as Data);
    }
  });
  return data;
}

/**
 * Comment pins on their trace's magnitude (or the first trace when none is named); null when no pin
 * falls within a trace's sweep.
 */
export function pinTrace(series: readonly BodeSeries[], pins: readonly BodePin[]): Data | null {
  const pinX: number[] = [];
  const pinY: number[] = [];
  const pinText: string[] = [];
  const pinOn: string[] = [];
  for (const pin of pins) {
    const s = series.find((t) => t.name === pin.trace) ?? series[0];
    const sample = s
      ? sampleTrace(s.frequencies, s.magnitudeDb as number[], s.phaseDeg as number[], pin.frequencyHz)
      : null;
    if (!sample) continue;
    pinX.push(pin.frequencyHz);
    pinY.push(sample.db);
    pinText.push(`${formatHz(pin.frequencyHz)}<br>${plotText(pin.label ?? "comment")}`);
    pinOn.push(s?.name ?? "");
  }
  if (pinX.length === 0) return null;
  return {
    type: "scatter",
    mode: "markers",
    name: "comments",
    legendgroup: "pins",
    x: pinX,
    y: pinY,
    text: pinText,
    // The trace each diamond sits on: a click on a diamond pins to that trace, never to "comments".
    customdata: pinOn,
    xaxis: "x",
    yaxis: "y",
    marker: { color: plotColors.pin, size: 11, symbol: "diamond", line: { color: "#ffffff", width: 1.5 } },
    hovertemplate: "%{text}<extra>pinned</extra>",
  } as Data;
}
