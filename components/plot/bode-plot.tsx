"use client";

import dynamic from "next/dynamic";
import type { PlotMouseEvent } from "plotly.js";
import { useCallback, useEffect, useId, useMemo, useRef, useState } from "react";
import { buildBodeFigure } from "./bode-figure";
import { downloadPlotPng, registerPlot, unregisterPlot } from "./plot-registry";
import type { BodeMarker, BodeOverlay, BodePin, BodeSeries } from "./types";

const PlotlyChart = dynamic(() => import("./plotly-chart"), {
  ssr: false,
  loading: () => <PlotSkeleton />,
});

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
  /** Shows a "Save PNG" button above the plot (default true); pass false when ExportButtons is on the page. */
  pngButton?: boolean;
}

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
  onPickFrequency,
  plotId,
  exportName = "phasewright-bode",
  height = 520,
  label = "Bode plot: magnitude and phase against frequency",
  pngButton = true,
}: BodePlotProps) {
  const generatedId = useId();
  const id = plotId ?? `bode-${generatedId}`;
  const compact = useCompact();
  const graphRef = useRef<HTMLElement | null>(null);
  const [ready, setReady] = useState(false);

  const series = useMemo<BodeSeries[]>(
    () =>
      traces.map((t) => ({ name: t.name, frequencies, magnitudeDb: t.magnitudeDb, phaseDeg: t.phaseDeg })),
    [traces, frequencies],
  );
  const figure = useMemo(
    () => buildBodeFigure({ series, overlays, measurements, markers, pins, focusHz, compact }),
    [series, overlays, measurements, markers, pins, focusHz, compact],
  );

  useEffect(() => () => unregisterPlot(id, graphRef.current ?? undefined), [id]);

  const onInit = useCallback(
    (_: unknown, graphDiv: Readonly<HTMLElement>) => {
      graphRef.current = graphDiv as HTMLElement;
      registerPlot(id, graphDiv as HTMLElement);
      setReady(true);
    },
    [id],
  );

  const onClick = useCallback(
    (event: Readonly<PlotMouseEvent>) => {
      const point = event.points[0];
      if (!point || !onPickFrequency) return;
      const meta = (point.data as { meta?: unknown }).meta;
      const trace = Array.isArray(meta) && typeof meta[0] === "string" ? meta[0] : (point.data.name ?? "");
      const hz = Number(point.x);
      if (Number.isFinite(hz) && hz > 0) onPickFrequency(hz, trace);
    },
    [onPickFrequency],
  );

  const h = compact ? Math.round(height * 0.8) : height;
  return (
    <figure className="w-full" aria-label={label}>
      {pngButton || onPickFrequency ? (
        <div className="flex min-h-8 items-center justify-between gap-2 px-1 pb-1">
          <figcaption className="text-caption text-ink-500">
            {onPickFrequency ? "Click a point on a trace to pin a comment there." : null}
          </figcaption>
          {pngButton ? (
            <button
              type="button"
              disabled={!ready}
              onClick={() => void downloadPlotPng(id, exportName)}
              className="border-paper-300 text-caption text-ink-700 hover:bg-paper-100 disabled:text-ink-300 rounded-md border bg-white px-2 py-1 font-medium"
            >
              Save PNG
            </button>
          ) : null}
        </div>
      ) : null}
      <div style={{ height: h }}>
        <PlotlyChart
          data={figure.data}
          layout={figure.layout}
          config={{
            displaylogo: false,
            responsive: true,
            modeBarButtonsToRemove: ["toImage", "lasso2d", "select2d"],
          }}
          useResizeHandler
          style={{ width: "100%", height: "100%" }}
          onInitialized={onInit}
          onUpdate={onInit}
          onClick={onClick}
        />
      </div>
    </figure>
  );
}

function PlotSkeleton() {
  return (
    <div className="rounded-panel bg-paper-100 text-caption text-ink-400 flex h-full w-full animate-pulse items-center justify-center">
      Loading plot…
    </div>
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
