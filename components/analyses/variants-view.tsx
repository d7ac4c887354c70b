"use client";

import { useState } from "react";
import { BodePlot } from "@/components/plot/bode-plot";
import { PlainButton } from "@/components/ui/button";
import type { DrawnVariant } from "@/lib/drawn-result";
import { formatQuantity } from "@/solver/format";
import type { MeasureResult } from "@/solver/types";
import { SectionTitle } from "./section";

const partUnit = (name: string) =>
  /^C/i.test(name) ? "F" : /^L/i.test(name) ? "H" : /^R/i.test(name) ? "Ω" : "";

/** "Rf = 22 kΩ" for a part or a let whose name suggests its kind; plain numbers otherwise. */
export function variantLabel(v: DrawnVariant): string {
  return `${v.name} = ${formatQuantity(v.value, partUnit(v.name), 4)}`;
}

/** The family of a `vary`: every variant's traces overlaid, and the measures per variant. */
export function VariantsView({
  frequencies,
  variants,
  measures,
}: {
  frequencies: number[];
  variants: DrawnVariant[];
  measures: MeasureResult[];
}) {
  const traceNames = variants[0]?.traces.map((t) => t.name) ?? [];
  const firstLoop = variants[0]?.traces.find((t) => t.kind === "loop")?.name;
  const [shown, setShown] = useState(firstLoop ?? traceNames[0] ?? "");
  // One trace per variant, so each variant keeps one colour and the legend reads as the values.
  const traces = variants.flatMap((v) =>
    v.traces
      .filter((t) => t.name === shown)
      .map((t) => ({ name: variantLabel(v), magnitudeDb: t.magnitudeDb, phaseDeg: t.phaseDeg })),
  );
  const names = measures.map((m) => m.name);
  return (
    <section aria-labelledby="variants-title" className="space-y-3">
      <SectionTitle
        id="variants-title"
        title={`Family over ${variants[0]?.name ?? "a value"}`}
        note={`${variants.length} variant${variants.length === 1 ? "" : "s"}`}
      />
      {traceNames.length > 1 ? (
        <fieldset className="flex flex-wrap items-center gap-2 text-sm">
          <legend className="sr-only">Trace shown for every variant</legend>
          <span className="text-ink-500">trace</span>
          {traceNames.map((n) => (
            <PlainButton
              key={n}
              type="button"
              aria-pressed={n === shown}
              onClick={() => setShown(n)}
              className={`rounded-md border px-2.5 py-1 font-mono ${
                n === shown
                  ? "border-board-600 bg-board-50 text-board-800"
                  : "border-paper-300 text-ink-700 bg-white"
              }`}
            >
              {n}
            </PlainButton>
          ))}
        </fieldset>
      ) : null}
      <BodePlot
        frequencies={frequencies}
        traces={traces}
        height={440}
        exportName="phasewright-family"
        label={`Bode plot of every variant of ${variants[0]?.name ?? ""}`}
      />
      <div className="overflow-x-auto">
        <table className="w-full text-sm">
          <caption className="sr-only">Measures and checks of each variant</caption>
          <thead>
            <tr className="border-paper-200 text-ink-500 border-b text-left">
              <th scope="col" className="py-2 pr-3 font-medium">
                variant
              </th>
              {names.map((n) => (
                <th key={n} scope="col" className="py-2 pr-3 text-right font-mono font-medium">
                  {n}
                </th>
              ))}
              <th scope="col" className="py-2 pr-3 text-right font-medium">
                checks
              </th>
            </tr>
          </thead>
          <tbody>
            <tr className="border-paper-100 text-ink-500 border-b italic">
              <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                nominal
              </th>
              {measures.map((m) => (
                <td key={m.name} className="py-1.5 pr-3 text-right tabular-nums">
                  {formatQuantity(m.value, m.unit, 4)}
                </td>
              ))}
              <td />
            </tr>
            {variants.map((v) => {
              const passed = v.checks.filter((c) => c.pass).length;
              return (
                <tr key={`${v.name}=${v.value}`} className="border-paper-100 border-b last:border-0">
                  <th
                    scope="row"
                    className="text-ink-900 py-1.5 pr-3 text-left font-mono font-medium whitespace-nowrap"
                  >
                    {variantLabel(v)}
                  </th>
                  {names.map((n) => {
                    const m = v.measures.find((x) => x.name === n);
                    return (
                      <td
                        key={n}
                        className="text-ink-800 py-1.5 pr-3 text-right tabular-nums"
                        title={m?.reason ?? undefined}
                      >
                        {m ? formatQuantity(m.value, m.unit, 4) : "—"}
                      </td>
                    );
                  })}
                  <td
                    className={`py-1.5 pr-3 text-right font-medium tabular-nums ${
                      v.checks.length === 0
                        ? "text-ink-500"
                        : passed === v.checks.length
                          ? "text-signal-ok"
                          : "text-signal-fault"
                    }`}
                  >
                    {v.checks.length === 0 ? "—" : `${passed}/${v.checks.length}`}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </section>
  );
}
