"use client";

import type { Layout } from "plotly.js";
import { useState } from "react";
import { plotColors } from "@/components/plot/palette";
import { PlainButton } from "@/components/ui/button";
import { formatQuantity } from "@/solver/format";
import type { PoleResult, ZeroResult } from "@/solver/types";
import { sortedPoles } from "./analysis-math";
import { ChartFigure } from "./lazy-plot";
import { dominantView } from "./noise-math";
import { SectionTitle } from "./section";

const RHP_FILL = "rgba(176, 39, 31, 0.08)";

/** A root's hover text in the table's own numbers: "pole s = −6283.2 + j62832 rad/s · 10.000 kHz". */
function rootHover(kind: "pole" | "zero", r: { re: number; im: number }): string {
  const im = `${r.im < 0 ? "−" : "+"} j${formatQuantity(Math.abs(r.im), "", 6)}`;
  const hz = Math.hypot(r.re, r.im) / (2 * Math.PI);
  return `${kind} s = ${formatQuantity(r.re, "", 5)} ${im} rad/s<br>|s|/2π = ${formatQuantity(hz, "Hz", 5)}`;
}

/**
 * Pole–zero map: σ against jω with the right half-plane shaded (poles ×, zeros ○), zoomed to the
 * dominant roots (within 100× the smallest |s|) with the far ones listed, and a table of f, Q,
 * growth per cycle.
 */
export function PoleMap({ poles, zeros = [] }: { poles: PoleResult[]; zeros?: ZeroResult[] }) {
  const rows = sortedPoles(poles);
  const [all, setAll] = useState(false);
  const view = dominantView(poles, zeros);
  const reach = all
    ? Math.max(1, ...[...poles, ...zeros].map((p) => Math.max(Math.abs(p.re), Math.abs(p.im))))
    : view.reach;
  const span = reach * 1.15;
  const unstable = poles.filter((p) => p.re > 0);
  const layout: Partial<Layout> = {
    margin: { l: 64, r: 16, t: 12, b: 48 },
    paper_bgcolor: "rgba(0,0,0,0)",
    plot_bgcolor: plotColors.plotBg,
    font: { family: "Inter Variable, Inter, system-ui, sans-serif", size: 11, color: plotColors.muted },
    xaxis: {
      title: { text: "σ (1/s)" },
      range: [-span, span],
      zeroline: true,
      zerolinecolor: plotColors.axis,
      gridcolor: plotColors.grid,
      exponentformat: "SI",
    },
    yaxis: {
      title: { text: "jω (rad/s)" },
      range: [-span, span],
      zeroline: true,
      zerolinecolor: plotColors.axis,
      gridcolor: plotColors.grid,
      exponentformat: "SI",
      scaleanchor: "x",
    },
    shapes: [
      {
        type: "rect",
        xref: "x",
        yref: "paper",
        x0: 0,
        x1: span,
        y0: 0,
        y1: 1,
        fillcolor: RHP_FILL,
        line: { width: 0 },
      },
    ],
    annotations: [
      {
        xref: "x",
        yref: "paper",
        x: span * 0.5,
        y: 0.98,
        text: "right half-plane: growing",
        showarrow: false,
        font: { size: 10, color: plotColors.difference },
      },
    ],
    showlegend: false,
  };
  return (
    <section aria-labelledby="poles-title" className="space-y-3">
      <SectionTitle
        id="poles-title"
        title={zeros.length > 0 ? "Poles and zeros" : "Natural frequencies"}
        note={
          unstable.length > 0 ? `${unstable.length} in the right half-plane` : "all in the left half-plane"
        }
      />
      <div className="grid gap-4 lg:grid-cols-[minmax(0,22rem)_1fr]">
        <ChartFigure
          className="border-paper-200 rounded-panel aspect-square w-full border bg-white p-1"
          label="Pole map"
          data={[
            {
              type: "scatter",
              mode: "markers",
              x: poles.map((p) => p.re),
              y: poles.map((p) => p.im),
              marker: {
                symbol: "x-thin",
                size: 12,
                line: {
                  width: 2.5,
                  color: poles.map((p) => (p.re > 0 ? plotColors.difference : plotColors.text)),
                },
              },
              text: poles.map((p) => rootHover("pole", p)),
              hovertemplate: "%{text}<extra></extra>",
            },
            {
              type: "scatter",
              mode: "markers",
              x: zeros.map((z) => z.re),
              y: zeros.map((z) => z.im),
              marker: { symbol: "circle-open", size: 11, line: { width: 2 }, color: plotColors.marker },
              text: zeros.map((z) => rootHover("zero", z)),
              hovertemplate: "%{text}<extra></extra>",
            },
          ]}
          layout={layout}
        />
        <div className="overflow-x-auto">
          <table className="w-full text-sm">
            <caption className="sr-only">Poles with frequency, quality factor and growth per cycle</caption>
            <thead>
              <tr className="border-paper-200 text-ink-500 border-b text-left">
                <th scope="col" className="py-2 pr-3 text-right font-medium">
                  σ (1/s)
                </th>
                <th scope="col" className="py-2 pr-3 text-right font-medium">
                  ω (rad/s)
                </th>
                <th scope="col" className="py-2 pr-3 text-right font-medium">
                  f
                </th>
                <th scope="col" className="py-2 pr-3 text-right font-medium">
                  Q
                </th>
                <th scope="col" className="py-2 pr-3 text-right font-medium">
                  per cycle
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((p, i) => (
                <tr
                  key={`${p.re}:${p.im}:${i}`}
                  className={`border-paper-100 border-b last:border-0 ${p.re > 0 ? "bg-signal-fault-soft/60" : ""}`}
                >
                  <td className="py-1.5 pr-3 text-right tabular-nums">{formatQuantity(p.re, "", 5)}</td>
                  <td className="py-1.5 pr-3 text-right tabular-nums">
                    {p.im === 0 ? "0" : `${p.im > 0 ? "+" : "−"}${formatQuantity(Math.abs(p.im), "", 6)}`}
                  </td>
                  <td className="py-1.5 pr-3 text-right tabular-nums">
                    {formatQuantity(p.frequencyHz, "Hz", 4)}
                  </td>
                  <td className="py-1.5 pr-3 text-right tabular-nums">
                    {p.q === null ? "—" : formatQuantity(p.q, "", 4)}
                  </td>
                  <td
                    className={`py-1.5 pr-3 text-right font-medium tabular-nums ${
                      p.growthPerCycle === null
                        ? "text-ink-500"
                        : p.growthPerCycle > 1
                          ? "text-signal-fault"
                          : "text-signal-ok"
                    }`}
                  >
                    {p.growthPerCycle === null ? "—" : `×${formatQuantity(p.growthPerCycle, "", 4)}`}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="text-caption text-ink-500 mt-2">
            Amplitude change per cycle is e^(2πσ/ω); above ×1 an oscillation grows, below it dies away.
          </p>
        </div>
        <div className="text-caption text-ink-500 space-y-1 lg:col-span-2" data-testid="far-roots">
          {view.far.length > 0 ? (
            <p>
              {all ? "Showing every root. " : `Zoomed to the dominant roots; beyond the view: `}
              {all
                ? null
                : view.far
                    .map((r) => `${r.kind} at ${formatQuantity(r.frequencyHz, "Hz", 4)}`)
                    .join(", ")}{" "}
              <PlainButton type="button" className="text-copper-700 underline" onClick={() => setAll(!all)}>
                {all ? "zoom to the dominant roots" : "show all"}
              </PlainButton>
            </p>
          ) : null}
          {zeros.length > 0 ? (
            <p>
              Zeros ({zeros[0]!.probe}):{" "}
              {zeros
                .map(
                  (z) =>
                    `${formatQuantity(z.re, "", 4)} ${z.im < 0 ? "−" : "+"} j${formatQuantity(Math.abs(z.im), "", 5)} (${formatQuantity(z.frequencyHz, "Hz", 4)})`,
                )
                .join("; ")}
            </p>
          ) : null}
        </div>
      </div>
    </section>
  );
}
