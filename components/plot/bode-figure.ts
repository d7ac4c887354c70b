import type { Annotation, Data, Layout, LayoutAxis, Shape } from "plotly.js";
import { sampleTrace } from "@/lib/trace-math";
import { type BodeCursor, cursorShapes } from "./cursors";
import { formatHz, hoverTexts } from "./hover-format";
import { plotColors, plotFonts, plotHoverLabel, traceColor } from "./palette";
import { plotText } from "./plot-text";
import type { BodeMarker, BodeOverlay, BodePin, BodeSeries } from "./types";

/** Above this many points a trace is drawn with WebGL. */
export const GL_THRESHOLD = 2000;

export interface BodeFigureInput {
  series: BodeSeries[];
  overlays: BodeOverlay[];
  measurements: BodeSeries[];
  markers: BodeMarker[];
  pins: BodePin[];
  focusHz: number | null;
  compact: boolean;
  /** Readout cursors A and B (vertical lines with their letter). */
  cursors?: readonly BodeCursor[];
  /** The span the frequency axis shows when not focused (the run's sweep), in Hz. */
  xRangeHz?: readonly [number, number] | null;
}

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

/** Data and layout of a two-row Bode plot: magnitude (dB) above phase (deg), one log frequency axis. */
export function buildBodeFigure(input: BodeFigureInput): { data: Data[]; layout: Partial<Layout> } {
  const data: Data[] = [];
  input.series.forEach((s, i) => {
    const color = traceColor(i);
    const common = { color, dash: "solid", group: `t:${s.name}`, legendName: s.name, width: 2 };
    data.push(lineTrace(s, 1, { ...common, showLegend: true }));
    data.push(lineTrace(s, 2, { ...common, showLegend: false }));
  });
  input.overlays.forEach((s, i) => {
    const difference = s.role === "difference";
    const color = s.color ?? (difference ? plotColors.difference : traceColor(i));
    const dash = s.dash ?? (difference ? "dot" : "dash");
    const common = { color, dash, group: `o:${s.name}`, legendName: s.name, width: 1.5, delta: difference };
    data.push(lineTrace(s, 1, { ...common, showLegend: true }));
    data.push(lineTrace(s, 2, { ...common, showLegend: false }));
  });
  input.measurements.forEach((s, i) => {
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

  // Comment pins sit on their trace's magnitude (or the first trace when none is named).
  const pinX: number[] = [];
  const pinY: number[] = [];
  const pinText: string[] = [];
  for (const pin of input.pins) {
    const s = input.series.find((t) => t.name === pin.trace) ?? input.series[0];
    const sample = s
      ? sampleTrace(s.frequencies, s.magnitudeDb as number[], s.phaseDeg as number[], pin.frequencyHz)
      : null;
    if (!sample) continue;
    pinX.push(pin.frequencyHz);
    pinY.push(sample.db);
    pinText.push(`${formatHz(pin.frequencyHz)}<br>${plotText(pin.label ?? "comment")}`);
  }
  if (pinX.length > 0) {
    data.push({
      type: "scatter",
      mode: "markers",
      name: "comments",
      legendgroup: "pins",
      x: pinX,
      y: pinY,
      text: pinText,
      xaxis: "x",
      yaxis: "y",
      marker: { color: plotColors.pin, size: 11, symbol: "diamond", line: { color: "#ffffff", width: 1.5 } },
      hovertemplate: "%{text}<extra>pinned</extra>",
    } as Data);
  }

  const shapes: Partial<Shape>[] = [];
  const annotations: Partial<Annotation>[] = [];
  input.markers.forEach((m, i) => {
    if (!(m.frequencyHz > 0)) return;
    shapes.push({
      type: "line",
      xref: "x",
      yref: "paper",
      x0: m.frequencyHz,
      x1: m.frequencyHz,
      y0: 0,
      y1: 1,
      line: { color: plotColors.marker, width: 1, dash: "dot" },
    });
    annotations.push({
      xref: "x",
      yref: "paper",
      x: Math.log10(m.frequencyHz),
      y: 1,
      yshift: 4 + (i % 2) * 14,
      yanchor: "bottom",
      showarrow: false,
      // The marker names its value: "f0 1.592 kHz".
      text: `${plotText(m.label)} ${formatHz(m.frequencyHz)}`,
      font: { size: 11, color: plotColors.marker },
    });
  });
  if (input.focusHz && input.focusHz > 0) {
    shapes.push({
      type: "line",
      xref: "x",
      yref: "paper",
      x0: input.focusHz,
      x1: input.focusHz,
      y0: 0,
      y1: 1,
      line: { color: plotColors.focus, width: 6 },
      opacity: 0.35,
      layer: "below",
    });
  }

  const cursors = cursorShapes(input.cursors ?? []);
  shapes.push(...cursors.shapes);
  annotations.push(...cursors.annotations);

  const axisFont = { color: plotColors.muted, size: input.compact ? 10 : 11 };
  // Over a narrow band Plotly labels every minor tick (…500600700…); keep 1-2-5 labels there.
  const spanDecades = decadesOf([...input.series, ...input.overlays].flatMap((s) => [s.frequencies]));
  const xCommon: Partial<LayoutAxis> = {
    // On a phone only decades are labelled (minor labels collide: "50k100k"); else 1-2-5 over a narrow band.
    ...(input.compact && spanDecades !== null && spanDecades > 1.5
      ? { dtick: 1 }
      : spanDecades !== null && spanDecades <= 3
        ? { dtick: "D2" }
        : {}),
    type: "log",
    gridcolor: plotColors.grid,
    linecolor: plotColors.axis,
    zeroline: false,
    tickfont: axisFont,
    // 10, 100, 1k, 10k … rather than 1000 or 1e+3.
    tickformat: "~s",
    ...(input.focusHz && input.focusHz > 0
      ? {
          autorange: false,
          range: [Math.log10(input.focusHz) - 0.5, Math.log10(input.focusHz) + 0.5],
        }
      : input.xRangeHz && input.xRangeHz[0] > 0 && input.xRangeHz[1] > input.xRangeHz[0]
        ? { autorange: false, range: [Math.log10(input.xRangeHz[0]), Math.log10(input.xRangeHz[1])] }
        : { autorange: true }),
  };
  const hasDelta = input.overlays.some((o) => o.role === "difference");
  const layout: Partial<Layout> = {
    autosize: true,
    margin: {
      l: input.compact ? 46 : 60,
      r: hasDelta ? (input.compact ? 44 : 56) : 12,
      t: input.markers.length > 0 ? 44 : 16,
      b: 44,
    },
    paper_bgcolor: "rgba(0,0,0,0)",
    plot_bgcolor: plotColors.plotBg,
    font: { family: plotFonts.sans, color: plotColors.text, size: 12 },
    // The nearest point anywhere under the pointer (hoverdistance −1), so a click always lands.
    hovermode: "closest",
    hoverdistance: -1,
    hoverlabel: plotHoverLabel,
    dragmode: "zoom",
    showlegend: true,
    legend: {
      orientation: "h",
      x: 0,
      // Below the frequency axis title; phones have less height, so the fraction is larger.
      y: input.compact ? -0.24 : -0.14,
      yanchor: "top",
      font: { size: 11 },
    },
    // Keep the user's zoom across data updates; a new focus frequency resets it.
    uirevision: input.focusHz ?? "base",
    xaxis: { ...xCommon, anchor: "y", showticklabels: false },
    xaxis2: { ...xCommon, anchor: "y2", matches: "x", title: { text: "frequency (Hz)", font: axisFont } },
    yaxis: {
      domain: [0.53, 1],
      title: { text: "magnitude (dB)", font: axisFont },
      gridcolor: plotColors.grid,
      linecolor: plotColors.axis,
      zerolinecolor: plotColors.axis,
      tickfont: axisFont,
    },
    yaxis2: {
      domain: [0, 0.45],
      title: { text: "phase (°)", font: axisFont },
      gridcolor: plotColors.grid,
      linecolor: plotColors.axis,
      zerolinecolor: plotColors.axis,
      tickfont: axisFont,
      ...phaseTicks([...input.series, ...input.overlays.filter((o) => o.role !== "difference")]),
    },
    ...(hasDelta
      ? deltaAxes(
          axisFont,
          input.overlays.filter((o) => o.role === "difference"),
        )
      : {}),
    shapes,
    annotations,
  };
  return { data, layout };
}

/** How many decades the given frequency grids span together, or null when there is none. */
function decadesOf(grids: readonly (readonly number[])[]): number | null {
  let lo = Number.POSITIVE_INFINITY;
  let hi = 0;
  for (const g of grids) {
    for (const f of [g[0], g[g.length - 1]]) {
      if (f !== undefined && f > 0) {
        lo = Math.min(lo, f);
        hi = Math.max(hi, f);
      }
    }
  }
  return hi > lo ? Math.log10(hi / lo) : null;
}

/**
 * Phase ticks at multiples of 45° (90° or 180° over a wider span), starting from 0°, so the
 * zero-phase and ±90°/±180° lines an engineer reads are always labelled.
 */
export function phaseTicks(series: readonly Pick<BodeSeries, "phaseDeg">[]): Partial<LayoutAxis> {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const s of series) {
    for (const v of s.phaseDeg) {
      if (v === null || !Number.isFinite(v)) continue;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  if (!(hi >= lo)) return {};
  const span = hi - lo;
  const dtick = span <= 360 ? 45 : span <= 720 ? 90 : 180;
  return { tick0: 0, dtick };
}

/** The smallest 1, 2, 2.5 or 5 × 10ⁿ step that is at least `raw`. */
function niceStep(raw: number): number {
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 2.5 ? 2.5 : m <= 5 ? 5 : 10) * p;
}

/**
 * Ticks of a Δ axis at round numbers: multiples of a 1-2-2.5-5 step from 0 (about four over the
 * values' span, zero always among them). Without them the library spaces the right-hand ticks to match
 * the left axis' grid, labelling values such as 0.173 and −0.477.
 */
export function deltaTicks(values: readonly (number | null)[]): Partial<LayoutAxis> {
  let lo = 0;
  let hi = 0;
  for (const v of values) {
    if (v === null || !Number.isFinite(v)) continue;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  }
  const span = hi - lo;
  if (!(span > 0)) return { tickmode: "auto" };
  return { tickmode: "linear", tick0: 0, dtick: niceStep(span / 4) };
}

/** The difference's own axes on the right of each row: Δ dB and Δ°, their zero line drawn. */
function deltaAxes(font: { color: string; size: number }, diffs: readonly BodeOverlay[]): Partial<Layout> {
  const common = {
    side: "right" as const,
    showgrid: false,
    zeroline: true,
    zerolinecolor: plotColors.difference,
    linecolor: plotColors.axis,
    tickfont: { ...font, color: plotColors.difference },
  };
  return {
    yaxis3: {
      ...common,
      overlaying: "y",
      ...deltaTicks(diffs.flatMap((d) => d.magnitudeDb)),
      title: { text: "Δ dB", font: { ...font, color: plotColors.difference } },
    },
    yaxis4: {
      ...common,
      overlaying: "y2",
      ...deltaTicks(diffs.flatMap((d) => d.phaseDeg)),
      title: { text: "Δ°", font: { ...font, color: plotColors.difference } },
    },
  } as Partial<Layout>;
}
