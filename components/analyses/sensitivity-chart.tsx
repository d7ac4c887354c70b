"use client";

import type { Layout } from "plotly.js";
import { useState } from "react";
import { plotColors } from "@/components/plot/palette";
import type { SensitivityResult } from "@/solver/types";
import { rankSensitivities } from "./analysis-math";
import { ChartFigure } from "./lazy-plot";
import { SectionTitle } from "./section";

/** Normalized sensitivities of one measure to every part, ranked by size, as horizontal bars. */
export function SensitivityChart({ rows }: { rows: SensitivityResult[] }) {
  const measures = [...new Set(rows.map((r) => r.measure))];
  const [measure, setMeasure] = useState(measures[0] ?? "");
  const ranked = rankSensitivities(rows, measure).filter((r) => r.value !== null);
  // Plotly draws the first category at the bottom: reverse so the largest is on top.
  const shown = [...ranked].reverse();
  const layout: Partial<Layout> = {
    margin: { l: 96, r: 24, t: 8, b: 44 },
    paper_bgcolor: "rgba(0,0,0,0)",
    plot_bgcolor: plotColors.plotBg,
    font: { family: "Inter Variable, Inter, system-ui, sans-serif", size: 11, color: plotColors.muted },
    xaxis: {
      title: { text: `(∂${measure}/${measure}) / (∂x/x)` },
      zeroline: true,
      zerolinecolor: plotColors.axis,
      gridcolor: plotColors.grid,
    },
    yaxis: { automargin: true, tickfont: { family: "JetBrains Mono, monospace", size: 11 } },
    showlegend: false,
  };
  const height = Math.max(160, 28 * shown.length + 60);
  return (
    <section aria-labelledby="sens-title" className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <SectionTitle id="sens-title" title="Sensitivity" />
        {measures.length > 1 ? (
          <label className="text-ink-600 flex items-center gap-2 text-sm">
            measure
            <select
              value={measure}
              onChange={(e) => setMeasure(e.target.value)}
              className="border-paper-300 rounded-md border bg-white px-2 py-1 font-mono text-sm"
            >
              {measures.map((m) => (
                <option key={m}>{m}</option>
              ))}
            </select>
          </label>
        ) : null}
      </div>
      {shown.length === 0 ? (
        <p className="text-ink-500 text-sm">No part changes {measure} measurably.</p>
      ) : (
        <ChartFigure
          className="border-paper-200 rounded-panel border bg-white p-1"
          height={height}
          label={`Sensitivity of ${measure} to each part, largest first`}
          data={[
            {
              type: "bar",
              orientation: "h",
              y: shown.map((r) => r.part),
              x: shown.map((r) => r.value ?? 0),
              marker: {
                color: shown.map((r) => ((r.value ?? 0) >= 0 ? plotColors.text : plotColors.marker)),
              },
              hovertemplate: "%{y}: %{x:.4f}<extra></extra>",
            },
          ]}
          layout={layout}
        />
      )}
      <p className="text-caption text-ink-500">
        A value of −0.5 means a 1 % larger part moves {measure || "the measure"} 0.5 % lower.
      </p>
    </section>
  );
}
