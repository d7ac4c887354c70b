"use client";

import type { Layout } from "plotly.js";
import { plotColors, traceColor } from "@/components/plot/palette";
import { formatQuantity } from "@/solver/format";
import type { MeasureResult, MeasureStats, MonteCarloCheck, MonteCarloResult } from "@/solver/types";
import { histogramBars, histogramMarks } from "./analysis-math";
import { ChartFigure } from "./lazy-plot";
import { SectionTitle } from "./section";

const COLUMNS: { key: string; label: string; read: (s: MeasureStats) => number | null }[] = [
  { key: "mean", label: "mean", read: (s) => s.mean },
  { key: "std", label: "std", read: (s) => s.std },
  { key: "min", label: "min", read: (s) => s.min },
  { key: "p1", label: "p1", read: (s) => s.percentiles.p1 },
  { key: "p5", label: "p5", read: (s) => s.percentiles.p5 },
  { key: "p50", label: "p50", read: (s) => s.percentiles.p50 },
  { key: "p95", label: "p95", read: (s) => s.percentiles.p95 },
  { key: "p99", label: "p99", read: (s) => s.percentiles.p99 },
  { key: "max", label: "max", read: (s) => s.max },
];

/** Monte Carlo: yield, a statistics table with units, and one histogram per measure. */
export function MonteCarloView({ mc, measures }: { mc: MonteCarloResult; measures: MeasureResult[] }) {
  const unitOf = (name: string) => measures.find((m) => m.name === name)?.unit ?? "";
  const nominalOf = (name: string) => measures.find((m) => m.name === name)?.value ?? null;
  const passed = Math.round(mc.yield * mc.samples);
  const yieldTone =
    mc.yield >= 0.99 ? "text-signal-ok" : mc.yield >= 0.9 ? "text-signal-warn" : "text-signal-fault";
  return (
    <section aria-labelledby="mc-title" className="space-y-4">
      <SectionTitle id="mc-title" title="Tolerance spread" note={`${mc.samples} samples · seed ${mc.seed}`} />
      <div className="border-paper-200 bg-paper-50 rounded-panel flex flex-wrap items-end gap-x-8 gap-y-2 border px-5 py-4">
        <div>
          <p className="text-caption text-ink-500 font-medium tracking-wide uppercase">Yield</p>
          <p className={`text-display font-semibold tabular-nums ${yieldTone}`} data-testid="mc-yield">
            {(mc.yield * 100).toFixed(1)} %
          </p>
        </div>
        <p className="text-ink-600 pb-2 text-sm">
          <span className="text-ink-900 font-semibold tabular-nums">{passed}</span> of{" "}
          <span className="tabular-nums">{mc.samples}</span> samples pass every check
          {mc.samples - passed > 0 ? `; ${mc.samples - passed} fail at least one` : ""}.
        </p>
        {(mc.checks ?? []).length > 0 ? (
          <ul className="text-ink-700 basis-full pb-1 text-sm" aria-label="Yield of each check">
            {(mc.checks ?? []).map((c) => (
              <li key={c.expression}>
                <code className="text-ink-900">{c.expression}</code>:{" "}
                <span className={`tabular-nums ${c.yield < 1 ? "text-signal-warn font-semibold" : ""}`}>
                  {(c.yield * 100).toFixed(1)} %
                </span>{" "}
                of samples pass
              </li>
            ))}
          </ul>
        ) : null}
      </div>
      <div>
        <div className="overflow-x-auto">
          <table className="w-full min-w-[40rem] text-sm">
            <caption className="sr-only">Statistics of each measure over the samples</caption>
            <thead>
              <tr className="border-paper-200 text-ink-500 border-b text-left">
                <th scope="col" className="py-2 pr-3 font-medium">
                  measure
                </th>
                <th scope="col" className="py-2 pr-3 text-right font-medium">
                  nominal
                </th>
                {COLUMNS.map((c) => (
                  <th key={c.key} scope="col" className="py-2 pr-3 text-right font-medium">
                    {c.label}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {mc.measures.map((s) => (
                <tr key={s.name} className="border-paper-100 border-b last:border-0">
                  <th scope="row" className="text-ink-900 py-2 pr-3 text-left font-mono font-medium">
                    {s.name}
                  </th>
                  <td className="text-ink-500 py-2 pr-3 text-right tabular-nums">
                    {formatQuantity(nominalOf(s.name), unitOf(s.name), 4)}
                  </td>
                  {COLUMNS.map((c) => (
                    <td
                      key={c.key}
                      className="text-ink-800 py-2 pr-3 text-right whitespace-nowrap tabular-nums"
                    >
                      {formatQuantity(c.read(s), unitOf(s.name), 4)}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </div>
      <div className="grid gap-4 lg:grid-cols-2">
        {mc.measures
          .filter((s) => s.histogram.counts.length > 0)
          .map((s, i) => (
            <Histogram
              key={s.name}
              stats={s}
              unit={unitOf(s.name)}
              nominal={nominalOf(s.name)}
              limits={(mc.checks ?? []).filter((c) => c.name === s.name)}
              index={i}
            />
          ))}
      </div>
    </section>
  );
}

function Histogram({
  stats,
  unit,
  nominal,
  limits,
  index,
}: {
  stats: MeasureStats;
  unit: string;
  nominal: number | null;
  limits: MonteCarloCheck[];
  index: number;
}) {
  const marks = histogramMarks(nominal, limits);
  const bars = histogramBars(stats.histogram.edges, stats.histogram.counts);
  const axisUnit = unit === "deg" ? "°" : unit;
  const layout: Partial<Layout> = {
    margin: { l: 48, r: 12, t: 28, b: 44 },
    title: { text: stats.name, font: { size: 13, color: plotColors.text }, x: 0.02 },
    paper_bgcolor: "rgba(0,0,0,0)",
    plot_bgcolor: plotColors.plotBg,
    font: { family: "Inter Variable, Inter, system-ui, sans-serif", size: 11, color: plotColors.muted },
    xaxis: {
      title: { text: axisUnit ? `${stats.name} (${axisUnit})` : stats.name },
      gridcolor: plotColors.grid,
      linecolor: plotColors.axis,
      zeroline: false,
    },
    yaxis: {
      title: { text: "samples" },
      gridcolor: plotColors.grid,
      linecolor: plotColors.axis,
      rangemode: "tozero",
    },
    bargap: 0.04,
    showlegend: false,
    shapes: marks.map((m) => ({
      type: "line" as const,
      x0: m.x,
      x1: m.x,
      yref: "paper" as const,
      y0: 0,
      y1: 1,
      line: {
        color: m.limit ? plotColors.limit : plotColors.pin,
        width: 1.5,
        dash: m.limit ? "solid" : "dash",
      },
    })),
    annotations: marks.map((m) => ({
      x: m.x,
      yref: "paper" as const,
      y: 1,
      text: m.label,
      showarrow: false,
      yanchor: "bottom" as const,
      font: { size: 10, color: m.limit ? plotColors.limit : plotColors.pin },
    })),
  };
  return (
    <ChartFigure
      className="border-paper-200 rounded-panel h-64 border bg-white p-1"
      label={`Histogram of ${stats.name}`}
      data={[
        {
          type: "bar",
          x: bars.x,
          y: bars.y,
          width: bars.width,
          marker: { color: traceColor(index), line: { color: "#ffffff", width: 0.5 } },
          hovertemplate: `%{x:.4g} ${axisUnit}: %{y} samples<extra></extra>`,
        },
      ]}
      layout={layout}
    />
  );
}
