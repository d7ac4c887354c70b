"use client";

import { FieldErrors, fileInputClass, inputClass } from "@/components/ui/field";
import {
  FORMS_OF,
  formLabel,
  QUANTITY_LABEL,
  READING_QUANTITIES,
  type ReadingForm,
  type ReadingQuantity,
} from "@/lib/reading-kinds";
import { cn } from "@/lib/utils";
import { formatQuantity } from "@/solver/format";
import type { MeasureResult } from "@/solver/types";

/**
 * The parts of the bench reading form, by role: what was measured, and where and how (the numbers the
 * bench showed are in reading-numbers.tsx). Each input names its field errors (aria-invalid, aria-describedby) through `FieldKit`.
 */
export interface FieldKit {
  /** The element id of a field (or of its error list: `${name}-err`). */
  id: (name: string) => string;
  /** aria-invalid and aria-describedby when the field has errors. */
  err: (name: string) => { "aria-invalid"?: true; "aria-describedby"?: string };
  errors: Record<string, string[]>;
}

export const labelClass = "text-ink-800 mb-1 block text-sm font-medium";

/** Quantity, how it was read, and which predicted measure to compare with. */
export function WhatFields({
  kit,
  quantity,
  onQuantity,
  form,
  onForm,
  measureName,
  onMeasure,
  options,
}: {
  kit: FieldKit;
  quantity: ReadingQuantity;
  onQuantity: (q: ReadingQuantity) => void;
  form: ReadingForm;
  onForm: (f: ReadingForm) => void;
  measureName: string;
  onMeasure: (name: string) => void;
  options: MeasureResult[];
}) {
  const { id, err, errors } = kit;
  return (
    <div className="grid gap-3 sm:grid-cols-3">
      <div>
        <label htmlFor={id("quantity")} className={labelClass}>
          What was measured
        </label>
        <select
          id={id("quantity")}
          className={inputClass}
          value={quantity}
          onChange={(e) => onQuantity(e.target.value as ReadingQuantity)}
          {...err("quantity")}
        >
          {READING_QUANTITIES.map((q) => (
            <option key={q} value={q}>
              {QUANTITY_LABEL[q]}
            </option>
          ))}
        </select>
        <FieldErrors id={id("quantity-err")} errors={errors.quantity} />
      </div>
      <div>
        <label htmlFor={id("form")} className={labelClass}>
          Read as
        </label>
        <select
          id={id("form")}
          className={inputClass}
          value={form}
          onChange={(e) => onForm(e.target.value as ReadingForm)}
          {...err("form")}
        >
          {FORMS_OF[quantity].map((f) => (
            <option key={f} value={f}>
              {formLabel(quantity, f)}
            </option>
          ))}
        </select>
        <FieldErrors id={id("form-err")} errors={errors.form} />
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
          onChange={(e) => onMeasure(e.target.value)}
          {...err("measureName")}
        >
          <option value="">no prediction</option>
          {options.map((m) => (
            <option key={m.name} value={m.name}>
              {m.name} ({formatQuantity(m.value, m.unit, 4)})
            </option>
          ))}
        </select>
        <FieldErrors id={id("measureName-err")} errors={errors.measureName} />
      </div>
    </div>
  );
}

/** Where and how: node, note, and an optional scope capture or CSV. */
export function AboutFields({ kit }: { kit: FieldKit }) {
  const { id, err, errors } = kit;
  return (
    <>
      <div className="grid gap-3 sm:grid-cols-3">
        <div>
          <label htmlFor={id("node")} className={labelClass}>
            Node
          </label>
          <input
            id={id("node")}
            name="node"
            className={inputClass}
            placeholder="e.g. out"
            maxLength={100}
            {...err("node")}
          />
          <FieldErrors id={id("node-err")} errors={errors.node} />
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
            placeholder="e.g. Board 2, probe ×10, after 10 min warm-up"
            {...err("note")}
          />
          <FieldErrors id={id("note-err")} errors={errors.note} />
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
          className={fileInputClass}
          aria-describedby={cn(id("file-hint"), errors.file?.length && id("file-err"))}
          aria-invalid={errors.file?.length ? true : undefined}
        />
        <p id={id("file-hint")} className="text-caption text-ink-500 mt-1">
          PNG or JPEG up to 10 MB, CSV up to 5 MB; the content is checked, not the name.
        </p>
        <FieldErrors id={id("file-err")} errors={errors.file} />
      </div>
    </>
  );
}
