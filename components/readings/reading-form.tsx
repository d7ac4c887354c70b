"use client";

import { useId, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { useHydrated } from "@/components/ui/use-hydrated";
import { FORMS_OF, inputUnit, type ReadingForm, type ReadingQuantity } from "@/lib/reading-kinds";
import { comparableMeasures, compareReading, deriveReading, percentileWords } from "@/lib/reading-math";
import { formatPercent, formatQuantity } from "@/solver/format";
import type { MeasureResult, MeasureStats } from "@/solver/types";
import { AboutFields, type FieldKit, WhatFields } from "./reading-fields";
import { NumberFields, type Numbers } from "./reading-numbers";
import { ReadingRefused, useRecordReading } from "./readings-query";
import { DEFAULT_UNIT, toSi, UNIT_CHOICES } from "./units";

const emptyNumbers = (unit: string): Numbers => ({
  value: "",
  valueUnit: unit,
  divisions: "",
  perDivision: "",
  perUnit: unit,
});

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
  const hydrated = useHydrated();
  const uid = useId().replace(/[^a-zA-Z0-9_-]/g, "");
  const formRef = useRef<HTMLFormElement>(null);
  const [quantity, setQuantity] = useState<ReadingQuantity>("period");
  const [form, setForm] = useState<ReadingForm>("divisions");
  const kind = inputUnit(quantity);
  const [typed, setTyped] = useState<Numbers>(emptyNumbers(DEFAULT_UNIT[kind]));
  const options = comparableMeasures(measures, quantity);
  const [measureName, setMeasureName] = useState(options[0]?.name ?? "");
  const record = useRecordReading(runId);

  const refused = record.error instanceof ReadingRefused ? record.error : null;
  const errors = refused?.fields ?? {};
  const id = (name: string) => `rd-${uid}-${name}`;
  const kit: FieldKit = {
    id,
    errors,
    err: (name) =>
      errors[name]?.length ? { "aria-invalid": true, "aria-describedby": id(`${name}-err`) } : {},
  };

  function pickQuantity(q: ReadingQuantity) {
    setQuantity(q);
    setForm(FORMS_OF[q][0] ?? "value");
    setTyped(emptyNumbers(DEFAULT_UNIT[inputUnit(q)]));
    setMeasureName(comparableMeasures(measures, q)[0]?.name ?? "");
    record.reset();
  }

  const numbers = {
    quantity,
    form,
    value: toSi(typed.value, typed.valueUnit, kind),
    divisions: toSi(typed.divisions, "", kind), // a count: factor 1
    perDivision: toSi(typed.perDivision, typed.perUnit, kind),
  };
  const derived = deriveReading(numbers);
  const preview = derived ? compareReading(derived, measureName || null, measures, monteCarlo) : null;

  function submit(e: React.FormEvent<HTMLFormElement>) {
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
    record.mutate(data, {
      onSuccess: () => {
        formRef.current?.reset();
        setTyped((t) => ({ ...t, value: "", divisions: "", perDivision: "" }));
      },
    });
  }

  const message = record.isError
    ? { tone: "fault" as const, text: record.error.message }
    : record.data
      ? { tone: "ok" as const, text: `Recorded: ${record.data.steps}.` }
      : null;
  return (
    <form
      ref={formRef}
      onSubmit={submit}
      className="space-y-4"
      aria-label="Record a bench reading"
      noValidate
    >
      <WhatFields
        kit={kit}
        quantity={quantity}
        onQuantity={pickQuantity}
        form={form}
        onForm={setForm}
        measureName={measureName}
        onMeasure={setMeasureName}
        options={options}
      />
      <NumberFields
        kit={kit}
        quantity={quantity}
        form={form}
        numbers={typed}
        onChange={(patch) => setTyped((t) => ({ ...t, ...patch }))}
        units={UNIT_CHOICES[kind]}
      />
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
      <AboutFields kit={kit} />
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={record.isPending || !hydrated}>
          {record.isPending ? "Saving…" : "Record reading"}
        </Button>
        <div aria-live="polite" className="min-w-0 flex-1">
          {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
        </div>
      </div>
    </form>
  );
}
