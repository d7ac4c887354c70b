/**
 * The kinds of bench reading, declared once: the model, the zod schemas, the form and the
 * arithmetic derive from these lists. (The migration spells the same values, as migrations must.)
 */
export const READING_QUANTITIES = ["frequency", "period", "amplitude"] as const;
export type ReadingQuantity = (typeof READING_QUANTITIES)[number];

export const READING_FORMS = ["value", "divisions", "peak", "peak_to_peak"] as const;
export type ReadingForm = (typeof READING_FORMS)[number];

/** Which input forms each quantity takes, the first being the default. */
export const FORMS_OF: Record<ReadingQuantity, readonly ReadingForm[]> = {
  frequency: ["value"],
  period: ["divisions", "value"],
  amplitude: ["divisions", "peak", "peak_to_peak"],
};

export const QUANTITY_LABEL: Record<ReadingQuantity, string> = {
  frequency: "Frequency",
  period: "Period (oscilloscope)",
  amplitude: "Amplitude",
};

export function formLabel(quantity: ReadingQuantity, form: ReadingForm): string {
  if (form === "divisions")
    return quantity === "period" ? "divisions × time/div" : "peak-to-peak divisions × volts/div";
  if (form === "peak") return "peak, in volts";
  if (form === "peak_to_peak") return "peak-to-peak, in volts";
  return quantity === "period" ? "period, in seconds" : "frequency, in hertz";
}

/** The unit of the typed value (direct forms) or of the per-division scale (divisions). */
export function inputUnit(quantity: ReadingQuantity): "Hz" | "s" | "V" {
  return quantity === "frequency" ? "Hz" : quantity === "period" ? "s" : "V";
}
