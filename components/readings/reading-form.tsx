"use client";

import { useRouter } from "next/navigation";
import { useId, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { FieldErrors, inputClass } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { useHydrated } from "@/components/ui/use-hydrated";
import {
  FORMS_OF,
  formLabel,
  inputUnit,
  QUANTITY_LABEL,
  READING_QUANTITIES,
  type ReadingForm,
  type ReadingQuantity,
} from "@/lib/reading-kinds";
import { comparableMeasures, compareReading, deriveReading, percentileWords } from "@/lib/reading-math";
import { cn } from "@/lib/utils";
import { formatPercent, formatQuantity } from "@/solver/format";
import type { MeasureResult, MeasureStats } from "@/solver/types";
import { DEFAULT_UNIT, toSi, UNIT_CHOICES } from "./units";

type Fields = Record<string, string[]>;

const labelClass = "text-ink-800 mb-1 block text-sm font-medium";

/** The bench reading form: quantity, how it was read (with the arithmetic live), node, note, a file. */
export function BenchReadingForm({
  runId,
  measures,
  monteCarlo,
}: {
  runId: string;
  measures: MeasureResult[];
  monteCarlo?: MeasureStats[] | undefined;
}) {
  const router = useRouter();
  const hydrated = useHydrated();
  const uid = useId().replace(/[^a-zA-Z0-9_-]/g, "");
  const id = (name: string) => `rd-${uid}-${name}`;
  const formRef = useRef<HTMLFormElement>(null);
  const [quantity, setQuantity] = useState<ReadingQuantity>("period");
  const [form, setForm] = useState<ReadingForm>("divisions");
  const kind = inputUnit(quantity);
  const [value, setValue] = useState("");
  const [valueUnit, setValueUnit] = useState(DEFAULT_UNIT[kind]);
  const [divisions, setDivisions] = useState("");
  const [perDivision, setPerDivision] = useState("");
  const [perUnit, setPerUnit] = useState(DEFAULT_UNIT[kind]);
  const options = comparableMeasures(measures, quantity);
  const [measureName, setMeasureName] = useState(options[0]?.name ?? "");
  const [busy, setBusy] = useState(false);
  const [fields, setFields] = useState<Fields>({});
  const [message, setMessage] = useState<{ tone: "ok" | "fault"; text: string } | null>(null);

  function pickQuantity(q: ReadingQuantity) {
    setQuantity(q);
    setForm(FORMS_OF[q][0] ?? "value");
    setValueUnit(DEFAULT_UNIT[inputUnit(q)]);
    setPerUnit(DEFAULT_UNIT[inputUnit(q)]);
    setMeasureName(comparableMeasures(measures, q)[0]?.name ?? "");
    setValue("");
    setDivisions("");
    setPerDivision("");
    setFields({});
  }

  const numbers = {
    quantity,
    form,
    value: toSi(value, valueUnit, kind),
    divisions: toSi(divisions, "", kind), // a count: factor 1
    perDivision: toSi(perDivision, perUnit, kind),
  };
  const derived = deriveReading(numbers);
  const preview = derived ? compareReading(derived, measureName || null, measures, monteCarlo) : null;

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = new FormData(e.currentTarget);
    data.set("quantity", quantity);
    data.set("form", form);
    for (const key of ["value", "divisions", "perDivision"] as const) {
      const v = numbers[key];
      data.set(key, v === undefined ? "" : String(v));
    }
    const file = data.get("file");
    if (file instanceof File && file.size === 0) data.delete("file");
    setBusy(true);
    setMessage(null);
    setFields({});
    try {
      const res = await fetch(`/api/runs/${runId}/readings`, { method: "POST", body: data });
      const body = await res.json().catch(() => null);
      if (!res.ok) {
        setFields(body?.error?.details?.fields ?? {});
        setMessage({ tone: "fault", text: body?.error?.message ?? `Saving failed (${res.status}).` });
        return;
      }
      setMessage({ tone: "ok", text: `Recorded: ${body.reading.steps}.` });
      formRef.current?.reset();
      setValue("");
      setDivisions("");
      setPerDivision("");
      router.refresh();
    } catch {
      setMessage({ tone: "fault", text: "The reading did not reach the server. Try again." });
    } finally {
      setBusy(false);
    }
  }

  const err = (name: string) =>
    fields[name]?.length ? { "aria-invalid": true, "aria-describedby": id(`${name}-err`) } : {};
  const units = UNIT_CHOICES[kind];
  return (
    <form
      ref={formRef}
      onSubmit={submit}
      className="space-y-4"
      aria-label="Record a bench reading"
      noValidate
    >
      <div className="grid gap-3 sm:grid-cols-3">
        <div>
          <label htmlFor={id("quantity")} className={labelClass}>
            What was measured
          </label>
          <select
            id={id("quantity")}
            className={inputClass}
            value={quantity}
            onChange={(e) => pickQuantity(e.target.value as ReadingQuantity)}
            {...err("quantity")}
          >
            {READING_QUANTITIES.map((q) => (
              <option key={q} value={q}>
                {QUANTITY_LABEL[q]}
              </option>
            ))}
          </select>
          <FieldErrors id={id("quantity-err")} errors={fields.quantity} />
        </div>
        <div>
          <label htmlFor={id("form")} className={labelClass}>
            Read as
          </label>
          <select
            id={id("form")}
            className={inputClass}
            value={form}
            onChange={(e) => setForm(e.target.value as ReadingForm)}
            {...err("form")}
          >
            {FORMS_OF[quantity].map((f) => (
              <option key={f} value={f}>
                {formLabel(quantity, f)}
              </option>
            ))}
          </select>
          <FieldErrors id={id("form-err")} errors={fields.form} />
        </div>
        <div>
          <label htmlFor={id("measure")} className={labelClass}>
            Compare with
          </label>
          <select
            id={id("measure")}
            name="measureName"
            className={inputClass}
            value={measureName}
            onChange={(e) => setMeasureName(e.target.value)}
            {...err("measureName")}
          >
            <option value="">no prediction</option>
            {options.map((m) => (
              <option key={m.name} value={m.name}>
                {m.name} ({formatQuantity(m.value, m.unit, 4)})
              </option>
            ))}
          </select>
          <FieldErrors id={id("measureName-err")} errors={fields.measureName} />
        </div>
      </div>

      {form === "divisions" ? (
        <div className="grid gap-3 sm:grid-cols-2">
          <div>
            <label htmlFor={id("divisions")} className={labelClass}>
              {quantity === "period" ? "One period spans (divisions)" : "Peak-to-peak spans (divisions)"}
            </label>
            <input
              id={id("divisions")}
              inputMode="decimal"
              className={inputClass}
              value={divisions}
              onChange={(e) => setDivisions(e.target.value)}
              placeholder="9.8"
              {...err("divisions")}
            />
            <FieldErrors id={id("divisions-err")} errors={fields.divisions} />
          </div>
          <div>
            <label htmlFor={id("per")} className={labelClass}>
              {quantity === "period" ? "Time per division" : "Volts per division"}
            </label>
            <div className="flex gap-2">
              <input
                id={id("per")}
                inputMode="decimal"
                className={inputClass}
                value={perDivision}
                onChange={(e) => setPerDivision(e.target.value)}
                placeholder={quantity === "period" ? "10" : "1"}
                {...err("perDivision")}
              />
              <select
                aria-label="Unit per division"
                className={cn(inputClass, "w-28 shrink-0")}
                value={perUnit}
                onChange={(e) => setPerUnit(e.target.value)}
              >
                {units.map((u) => (
                  <option key={u.label} value={u.label}>
                    {u.label}/div
                  </option>
                ))}
              </select>
            </div>
            <FieldErrors id={id("perDivision-err")} errors={fields.perDivision} />
          </div>
        </div>
      ) : (
        <div className="sm:w-1/2">
          <label htmlFor={id("value")} className={labelClass}>
            {formLabel(quantity, form).replace(/, in \w+$/, "")}
          </label>
          <div className="flex gap-2">
            <input
              id={id("value")}
              inputMode="decimal"
              className={inputClass}
              value={value}
              onChange={(e) => setValue(e.target.value)}
              {...err("value")}
            />
            <select
              aria-label="Unit"
              className={cn(inputClass, "w-28 shrink-0")}
              value={valueUnit}
              onChange={(e) => setValueUnit(e.target.value)}
            >
              {units.map((u) => (
                <option key={u.label} value={u.label}>
                  {u.label}
                </option>
              ))}
            </select>
          </div>
          <FieldErrors id={id("value-err")} errors={fields.value} />
        </div>
      )}

      <output
        htmlFor={`${id("divisions")} ${id("per")} ${id("value")}`}
        aria-live="polite"
        className="bg-paper-50 border-paper-200 block rounded-md border px-3 py-2 font-mono text-sm"
      >
        {derived ? derived.steps : "Enter the numbers the bench showed to see the arithmetic."}
        {preview && preview.predicted !== null && preview.unit ? (
          <span className="text-ink-600 block font-sans">
            predicted {formatQuantity(preview.predicted, preview.unit, 4)} · deviation{" "}
            {formatPercent(preview.deviationPct, 3)}
            {preview.spread
              ? ` · ${percentileWords(preview.spread.percentile)}: ${preview.spread.verdict}`
              : ""}
          </span>
        ) : null}
      </output>

      <div className="grid gap-3 sm:grid-cols-3">
        <div>
          <label htmlFor={id("node")} className={labelClass}>
            Node
          </label>
          <input
            id={id("node")}
            name="node"
            className={inputClass}
            placeholder="out"
            maxLength={100}
            {...err("node")}
          />
          <FieldErrors id={id("node-err")} errors={fields.node} />
        </div>
        <div className="sm:col-span-2">
          <label htmlFor={id("note")} className={labelClass}>
            Note
          </label>
          <textarea
            id={id("note")}
            name="note"
            rows={2}
            className={inputClass}
            maxLength={2000}
            placeholder="Board 2, probe ×10, after 10 min warm-up"
            {...err("note")}
          />
          <FieldErrors id={id("note-err")} errors={fields.note} />
        </div>
      </div>
      <div>
        <label htmlFor={id("file")} className={labelClass}>
          Scope capture or CSV (optional)
        </label>
        <input
          id={id("file")}
          name="file"
          type="file"
          accept="image/png,image/jpeg,.csv,text/csv"
          className="text-sm"
          aria-describedby={id("file-hint")}
          {...err("file")}
        />
        <p id={id("file-hint")} className="text-caption text-ink-500 mt-1">
          PNG or JPEG up to 10 MB, CSV up to 5 MB; the content is checked, not the name.
        </p>
        <FieldErrors id={id("file-err")} errors={fields.file} />
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={busy || !hydrated}>
          {busy ? "Saving…" : "Record reading"}
        </Button>
        <div aria-live="polite" className="min-w-0 flex-1">
          {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
        </div>
      </div>
    </form>
  );
}
