"use client";

import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import type { PinDraft } from "./comment-form";

/** The keyboard way to pin a comment: type a frequency (Hz, k/M allowed) and pick a trace. */
export function PinPicker({ traces, onPin }: { traces: string[]; onPin: (pin: PinDraft) => void }) {
  const id = useId();
  const [text, setText] = useState("");
  const [trace, setTrace] = useState(traces[0] ?? "");
  const [error, setError] = useState<string | null>(null);
  const apply = () => {
    const m = /^\s*([0-9]*\.?[0-9]+(?:e[+-]?\d+)?)\s*([kM]?)\s*(?:Hz)?\s*$/i.exec(text);
    const scale = m?.[2] === "k" || m?.[2] === "K" ? 1e3 : m?.[2] === "M" ? 1e6 : 1;
    const hz = m ? Number(m[1]) * scale : Number.NaN;
    if (!(hz > 0)) {
      setError("Write a frequency such as 1.6k or 1600 Hz.");
      return;
    }
    setError(null);
    onPin({ frequencyHz: hz, trace: trace || null });
  };
  return (
    <details className="text-sm">
      <summary className="text-ink-600 hover:text-ink-900 cursor-pointer">Pin by typing a frequency</summary>
      <div className="mt-2 flex flex-wrap items-end gap-2">
        <div>
          <label htmlFor={`${id}-f`} className="text-ink-700 mb-1 block">
            Frequency
          </label>
          <input
            id={`${id}-f`}
            className={`${inputClass} w-32`}
            value={text}
            onChange={(e) => setText(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === "Enter") {
                e.preventDefault();
                apply();
              }
            }}
            placeholder="1.6k"
            aria-describedby={`${id}-err`}
          />
        </div>
        {traces.length > 0 ? (
          <div>
            <label htmlFor={`${id}-t`} className="text-ink-700 mb-1 block">
              Trace
            </label>
            <select
              id={`${id}-t`}
              className={inputClass}
              value={trace}
              onChange={(e) => setTrace(e.target.value)}
            >
              {traces.map((t) => (
                <option key={t} value={t}>
                  {t}
                </option>
              ))}
            </select>
          </div>
        ) : null}
        <Button size="sm" variant="secondary" onClick={apply}>
          Pin
        </Button>
      </div>
      <p id={`${id}-err`} aria-live="polite" className="text-signal-fault mt-1">
        {error}
      </p>
    </details>
  );
}
