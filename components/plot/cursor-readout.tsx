"use client";

import { useId } from "react";
import { inputClass } from "@/components/ui/field";
import { cn } from "@/lib/utils";
import { type BodeCursor, CURSOR_COLORS, cursorDelta, readCursor } from "./cursors";
import { formatDb, formatDeg, formatHz, formatSigned } from "./hover-format";
import type { BodeSeries } from "./types";

const PREFIX: Record<string, number> = { "": 1, k: 1e3, M: 1e6, G: 1e9, m: 1e-3, u: 1e-6, µ: 1e-6 };

/** "1.5k", "1.5 kHz", "1500", "2e3 Hz" → hertz; null when it is not a positive frequency. */
export function parseHz(text: string): number | null {
  const m = /^\s*([0-9]*\.?[0-9]+(?:[eE][-+]?\d+)?)\s*([kMGmuµ]?)\s*(?:Hz)?\s*$/.exec(text);
  if (!m) return null;
  const hz = Number(m[1]) * (PREFIX[m[2] ?? ""] ?? 1);
  return Number.isFinite(hz) && hz > 0 ? hz : null;
}

export interface CursorReadoutProps {
  series: BodeSeries[];
  traceName: string;
  onTraceName: (name: string) => void;
  cursors: BodeCursor[];
  onCursor: (id: BodeCursor["id"], frequencyHz: number | null) => void;
}

/** f, dB and degrees at cursors A and B on one trace, and B − A; each frequency can be typed too. */
export function CursorReadout({ series, traceName, onTraceName, cursors, onCursor }: CursorReadoutProps) {
  const selectId = useId();
  const trace = series.find((s) => s.name === traceName) ?? series[0];
  const byId = (id: BodeCursor["id"]) => cursors.find((c) => c.id === id);
  const readings = (["A", "B"] as const).map((id) => {
    const c = byId(id);
    return c ? readCursor(trace, c) : null;
  });
  const [a, b] = readings;
  const delta = a && b ? cursorDelta(a, b) : null;
  return (
    <section
      aria-label="Cursor readout"
      className="border-paper-200 bg-paper-50 mt-2 rounded-md border p-2 text-sm"
    >
      <div className="mb-1 flex flex-wrap items-center gap-2">
        <label htmlFor={selectId} className="text-caption text-ink-600 font-medium">
          Cursors read
        </label>
        <select
          id={selectId}
          value={trace?.name ?? ""}
          onChange={(e) => onTraceName(e.target.value)}
          className={cn(inputClass, "h-8 w-auto py-0 text-sm")}
        >
          {series.map((s) => (
            <option key={s.name} value={s.name}>
              {s.name}
            </option>
          ))}
        </select>
      </div>
      <div className="overflow-x-auto">
        <table className="w-full min-w-[20rem] font-mono text-[0.8125rem] tabular-nums">
          <thead className="text-caption text-ink-500 text-left font-sans">
            <tr>
              <th scope="col" className="w-10 py-1 font-medium">
                <span className="sr-only">Cursor</span>
              </th>
              <th scope="col" className="py-1 font-medium">
                frequency
              </th>
              <th scope="col" className="py-1 font-medium">
                magnitude
              </th>
              <th scope="col" className="py-1 font-medium">
                phase
              </th>
            </tr>
          </thead>
          <tbody>
            {(["A", "B"] as const).map((id, i) => {
              const r = readings[i];
              return (
                <tr key={id} data-cursor={id}>
                  <th scope="row" className="py-0.5 text-left">
                    <span
                      className="inline-block rounded-[2px] px-1.5 text-xs font-bold text-white"
                      style={{ background: CURSOR_COLORS[id] }}
                    >
                      {id}
                    </span>
                  </th>
                  <td className="py-0.5 pr-2">
                    <input
                      key={r ? r.frequencyHz : "none"}
                      aria-label={`Cursor ${id} frequency`}
                      defaultValue={r ? formatHz(r.frequencyHz) : ""}
                      placeholder="click the plot"
                      className={cn(inputClass, "h-7 w-32 px-1.5 py-0 font-mono text-[0.8125rem]")}
                      onKeyDown={(e) => {
                        if (e.key === "Enter") e.currentTarget.blur();
                      }}
                      onBlur={(e) => {
                        const text = e.currentTarget.value.trim();
                        if (text === "") return onCursor(id, null);
                        const hz = parseHz(text);
                        if (hz !== null) onCursor(id, hz);
                        else e.currentTarget.value = r ? formatHz(r.frequencyHz) : "";
                      }}
                    />
                  </td>
                  <td className="py-0.5 pr-2">{r ? formatDb(r.db) : "—"}</td>
                  <td className="py-0.5">{r ? formatDeg(r.deg) : "—"}</td>
                </tr>
              );
            })}
            <tr data-cursor="delta" className="border-paper-300 border-t">
              <th scope="row" className="text-ink-600 py-0.5 text-left font-sans text-xs font-semibold">
                B − A
              </th>
              <td className="py-0.5 pr-2">{delta ? formatSigned(delta.hz, formatHz) : "—"}</td>
              <td className="py-0.5 pr-2">{delta ? formatSigned(delta.db, formatDb) : "—"}</td>
              <td className="py-0.5">{delta ? formatSigned(delta.deg, formatDeg) : "—"}</td>
            </tr>
          </tbody>
        </table>
      </div>
    </section>
  );
}
