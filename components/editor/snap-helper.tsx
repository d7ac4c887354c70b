"use client";

import { useId, useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import {
  DEFAULT_C_RANGE,
  DEFAULT_R_RANGE,
  netlistNumber,
  pairLets,
  rankPairs,
  SERIES_NAMES,
  SNAP_NETWORKS,
  type SnapNetwork,
} from "@/lib/snap-pairs";
import { formatQuantity } from "@/solver/format";
import type { SeriesName } from "@/solver/lang/eseries";
import { parseNumberText } from "@/solver/lang/numbers";

export interface SnapHelperProps {
  /** Called with `let R = 16k\nlet C = 10n\n` when the user inserts a pair. */
  onInsert: (text: string) => void;
  /** Names of the inserted lets (default R and C). */
  names?: { r: string; c: string };
  /** Starting target frequency text, e.g. "1kHz". */
  initialTarget?: string;
}

/** A number typed in the netlist's notation ("1kHz", "4k7", "100p"), or a message. */
function readValue(text: string, expect: string): { value: number } | { error: string } {
  const t = text.trim();
  if (t === "") return { error: "Enter a value." };
  // "2.74 kHz" as well as "2.74kHz": a blank between the number and its unit is fine here.
  const r = parseNumberText(t.replace(/^\+/, "").replace(/\s+/g, ""));
  if (!r.ok) return { error: r.message.replace(/`/g, "") };
  if (r.unit !== null && r.unit !== expect) return { error: `Expected ${expect}, got ${r.unit}.` };
  if (!(r.value > 0)) return { error: "Must be above zero." };
  return { value: r.value };
}

const selectClass =
  "block w-full rounded-md border border-paper-300 bg-white px-2 py-2 text-sm text-ink-900 hover:border-ink-300";

/**
 * Standard-value pairs for a target frequency: pick the network, the series for R and C and
 * their ranges; the table lists pairs by frequency error and inserts the chosen pair as lets.
 */
export function SnapHelper({
  onInsert,
  names = { r: "R", c: "C" },
  initialTarget = "1kHz",
}: SnapHelperProps) {
  const id = useId();
  const [target, setTarget] = useState(initialTarget);
  const [network, setNetwork] = useState<SnapNetwork>("rc");
  const [rSeries, setRSeries] = useState<SeriesName>("E24");
  const [cSeries, setCSeries] = useState<SeriesName>("E12");
  const [rMin, setRMin] = useState(netlistNumber(DEFAULT_R_RANGE[0]));
  const [rMax, setRMax] = useState(netlistNumber(DEFAULT_R_RANGE[1]));
  const [cMin, setCMin] = useState(netlistNumber(DEFAULT_C_RANGE[0]));
  const [cMax, setCMax] = useState(netlistNumber(DEFAULT_C_RANGE[1]));
  const [inserted, setInserted] = useState<string | null>(null);

  const parsed = useMemo(() => {
    const fields = {
      target: readValue(target, "Hz"),
      rMin: readValue(rMin, "ohm"),
      rMax: readValue(rMax, "ohm"),
      cMin: readValue(cMin, "F"),
      cMax: readValue(cMax, "F"),
    };
    const errors: Partial<Record<keyof typeof fields, string>> = {};
    for (const [k, v] of Object.entries(fields)) if ("error" in v) errors[k as keyof typeof fields] = v.error;
    const val = (k: keyof typeof fields) => {
      const v = fields[k];
      return "value" in v ? v.value : Number.NaN;
    };
    if (!errors.rMax && !errors.rMin && val("rMax") < val("rMin")) errors.rMax = "Below the lower limit.";
    if (!errors.cMax && !errors.cMin && val("cMax") < val("cMin")) errors.cMax = "Below the lower limit.";
    return { errors, val };
  }, [target, rMin, rMax, cMin, cMax]);

  const pairs = useMemo(() => {
    if (Object.keys(parsed.errors).length > 0) return [];
    const v = parsed.val;
    return rankPairs({
      targetHz: v("target"),
      network,
      rSeries,
      cSeries,
      rRange: [v("rMin"), v("rMax")],
      cRange: [v("cMin"), v("cMax")],
      limit: 10,
    });
  }, [parsed, network, rSeries, cSeries]);

  const formula = SNAP_NETWORKS.find((n) => n.id === network)?.formula ?? "";
  const err = parsed.errors;
  const small = (field: string, label: string, value: string, set: (v: string) => void, error?: string) => (
    <div className="space-y-1">
      <label htmlFor={`${id}-${field}`} className="text-ink-700 block text-xs font-medium">
        {label}
      </label>
      <input
        id={`${id}-${field}`}
        value={value}
        onChange={(e) => set(e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-${field}-error` : undefined}
        className={`${inputClass} py-1.5 font-mono text-sm`}
        spellCheck={false}
      />
      {error ? (
        <p id={`${id}-${field}-error`} className="text-signal-fault text-xs" role="alert">
          {error}
        </p>
      ) : null}
    </div>
  );

  return (
    <section
      aria-labelledby={`${id}-title`}
      className="border-paper-200 rounded-panel space-y-4 border bg-white p-4"
    >
      <div>
        <h3 id={`${id}-title`} className="text-ink-900 font-semibold">
          Standard parts for a frequency
        </h3>
        <p className="text-caption text-ink-500">{formula} · IEC 60063 series · ranked by frequency error</p>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        {small("target", "Target frequency", target, setTarget, err.target)}
        <div className="space-y-1">
          <label htmlFor={`${id}-network`} className="text-ink-700 block text-xs font-medium">
            Network
          </label>
          <select
            id={`${id}-network`}
            value={network}
            onChange={(e) => setNetwork(e.target.value as SnapNetwork)}
            className={selectClass}
          >
            {SNAP_NETWORKS.map((n) => (
              <option key={n.id} value={n.id}>
                {n.label}
              </option>
            ))}
          </select>
        </div>
        <div className="space-y-1">
          <label htmlFor={`${id}-rs`} className="text-ink-700 block text-xs font-medium">
            Series for R
          </label>
          <select
            id={`${id}-rs`}
            value={rSeries}
            onChange={(e) => setRSeries(e.target.value as SeriesName)}
            className={selectClass}
          >
            {SERIES_NAMES.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </div>
        <div className="space-y-1">
          <label htmlFor={`${id}-cs`} className="text-ink-700 block text-xs font-medium">
            Series for C
          </label>
          <select
            id={`${id}-cs`}
            value={cSeries}
            onChange={(e) => setCSeries(e.target.value as SeriesName)}
            className={selectClass}
          >
            {SERIES_NAMES.map((s) => (
              <option key={s}>{s}</option>
            ))}
          </select>
        </div>
        <div className="grid grid-cols-2 gap-2">
          {small("rmin", "R from", rMin, setRMin, err.rMin)}
          {small("rmax", "R to", rMax, setRMax, err.rMax)}
        </div>
        <div className="grid grid-cols-2 gap-2">
          {small("cmin", "C from", cMin, setCMin, err.cMin)}
          {small("cmax", "C to", cMax, setCMax, err.cMax)}
        </div>
      </div>
      {pairs.length === 0 ? (
        <p className="text-ink-500 text-sm">
          {Object.keys(err).length > 0 ? "Fix the fields above to see pairs." : "No pair fits these ranges."}
        </p>
      ) : (
        <table className="w-full text-sm">
          <caption className="sr-only">Standard R and C pairs, smallest frequency error first</caption>
          <thead>
            <tr className="border-paper-200 text-ink-500 border-b text-left">
              <th scope="col" className="py-1.5 pr-2 font-medium">
                R
              </th>
              <th scope="col" className="py-1.5 pr-2 font-medium">
                C
              </th>
              <th scope="col" className="py-1.5 pr-2 text-right font-medium">
                f
              </th>
              <th scope="col" className="py-1.5 pr-2 text-right font-medium">
                error
              </th>
              <th scope="col" className="py-1.5 text-right font-medium">
                <span className="sr-only">Insert</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {pairs.map((p) => {
              const text = pairLets(p, names);
              return (
                <tr key={`${p.r}|${p.c}`} className="border-paper-100 border-b last:border-0">
                  <td className="py-1 pr-2 font-mono">{netlistNumber(p.r)}</td>
                  <td className="py-1 pr-2 font-mono">{netlistNumber(p.c)}</td>
                  <td className="py-1 pr-2 text-right tabular-nums">
                    {formatQuantity(p.frequencyHz, "Hz", 5)}
                  </td>
                  <td
                    className={`py-1 pr-2 text-right tabular-nums ${
                      Math.abs(p.errorPct) < 1
                        ? "text-signal-ok"
                        : Math.abs(p.errorPct) < 5
                          ? "text-signal-warn"
                          : "text-signal-fault"
                    }`}
                  >
                    {p.errorPct >= 0 ? "+" : "−"}
                    {Math.abs(p.errorPct).toFixed(2)} %
                  </td>
                  <td className="py-1 text-right">
                    <Button
                      size="sm"
                      variant="secondary"
                      className="h-7 px-2"
                      onClick={() => {
                        onInsert(text);
                        setInserted(text.trim().replace("\n", ", "));
                      }}
                      aria-label={`Insert ${names.r} = ${netlistNumber(p.r)} and ${names.c} = ${netlistNumber(p.c)}`}
                    >
                      Insert
                    </Button>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
      {inserted ? (
        <p className="text-caption text-board-700" aria-live="polite">
          Inserted {inserted}.
        </p>
      ) : null}
    </section>
  );
}
