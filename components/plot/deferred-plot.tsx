"use client";

import dynamic from "next/dynamic";
import { useCallback, useEffect, useRef, useState } from "react";
import type { PlotlyChartProps } from "./plotly-chart";
import { StaticFigure } from "./static-figure";

/** The interactive chart: fetched only when the engineer reaches for a plot (never on page load). */
const PlotlyChart = dynamic(() => import("./plotly-chart"), { ssr: false, loading: () => null });

export interface DeferredPlotProps extends Omit<PlotlyChartProps, "style" | "className"> {
  /** Accessible name of the plot. */
  label: string;
  /** Size laid out on the server before the container is measured, in px. */
  nominal: { width: number; height: number };
  /** Load the interactive chart now (a toolbar control, a cursor or a PNG export asked for it). */
  wake?: boolean;
}

/**
 * A chart drawn first as our own static SVG (server-rendered, from the same figure), replaced in place
 * by the interactive chart once the pointer enters it, it gets keyboard focus or a touch, or `wake` is
 * set. The wrapper carries `data-hydrated` once React has attached it and `data-plot` = static,
 * loading or interactive.
 */
export function DeferredPlot({ label, nominal, wake = false, onInitialized, ...chart }: DeferredPlotProps) {
  const wrapper = useRef<HTMLDivElement>(null);
  const [asked, setAsked] = useState(false);
  const [drawn, setDrawn] = useState(false);
  // Marked in the effect itself, the moment React has attached the page's handlers: a state update would
  // wait for another render, behind whatever script (the editor's) the same effects started.
  // A pointer already over the plot before React attached (it entered while the page streamed in) gets no
  // second pointerenter: ask at once, and on any move inside.
  useEffect(() => {
    wrapper.current?.setAttribute("data-hydrated", "");
    if (wrapper.current?.matches(":hover")) setAsked(true);
  }, []);
  const live = asked || wake;
  const ask = useCallback(() => setAsked(true), []);
  const onInit = useCallback(
    (
      figure: Parameters<NonNullable<PlotlyChartProps["onInitialized"]>>[0],
      graphDiv: Readonly<HTMLElement>,
    ) => {
      setDrawn(true);
      onInitialized?.(figure, graphDiv);
    },
    [onInitialized],
  );
  return (
    // The plot area itself is the control that asks for the interactive chart (hover, focus, touch).
    // biome-ignore lint/a11y/noStaticElementInteractions: pointer and focus intent, not a click action
    <div
      className="relative h-full w-full"
      ref={wrapper}
      data-plot={drawn ? "interactive" : live ? "loading" : "static"}
      onPointerEnter={ask}
      onPointerMove={live ? undefined : ask}
      onFocus={ask}
      onTouchStart={ask}
      tabIndex={drawn ? undefined : 0}
    >
      {drawn ? null : (
        <StaticFigure
          data={chart.data as object[]}
          layout={chart.layout as object}
          label={label}
          nominal={nominal}
          className="absolute inset-0"
        />
      )}
      {live ? (
        <PlotlyChart
          {...chart}
          onInitialized={onInit}
          useResizeHandler
          style={{ width: "100%", height: "100%" }}
        />
      ) : null}
      {live && !drawn ? (
        <span
          role="status"
          className="text-caption text-ink-500 pointer-events-none absolute top-1 right-2 rounded bg-white/80 px-1.5"
        >
          loading interactive plot…
        </span>
      ) : null}
    </div>
  );
}
