"use client";

import type { Data, Layout } from "plotly.js";
import { deltaTicks } from "@/components/plot/delta-ticks";
import { formatHz } from "@/components/plot/hover-format";
import { frequencyChartLayout, plotColors, traceColor } from "@/components/plot/palette";
import { plotText } from "@/components/plot/plot-text";
import type { DrawnTrace } from "@/lib/drawn-result";
import { formatQuantity } from "@/solver/format";
import { ChartFigure } from "./lazy-plot";
import { SectionTitle } from "./section";

/** One curve of the plot: a run's delay, or a difference between two runs (drawn on the right axis). */
export type DelaySeries = { name: string; y: (number | null)[]; dash?: "dash" | "dot"; difference?: boolean };

/**
 * Group delay −d∠X/dω of every trace that carries it (exact from the solver's dX/ds) — or, on the
 * compare page, the given series: both runs' delays and their difference on its own Δ axis.
 */
export function GroupDelayView({
  traces = [],
  frequencies,
  series,
  inPanel = false,
}: {
  traces?: Pick<DrawnTrace, "name" | "groupDelay">[];
  frequencies: number[];
  series?: DelaySeries[];
  /** Inside a panel that already names it (compare): the plot only, open, without its own title. */
  inPanel?: boolean;
}) {
  const curves: DelaySeries[] =
    series ?? traces.filter((t) => t.groupDelay).map((t) => ({ name: t.name, y: t.groupDelay! }));
  const hasDelta = curves.some((c) => c.difference);
  const data: Partial<Data>[] = curves.map((c, i) => ({
    type: "scatter",
    mode: "lines",
    name: c.name,
    x: frequencies,
    y: c.y,
    yaxis: c.difference ? "y2" : "y",
    line: {
      color: c.difference ? plotColors.difference : traceColor(series ? Math.floor(i / 3) : i),
      width: c.difference ? 1.5 : 2,
      dash: c.dash ?? "solid",
    },
    // One formatter for every number on screen: "1.2346 ms at 1.5915 kHz", with a space and the unit.
    text: c.y.map((v, k) => `${formatQuantity(v, "s")} at ${formatHz(frequencies[k] ?? Number.NaN)}`),
    hovertemplate: `${plotText(c.name)}: %{text}<extra></extra>`,
  }));
  const layout: Partial<Layout> = {
    ...frequencyChartLayout({ title: "group delay (s)", rightMargin: hasDelta ? 72 : 16 }),
    ...(hasDelta
      ? {
          yaxis2: {
            title: { text: "Δ delay (s)", font: { color: plotColors.difference } },
            overlaying: "y",
            side: "right",
            showgrid: false,
            exponentformat: "SI",
            tickfont: { color: plotColors.difference },
            // Round steps from zero, not the left axis' grid spacing (as on the Bode plot's Δ axes).
            ...deltaTicks(curves.filter((c) => c.difference).flatMap((c) => c.y)),
          },
        }
      : {}),
  };
  const figure = (
    <ChartFigure
      className={`border-paper-200 rounded-panel h-72 w-full border bg-white p-1 ${inPanel ? "" : "mt-3"}`}
      label="Group delay"
      data={data}
      layout={layout}
    />
  );
  if (inPanel) return <div data-testid="group-delay">{figure}</div>;
  return (
    <details className="group space-y-3" data-testid="group-delay">
      <summary className="cursor-pointer list-none">
        <SectionTitle id="delay-title" title="Group delay" note="−d∠/dω of each trace · open to plot" />
      </summary>
      {figure}
    </details>
  );
}
