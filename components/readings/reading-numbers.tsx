"use client";

import { FieldErrors, inputClass } from "@/components/ui/field";
import { formLabel, type ReadingForm, type ReadingQuantity } from "@/lib/reading-kinds";
import { cn } from "@/lib/utils";
import { type FieldKit, labelClass } from "./reading-fields";
import type { UnitChoice } from "./units";

/** A number input with its unit select beside it. */
function NumberWithUnit({
  kit,
  inputId,
  field,
  value,
  onValue,
  placeholder,
  unit,
  onUnit,
  units,
  unitLabel,
  suffix = "",
}: {
  kit: FieldKit;
  inputId: string;
  field: string;
  value: string;
  onValue: (v: string) => void;
  placeholder?: string;
  unit: string;
  onUnit: (u: string) => void;
  units: UnitChoice[];
  unitLabel: string;
  suffix?: string;
}) {
  return (
    <div className="flex gap-2">
      <input
        id={inputId}
        inputMode="decimal"
        className={inputClass}
        value={value}
        onChange={(e) => onValue(e.target.value)}
        placeholder={placeholder}
        {...kit.err(field)}
      />
      <select
        aria-label={unitLabel}
        className={cn(inputClass, "w-28 shrink-0")}
        value={unit}
        onChange={(e) => onUnit(e.target.value)}
      >
        {units.map((u) => (
          <option key={u.label} value={u.label}>
            {u.label}
            {suffix}
          </option>
        ))}
      </select>
    </div>
  );
}

export type Numbers = {
  value: string;
  valueUnit: string;
  divisions: string;
  perDivision: string;
  perUnit: string;
};

/** The numbers as the bench showed them: divisions × per-division, or one value in a unit. */
export function NumberFields({
  kit,
  quantity,
  form,
  numbers,
  onChange,
  units,
}: {
  kit: FieldKit;
  quantity: ReadingQuantity;
  form: ReadingForm;
  numbers: Numbers;
  onChange: (patch: Partial<Numbers>) => void;
  units: UnitChoice[];
}) {
  const { id, err, errors } = kit;
  if (form !== "divisions") {
    return (
      <div className="sm:w-1/2">
        <label htmlFor={id("value")} className={labelClass}>
          {formLabel(quantity, form).replace(/, in \w+$/, "")}
        </label>
        <NumberWithUnit
          kit={kit}
          inputId={id("value")}
          field="value"
          value={numbers.value}
          onValue={(value) => onChange({ value })}
          unit={numbers.valueUnit}
          onUnit={(valueUnit) => onChange({ valueUnit })}
          units={units}
          unitLabel="Unit"
        />
        <FieldErrors id={id("value-err")} errors={errors.value} />
      </div>
    );
  }
  return (
    <div className="grid gap-3 sm:grid-cols-2">
      <div>
        <label htmlFor={id("divisions")} className={labelClass}>
          {quantity === "period" ? "One period spans (divisions)" : "Peak-to-peak spans (divisions)"}
        </label>
        <input
          id={id("divisions")}
          inputMode="decimal"
          className={inputClass}
          value={numbers.divisions}
          onChange={(e) => onChange({ divisions: e.target.value })}
          placeholder="e.g. 9.8"
          {...err("divisions")}
        />
        <FieldErrors id={id("divisions-err")} errors={errors.divisions} />
      </div>
      <div>
        <label htmlFor={id("per")} className={labelClass}>
          {quantity === "period" ? "Time per division" : "Volts per division"}
        </label>
        <NumberWithUnit
          kit={kit}
          inputId={id("per")}
          field="perDivision"
          value={numbers.perDivision}
          onValue={(perDivision) => onChange({ perDivision })}
          placeholder={quantity === "period" ? "e.g. 10" : "e.g. 1"}
          unit={numbers.perUnit}
          onUnit={(perUnit) => onChange({ perUnit })}
          units={units}
          unitLabel="Unit per division"
          suffix="/div"
        />
        <FieldErrors id={id("perDivision-err")} errors={errors.perDivision} />
      </div>
    </div>
  );
}
