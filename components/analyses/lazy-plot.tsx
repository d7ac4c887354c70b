"use client";

import dynamic from "next/dynamic";
import type { Data, Layout } from "plotly.js";
import { PLOT_CONFIG } from "@/components/plot/palette";

/** Plotly, loaded on the client only (the same bundle the Bode plot uses). */
export const LazyPlot = dynamic(() => import("@/components/plot/plotly-chart"), {
  ssr: false,
  loading: () => (
    <div className="rounded-panel bg-paper-100 text-caption text-ink-500 flex h-full w-full animate-pulse items-center justify-center">
      Loading chart…
    </div>
  ),
});

/** A chart in its frame: the figure (size and border from `className`, named by `label`) and the plot filling it. */
export function ChartFigure({
  label,
  className,
  data,
  layout,
  height,
}: {
  label: string;
  className: string;
  /** A height computed by the caller (px), when the class does not fix one. */
  height?: number;
  data: Partial<Data>[];
  layout: Partial<Layout>;
}) {
  return (
    <figure className={className} style={height ? { height } : undefined} aria-label={label}>
      <LazyPlot
        data={data as Data[]}
        layout={layout}
        config={PLOT_CONFIG}
        useResizeHandler
        style={{ width: "100%", height: "100%" }}
      />
    </figure>
  );
}
