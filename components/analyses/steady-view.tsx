"use client";

import type { Layout } from "plotly.js";
import { useState } from "react";
import { plotColors } from "@/components/plot/palette";
import { formatQuantity } from "@/solver/format";
import type { SteadyResult } from "@/solver/types";
import { ChartFigure } from "./lazy-plot";
import { SectionTitle } from "./section";
import { spectrumDbc, timeAxis } from "./steady-math";

const baseLayout = (x: string, y: string, extra: Partial<Layout> = {}): Partial<Layout> => ({
  margin: { l: 60, r: 12, t: 8, b: 44 },
  paper_bgcolor: "rgba(0,0,0,0)",
  plot_bgcolor: plotColors.plotBg,
  font: { family: "Inter Variable, Inter, system-ui, sans-serif", size: 11, color: plotColors.muted },
  xaxis: { title: { text: x }, gridcolor: plotColors.grid, zerolinecolor: plotColors.axis },
  yaxis: {
    title: { text: y },
    gridcolor: plotColors.grid,
    zerolinecolor: plotColors.axis,
    exponentformat: "SI",
  },
  showlegend: false,
  ...extra,
});

function Chart({ label, data, layout }: { label: string; data: Plotly.Data[]; layout: Partial<Layout> }) {
  return (
    <ChartFigure
      className="border-paper-200 rounded-panel h-64 w-full border bg-white p-1"
      label={label}
      data={data}
      layout={layout}
    />
  );
}

/**
 * The steady oscillation (harmonic balance): the verdict in words, the envelope growing from the start
 * level to the steady amplitude (log scale), one period of the waveform at the chosen node, and its
 * harmonics in dB below the fundamental with the THD.
 */
export function SteadyView({ steady }: { steady: SteadyResult }) {
  const [chosen, setChosen] = useState(0);
  if (steady.reason !== null) {
    return (
      <section aria-labelledby="steady-title" className="space-y-2" data-testid="steady-view">
        <SectionTitle id="steady-title" title="Steady oscillation" note={`loop ${steady.loop}`} />
        <p className="text-ink-700 text-sm">{steady.summary}</p>
      </section>
    );
  }
  const probe = steady.probes[Math.min(chosen, steady.probes.length - 1)]!;
  const wave = timeAxis(probe.waveform.t);
  const spectrum = spectrumDbc(probe);
  const env = steady.envelope;
  return (
    <section aria-labelledby="steady-title" className="space-y-3" data-testid="steady-view">
      <SectionTitle
        id="steady-title"
        title="Steady oscillation"
        note={`harmonic balance, ${steady.harmonics} harmonics, ${steady.iterations} Newton steps, residual ${steady.residual?.toExponential(1)}`}
      />
      <p className="text-ink-900 text-sm font-medium">
        {steady.summary[0]?.toUpperCase() + steady.summary.slice(1)}.
      </p>
      <div className="flex flex-wrap items-center gap-3 text-sm">
        <label className="text-ink-500" htmlFor="steady-probe">
          Waveform at
        </label>
        <select
          id="steady-probe"
          className="border-paper-300 rounded border bg-white px-2 py-1"
          value={chosen}
          onChange={(e) => setChosen(Number(e.target.value))}
        >
          {steady.probes.map((p, i) => (
            <option key={p.probe} value={i}>
              {p.probe}
            </option>
          ))}
        </select>
        <span className="text-ink-700 tabular-nums">
          {formatQuantity(probe.amplitudes[0] ?? 0, probe.probe.startsWith("amps") ? "A" : "V", 4)} peak · THD{" "}
          {probe.thdPercent.toPrecision(3)} %
        </span>
      </div>
      <div className="grid gap-4 lg:grid-cols-3">
        {env ? (
          <Chart
            label="Envelope growth"
            data={[
              {
                type: "scatter",
                mode: "lines",
                x: env.t.map((t) => t * 1e3),
                y: env.level,
                line: { color: plotColors.marker, width: 2 },
                hovertemplate: "%{x:.3g} ms<br>%{y:.3g} V<extra></extra>",
              },
            ]}
            layout={baseLayout("time (ms)", "peak level (V)", {
              yaxis: {
                type: "log",
                title: { text: "peak level (V)" },
                gridcolor: plotColors.grid,
                exponentformat: "SI",
              },
            })}
          />
        ) : null}
        <Chart
          label="One period of the steady waveform"
          data={[
            {
              type: "scatter",
              mode: "lines",
              x: wave.values,
              y: probe.waveform.value,
              line: { color: plotColors.text, width: 2 },
              hovertemplate: `%{x:.4g} ${wave.unit}<br>%{y:.4g}<extra></extra>`,
            },
          ]}
          layout={baseLayout(`time (${wave.unit})`, probe.probe)}
        />
        <Chart
          label="Harmonics below the fundamental"
          data={[
            {
              type: "bar",
              x: spectrum.harmonic,
              y: spectrum.dbc,
              base: 0,
              marker: { color: plotColors.marker },
              hovertemplate: "harmonic %{x}<br>%{y:.1f} dB below the fundamental<extra></extra>",
            },
          ]}
          layout={baseLayout("harmonic", "dB below the fundamental", {
            xaxis: { title: { text: "harmonic" }, dtick: 1, gridcolor: plotColors.grid },
          })}
        />
      </div>
      {steady.notes.length > 0 ? (
        <ul className="text-caption text-ink-500 list-disc pl-5">
          {steady.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}
