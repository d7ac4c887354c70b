/** Unit choices of the readings form: the typed number × 10^exp = the SI value sent to the API. */
export type UnitChoice = { label: string; exp: number };

export const UNIT_CHOICES: Record<"Hz" | "s" | "V", UnitChoice[]> = {
  Hz: [
    { label: "Hz", exp: 0 },
    { label: "kHz", exp: 3 },
    { label: "MHz", exp: 6 },
  ],
  s: [
    { label: "s", exp: 0 },
    { label: "ms", exp: -3 },
    { label: "µs", exp: -6 },
    { label: "ns", exp: -9 },
  ],
  V: [
    { label: "V", exp: 0 },
    { label: "mV", exp: -3 },
  ],
};

/** The default unit of each kind: what a bench usually shows. */
export const DEFAULT_UNIT: Record<"Hz" | "s" | "V", string> = { Hz: "kHz", s: "µs", V: "V" };

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * A typed number in a unit → SI, or undefined while the text is not a number. The prefix is applied
 * in the decimal text ("10" µs → "10e-6"), so 10 µs is exactly the double nearest 1e-5.
 */
export function toSi(text: string, unit: string, kind: "Hz" | "s" | "V"): number | undefined {
  const t = text.trim().replace(",", ".");
  if (!DECIMAL.test(t)) return undefined;
  const exp = UNIT_CHOICES[kind].find((u) => u.label === unit)?.exp ?? 0;
  const [mantissa, e = "0"] = t.toLowerCase().split("e");
  const n = Number(`${mantissa}e${Number(e) + exp}`);
  return Number.isFinite(n) ? n : undefined;
}
