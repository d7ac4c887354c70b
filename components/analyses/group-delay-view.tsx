"use client";

import type { Data, Layout } from "plotly.js";
import { plotColors, plotFonts, plotHoverLabel, traceColor } from "@/components/plot/palette";
import type { TraceResult } from "@/solver/types";
import { LazyPlot, PLOT_CONFIG } from "./lazy-plot";
import { SectionTitle } from "./section";

/** Group delay −d∠X/dω of every trace that carries it (exact from the solver's dX/ds). */
export function GroupDelayView({ traces, frequencies }: { traces: TraceResult[]; frequencies: number[] }) {
  const shown = traces.filter((t) => t.groupDelay);
  const data: Partial<Data>[] = shown.map((t, i) => ({
    type: "scatter",
    mode: "lines",
    name: t.name,
    x: frequencies,
    y: t.groupDelay!,
    line: { color: traceColor(i), width: 2 },
    hovertemplate: `${t.name}: %{y:.4s}s at %{x:.4s}Hz<extra></extra>`,
  }));
  const layout: Partial<Layout> = {
    margin: { l: 72, r: 16, t: 12, b: 48 },
    paper_bgcolor: "rgba(0,0,0,0)",
    plot_bgcolor: plotColors.plotBg,
    font: { family: plotFonts.sans, size: 11, color: plotColors.muted },
    hoverlabel: plotHoverLabel,
    xaxis: {
      title: { text: "frequency (Hz)" },
      type: "log",
      gridcolor: plotColors.grid,
      exponentformat: "SI",
    },
    yaxis: {
      title: { text: "group delay (s)" },
      gridcolor: plotColors.grid,
      exponentformat: "SI",
      zerolinecolor: plotColors.axis,
    },
    legend: { orientation: "h", y: -0.2 },
  };
  return (
    <details className="group space-y-3" data-testid="group-delay">
      <summary className="cursor-pointer list-none">
        <SectionTitle id="delay-title" title="Group delay" note="−d∠/dω of each trace · open to plot" />
      </summary>
      <figure
        className="border-paper-200 rounded-panel mt-3 h-72 w-full border bg-white p-1"
        aria-label="Group delay"
      >
        <LazyPlot
          data={data}
          layout={layout}
          config={PLOT_CONFIG}
          useResizeHandler
          style={{ width: "100%", height: "100%" }}
        />
      </figure>
    </details>
  );
}
