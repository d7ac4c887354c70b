"use client";

import type { Data, Layout } from "plotly.js";
import { DeferredPlot } from "@/components/plot/deferred-plot";
import { PLOT_CONFIG } from "@/components/plot/palette";

/** Tailwind's `h-N` (N × 4 px) less the frame's `p-1` padding; a square frame at the nominal width. */
function nominalSize(className: string, height: number | undefined): { width: number; height: number } {
  const width = 600;
  if (height) return { width, height: height - 8 };
  const h = /(?:^|\s)h-(\d+)(?:\s|$)/.exec(className);
  if (h) return { width, height: Number(h[1]) * 4 - 8 };
  if (/aspect-square/.test(className)) return { width: 352, height: 352 };
  return { width, height: 280 };
}

/**
 * A chart in its frame: the figure (size and border from `className`, named by `label`) and the plot
 * filling it — our static SVG first, the interactive chart once the engineer reaches for it.
 */
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
      <DeferredPlot
        label={label}
        nominal={nominalSize(className, height)}
        data={data as Data[]}
        layout={layout}
        config={PLOT_CONFIG}
      />
    </figure>
  );
}
