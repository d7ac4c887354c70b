"use client";

import type { PlotMouseEvent } from "plotly.js";
import { useCallback, useEffect, useId, useMemo, useRef, useState } from "react";
import { buildBodeFigure } from "./bode-figure";
import { CursorReadout } from "./cursor-readout";
import type { BodeCursor } from "./cursors";
import { DeferredPlot } from "./deferred-plot";
import { PLOT_CONFIG } from "./palette";
import {
  downloadPlotPng,
  type PlotStamp,
  registerPlot,
  registerPlotWaker,
  resetPlotView,
  unregisterPlot,
} from "./plot-registry";
import { type ClickMode, PlotToolbar } from "./plot-toolbar";
import type { BodeMarker, BodeOverlay, BodePin, BodeSeries } from "./types";

export interface BodePlotProps {
  /** The run's frequency grid (Hz). */
  frequencies: number[];
  /** The run's traces: magnitude in dB and phase in degrees per frequency. */
  traces: { name: string; magnitudeDb: (number | null)[]; phaseDeg: (number | null)[] }[];
  /** Extra series on their own grids: another run's traces (dashed) and difference traces (dotted). */
  overlays?: BodeOverlay[];
  /** Bench measurements, drawn as points. */
  measurements?: BodeSeries[];
  /** Labelled frequencies (measures in Hz): vertical lines across both rows. */
  markers?: BodeMarker[];
  /** Comment pins: diamonds on the magnitude row. */
  pins?: BodePin[];
  /** Pans and zooms to this frequency (±half a decade) and highlights it. */
  focusHz?: number | null;
  /** The frequency span the axis shows (e.g. the run's sweep), so bench data beyond it does not stretch it. */
  xRangeHz?: readonly [number, number] | null;
  /** Called with the frequency and trace name of a clicked point (e.g. to pin a comment). */
  onPickFrequency?: (frequencyHz: number, trace: string) => void;
  /** Id for ExportButtons' PNG export; defaults to a generated one. */
  plotId?: string;
  /** File name (without extension) of the PNG export. */
  exportName?: string;
  /** Height in pixels on wide screens; phones get 80 % of it. Default 520. */
  height?: number;
  /** Accessible description of the plot. */
  label?: string;
  /** Shows a "PNG" button beside the plot (default true). */
  pngButton?: boolean;
  /** Title and netlist hash printed above the plot in the PNG export (the date is added). */
  stamp?: PlotStamp | null;
  /** Hides the cursor controls and readout (small previews). */
  cursors?: boolean;
}

/** Width the server lays the static plot out at (the page's main column on a laptop), in px. */
const NOMINAL_WIDTH = 1000;

// Stable empty defaults, so memoised figures are not rebuilt on every render.
const NO_OVERLAYS: BodeOverlay[] = [];
const NO_SERIES: BodeSeries[] = [];
const NO_MARKERS: BodeMarker[] = [];
const NO_PINS: BodePin[] = [];

export function BodePlot({
  frequencies,
  traces,
  overlays = NO_OVERLAYS,
  measurements = NO_SERIES,
  markers = NO_MARKERS,
  pins = NO_PINS,
  focusHz = null,
  xRangeHz = null,
  onPickFrequency,
  plotId,
  exportName = "phasewright-bode",
  height = 520,
  label = "Bode plot: magnitude and phase against frequency",
  pngButton = true,
  stamp = null,
  cursors: withCursors = true,
}: BodePlotProps) {
  const generatedId = useId();
  const id = plotId ?? `bode-${generatedId}`;
  const compact = useCompact();
  const graphRef = useRef<HTMLElement | null>(null);
  const [hydrated, setHydrated] = useState(false);
  // The interactive chart is loaded on intent (pointer, focus, touch on the plot) or when a control asks.
  const [wake, setWake] = useState(false);
  useEffect(() => {
    setHydrated(true);
    return registerPlotWaker(id, () => setWake(true));
  }, [id]);
  const [mode, setMode] = useState<ClickMode>(onPickFrequency ? "pin" : "A");
  const [cursors, setCursors] = useState<BodeCursor[]>([]);
  const [cursorTrace, setCursorTrace] = useState("");
  const setCursor = useCallback((cursorId: BodeCursor["id"], hz: number | null) => {
    setCursors((cs) => [
      ...cs.filter((c) => c.id !== cursorId),
      ...(hz === null ? [] : [{ id: cursorId, frequencyHz: hz }]),
    ]);
  }, []);

  const series = useMemo<BodeSeries[]>(
    () =>
      traces.map((t) => ({ name: t.name, frequencies, magnitudeDb: t.magnitudeDb, phaseDeg: t.phaseDeg })),
    [traces, frequencies],
  );
  const figure = useMemo(
    () =>
      buildBodeFigure({ series, overlays, measurements, markers, pins, focusHz, compact, cursors, xRangeHz }),
    [series, overlays, measurements, markers, pins, focusHz, compact, cursors, xRangeHz],
  );

  useEffect(() => () => unregisterPlot(id, graphRef.current ?? undefined), [id]);

  const onInit = useCallback(
    (_: unknown, graphDiv: Readonly<HTMLElement>) => {
      graphRef.current = graphDiv as HTMLElement;
      registerPlot(id, graphDiv as HTMLElement, stamp);
    },
    [id, stamp],
  );

  const onClick = useCallback(
    (event: Readonly<PlotMouseEvent>) => {
      // A click may land on several traces at once (a comment's diamond over its curve): prefer a run's own
      // trace; a diamond alone pins to the trace it sits on (its customdata).
      const named = event.points.map((p) => {
        const meta = (p.data as { meta?: unknown }).meta;
        const name = Array.isArray(meta) && typeof meta[0] === "string" ? meta[0] : (p.data.name ?? "");
        return { p, name: typeof p.customdata === "string" ? p.customdata : name };
      });
      const hit = named.find((n) => series.some((s) => s.name === n.name)) ?? named[0];
      if (!hit) return;
      const { p: point, name: trace } = hit;
      const hz = Number(point.x);
      if (!(Number.isFinite(hz) && hz > 0)) return;
      if (mode === "pin") {
        onPickFrequency?.(hz, trace);
        return;
      }
      if (!withCursors) return;
      setCursor(mode, hz);
      if (series.some((s) => s.name === trace)) setCursorTrace(trace);
      // A then B, then A again: two clicks measure a span.
      setMode(mode === "A" ? "B" : "A");
    },
    [onPickFrequency, mode, withCursors, setCursor, series],
  );

  const h = compact ? Math.round(height * 0.8) : height;
  return (
    <figure className="w-full" aria-label={label} data-bode-plot="">
      {withCursors || pngButton ? (
        <PlotToolbar
          mode={withCursors ? mode : "pin"}
          onMode={(m) => {
            setMode(m);
            setWake(true);
          }}
          canPin={Boolean(onPickFrequency)}
          ready={hydrated}
          onReset={() => void resetPlotView(id)}
          onPng={pngButton ? () => void downloadPlotPng(id, exportName) : undefined}
        />
      ) : null}
      <div style={{ height: h }}>
        <DeferredPlot
          label={label}
          nominal={{ width: NOMINAL_WIDTH, height: h }}
          wake={wake}
          data={figure.data}
          layout={figure.layout}
          config={PLOT_CONFIG}
          onInitialized={onInit}
          onUpdate={onInit}
          onClick={onClick}
        />
      </div>
      {onPickFrequency && mode === "pin" ? (
        <figcaption className="text-caption text-ink-500 px-1 pt-1">
          Click a point on a trace to pin a comment there.
        </figcaption>
      ) : null}
      {withCursors && series.length > 0 ? (
        <CursorReadout
          series={series}
          traceName={cursorTrace}
          onTraceName={setCursorTrace}
          cursors={cursors}
          onCursor={setCursor}
        />
      ) : null}
    </figure>
  );
}

/** True on narrow screens (phones), where the plot gets smaller fonts and height. */
function useCompact(): boolean {
  const [compact, setCompact] = useState(false);
  useEffect(() => {
    const mq = window.matchMedia("(max-width: 640px)");
    const update = () => setCompact(mq.matches);
    update();
    mq.addEventListener("change", update);
    return () => mq.removeEventListener("change", update);
  }, []);
  return compact;
}
