/**
 * The frame of a Bode figure: one log frequency axis shared by the magnitude row (above) and the
 * phase row (below), Δ axes for differences, and the vertical lines of markers, focus and cursors.
 */
import type { Annotation, Layout, LayoutAxis, Shape } from "plotly.js";
import { type BodeCursor, cursorShapes } from "./cursors";
import { deltaTicks } from "./delta-ticks";
import { formatHz } from "./hover-format";
import { plotColors, plotFonts, plotHoverLabel } from "./palette";
import { plotText } from "./plot-text";
import type { BodeMarker, BodeOverlay, BodeSeries } from "./types";

/** What the frame depends on (a subset of the figure's input). */
export interface BodeFrameInput {
  series: BodeSeries[];
  overlays: BodeOverlay[];
  markers: BodeMarker[];
  focusHz: number | null;
  compact: boolean;
  /** Readout cursors A and B (vertical lines with their letter). */
  cursors?: readonly BodeCursor[];
  /** The span the frequency axis shows when not focused (the run's sweep), in Hz. */
  xRangeHz?: readonly [number, number] | null;
}

type AxisFont = { color: string; size: number };
type Lines = { shapes: Partial<Shape>[]; annotations: Partial<Annotation>[] };

/** Marker lines with their labelled value, the focus band and the readout cursors. */
function verticalLines(input: BodeFrameInput): Lines {
  const { shapes, annotations }: Lines = { shapes: [], annotations: [] };
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
  return { shapes, annotations };
}

/** The log frequency axis both rows share: its ticks and the span it shows. */
function frequencyAxis(input: BodeFrameInput, axisFont: AxisFont): Partial<LayoutAxis> {
  // Over a narrow band Plotly labels every minor tick (…500600700…); keep 1-2-5 labels there.
  const spanDecades = decadesOf([...input.series, ...input.overlays].flatMap((s) => [s.frequencies]));
  return {
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
}

/** The layout of a two-row Bode plot: magnitude (dB) above phase (deg), one log frequency axis. */
export function bodeLayout(input: BodeFrameInput): Partial<Layout> {
  const { shapes, annotations } = verticalLines(input);
  const axisFont = { color: plotColors.muted, size: input.compact ? 10 : 11 };
  const xCommon = frequencyAxis(input, axisFont);
  const hasDelta = input.overlays.some((o) => o.role === "difference");
  return {
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
    yaxis: rowAxis([0.53, 1], "magnitude (dB)", axisFont),
    yaxis2: {
      ...rowAxis([0, 0.45], "phase (°)", axisFont),
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
}

/** The y axis of one row (magnitude above, phase below). */
function rowAxis(domain: [number, number], title: string, axisFont: AxisFont): Partial<LayoutAxis> {
  return {
    domain,
    title: { text: title, font: axisFont },
    gridcolor: plotColors.grid,
    linecolor: plotColors.axis,
    zerolinecolor: plotColors.axis,
    tickfont: axisFont,
  };
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

/** The difference's own axes on the right of each row: Δ dB and Δ°, their zero line drawn. */
function deltaAxes(font: AxisFont, diffs: readonly BodeOverlay[]): Partial<Layout> {
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
