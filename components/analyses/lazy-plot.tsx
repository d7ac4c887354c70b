"use client";

import dynamic from "next/dynamic";

/** Plotly, loaded on the client only (the same bundle the Bode plot uses). */
export const LazyPlot = dynamic(() => import("@/components/plot/plotly-chart"), {
  ssr: false,
  loading: () => (
    <div className="rounded-panel bg-paper-100 text-caption text-ink-400 flex h-full w-full animate-pulse items-center justify-center">
      Loading chart…
    </div>
  ),
});

export const PLOT_CONFIG = {
  displaylogo: false,
  responsive: true,
  modeBarButtonsToRemove: ["lasso2d", "select2d", "toImage"],
} as const;
