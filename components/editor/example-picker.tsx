"use client";

import type { NetlistExample } from "@/lib/examples";

export type { NetlistExample };

export interface ExamplePickerProps {
  examples: NetlistExample[];
  onPick: (example: NetlistExample) => void;
}

/** A select that loads one of the bundled example netlists into the editor. */
export function ExamplePicker({ examples, onPick }: ExamplePickerProps) {
  if (examples.length === 0) return null;
  return (
    <label className="text-ink-600 flex min-w-0 items-center gap-2 text-sm">
      <span className="shrink-0">Start from</span>
      <select
        className="border-paper-300 text-ink-800 h-8 max-w-56 min-w-0 rounded-md border bg-white px-2 text-sm"
        value=""
        onChange={(e) => {
          const ex = examples.find((x) => x.name === e.target.value);
          if (ex) onPick(ex);
        }}
      >
        <option value="">an example…</option>
        {examples.map((ex) => (
          <option key={ex.name} value={ex.name}>
            {ex.title}
          </option>
        ))}
      </select>
    </label>
  );
}
