import { formatQuantity } from "@/solver/format";

/**
 * How the plot writes its numbers: a value, a space, then the SI-prefixed unit ("1.6982 kHz",
 * "−3.01 dB"), degrees straight after the number ("45.0°"), and a true minus sign. Client-safe.
 */

const minus = (text: string) => text.replace(/^-/, "−");

/** Frequency with 5 significant figures like every measure on the page: "1.6982 kHz", "20 Hz", "1 MHz". */
export function formatHz(hz: number): string {
  return formatQuantity(hz, "Hz");
}

/** Magnitude with two decimals: "−3.01 dB", "0.00 dB". */
export function formatDb(db: number | null): string {
  if (db === null || !Number.isFinite(db)) return "—";
  return `${minus(db.toFixed(2)).replace(/^−(0\.00)$/, "$1")} dB`;
}

/** Phase with one decimal: "45.0°", "−179.9°". */
export function formatDeg(deg: number | null): string {
  if (deg === null || !Number.isFinite(deg)) return "—";
  return `${minus(deg.toFixed(1)).replace(/^−(0\.0)$/, "$1")}°`;
}

/** A signed difference for the cursor readout: "+1.25 kHz", "−6.02 dB", "+45.0°". */
export function formatSigned(value: number | null, format: (v: number) => string): string {
  if (value === null || !Number.isFinite(value)) return "—";
  const text = format(value);
  return value > 0 ? `+${text}` : text;
}

/** One hover label per point: "1.6982 kHz  ·  −3.01 dB" (magnitude row) or "… · 45.0°" (phase row). */
export function hoverTexts(
  frequencies: readonly number[],
  values: readonly (number | null)[],
  row: 1 | 2,
): string[] {
  const value = row === 1 ? formatDb : formatDeg;
  return frequencies.map((f, i) => `${formatHz(f)}  ·  ${value(values[i] ?? null)}`);
}
