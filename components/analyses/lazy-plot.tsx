"use client";

import dynamic from "next/dynamic";

/** Plotly, loaded on the client only (the same bundle the Bode plot uses). */
export const LazyPlot = dynamic(() => import("@/components/plot/plotly-chart"), {
  ssr: false,
  loading: () => (
    <div className="rounded-panel bg-paper-100 text-caption text-ink-500 flex h-full w-full animate-pulse items-center justify-center">
      Loading chart…
    </div>
  ),
});

/** No library icon bar on any chart (PlotlyChart enforces it too). */
export const PLOT_CONFIG = { displaylogo: false, displayModeBar: false, responsive: true } as const;
