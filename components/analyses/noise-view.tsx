"use client";

import type { Data, Layout } from "plotly.js";
import { useMemo, useState } from "react";
import { frequencyChartLayout, plotColors, traceColor } from "@/components/plot/palette";
import { formatQuantity } from "@/solver/format";
import type { NoiseResult } from "@/solver/types";
import { ChartFigure } from "./lazy-plot";
import { bandRms, noiseShares } from "./noise-math";
import { SectionTitle } from "./section";

/** How many contributions are drawn beside the total (the rest are listed only). */
const DRAWN = 5;

function parseHz(text: string): number | null {
  const m = /^\s*([0-9.]+(?:e[+-]?\d+)?)\s*(k|M|G)?\s*(?:Hz)?\s*$/i.exec(text);
  if (!m) return null;
  const scale = { k: 1e3, m: 1e6, g: 1e9 }[(m[2] ?? "").toLowerCase() as "k" | "m" | "g"] ?? 1;
  const v = Number(m[1]) * scale;
  return Number.isFinite(v) && v > 0 ? v : null;
}

/**
 * One `noise` statement: output density (and input-referred) on log–log axes with the largest
 * contributions, the contributions listed by share of a band the user picks, and the band's rms.
 */
export function NoiseView({ noise, frequencies }: { noise: NoiseResult; frequencies: number[] }) {
  const [from, setFrom] = useState(String(frequencies[0] ?? 10));
  const [to, setTo] = useState(String(frequencies[frequencies.length - 1] ?? 1e6));
  const f1 = parseHz(from);
  const f2 = parseHz(to);
  const bandOk = f1 !== null && f2 !== null && f2 > f1;
  const shares = useMemo(
    () => (bandOk ? noiseShares(noise, frequencies, f1!, f2!) : []),
    [noise, frequencies, f1, f2, bandOk],
  );
  const total = bandOk ? bandRms(frequencies, noise.density, f1!, f2!) : null;
  const referred = bandOk && noise.inputDensity ? bandRms(frequencies, noise.inputDensity, f1!, f2!) : null;
  const data: Partial<Data>[] = [
    {
      type: "scatter",
      mode: "lines",
      name: `total at ${noise.probe}`,
      x: frequencies,
      y: noise.density,
      line: { color: plotColors.text, width: 2.5 },
    },
    ...(noise.inputDensity
      ? [
          {
            type: "scatter" as const,
            mode: "lines" as const,
            name: `referred to ${noise.input}`,
            x: frequencies,
            y: noise.inputDensity,
            line: { color: plotColors.marker, width: 2, dash: "dash" as const },
          },
        ]
      : []),
    ...shares.slice(0, DRAWN).map((s, i) => {
      const c = noise.contributions.find(
        (x) => (x.source === "thermal" ? x.part : `${x.part} ${x.source}`) === s.label,
      );
      return {
        type: "scatter" as const,
        mode: "lines" as const,
        name: s.label,
        x: frequencies,
        y: c?.density ?? [],
        line: { color: traceColor(i), width: 1.25 },
      };
    }),
  ];
  const layout: Partial<Layout> = {
    ...frequencyChartLayout({ title: "density (V/√Hz)", log: true }),
    shapes: bandOk
      ? [
          {
            type: "rect",
            xref: "x",
            yref: "paper",
            x0: f1!,
            x1: f2!,
            y0: 0,
            y1: 1,
            fillcolor: "rgba(184, 115, 51, 0.07)",
            line: { width: 0 },
          },
        ]
      : [],
  };
  return (
    <section aria-labelledby={`noise-${noise.name}`} className="space-y-3">
      <SectionTitle
        id={`noise-${noise.name}`}
        title={`Noise ${noise.name}`}
        note={`at ${noise.probe}, ${formatQuantity(noise.temperature, "K", 5)}`}
      />
      <div className="grid gap-4 lg:grid-cols-[1fr_minmax(0,20rem)]">
        <ChartFigure
          className="border-paper-200 rounded-panel h-80 w-full border bg-white p-1"
          label="Noise density"
          data={data}
          layout={layout}
        />
        <div className="space-y-3 text-sm">
          <fieldset className="flex flex-wrap items-end gap-2">
            <legend className="text-caption text-ink-500 mb-1">Band</legend>
            <label className="text-caption flex flex-col">
              from
              <input
                className="border-paper-300 w-24 rounded border px-2 py-1 text-sm"
                value={from}
                onChange={(e) => setFrom(e.target.value)}
              />
            </label>
            <label className="text-caption flex flex-col">
              to
              <input
                className="border-paper-300 w-24 rounded border px-2 py-1 text-sm"
                value={to}
                onChange={(e) => setTo(e.target.value)}
              />
            </label>
          </fieldset>
          {bandOk ? (
            <p data-testid="noise-band-rms">
              <span className="text-ink-900 font-semibold tabular-nums">
                {formatQuantity(total, "V", 4)} rms
              </span>
              {referred !== null ? (
                <span className="text-ink-500"> · {formatQuantity(referred, "V", 4)} at the input</span>
              ) : null}
            </p>
          ) : (
            <p className="text-signal-fault text-caption">
              Write two frequencies, the second above the first (e.g. 20 and 20k).
            </p>
          )}
          <table className="w-full">
            <caption className="sr-only">Noise contributions by share of the band</caption>
            <thead>
              <tr className="border-paper-200 text-ink-500 border-b text-left">
                <th scope="col" className="py-1 font-medium">
                  source
                </th>
                <th scope="col" className="py-1 text-right font-medium">
                  rms
                </th>
                <th scope="col" className="py-1 text-right font-medium">
                  share
                </th>
              </tr>
            </thead>
            <tbody>
              {shares.map((s) => (
                <tr key={s.label} className="border-paper-100 border-b last:border-0">
                  <td className="py-1">{s.label}</td>
                  <td className="py-1 text-right tabular-nums">{formatQuantity(s.rms, "V", 3)}</td>
                  <td className="py-1 text-right tabular-nums">
                    {s.share === null ? "—" : `${(s.share * 100).toFixed(1)} %`}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="text-caption text-ink-500">
            Band figures are read from the swept points (straight on log–log axes between them); a `noise(…)
            from … to …` measure solves the band exactly.
          </p>
        </div>
      </div>
    </section>
  );
}
