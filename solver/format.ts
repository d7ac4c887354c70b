/**
 * Number formatting for results: SI prefixes for physical units, none for dB, degrees and ratios.
 * Client-safe and locale-independent (server and browser render the same text).
 */

const PREFIXES: [number, string][] = [
  [1e12, "T"],
  [1e9, "G"],
  [1e6, "M"],
  [1e3, "k"],
  [1, ""],
  [1e-3, "m"],
  [1e-6, "µ"],
  [1e-9, "n"],
  [1e-12, "p"],
  [1e-15, "f"],
];

/** Units that take an SI prefix; others (dB, deg, %, none) are shown as plain numbers. */
const PREFIXED_UNITS = new Set(["Hz", "V", "A", "Ω", "ohm", "F", "H", "S", "s", "W", "V/√Hz", "A/√Hz"]);

/** `digits` significant figures, without trailing zeros, in ASCII ("1.5915", "-5.462e-5"). */
function plainNumber(value: number, digits: number): string {
  const abs = Math.abs(value);
  return abs >= 1e-4 && abs < 1e9
    ? String(Number(value.toPrecision(digits)))
    : value.toExponential(digits - 1).replace(/\.?0+e/, "e");
}

const SUPERSCRIPT: Record<string, string> = {
  "-": "⁻",
  "+": "",
  "0": "⁰",
  "1": "¹",
  "2": "²",
  "3": "³",
  "4": "⁴",
  "5": "⁵",
  "6": "⁶",
  "7": "⁷",
  "8": "⁸",
  "9": "⁹",
};

/**
 * `digits` significant figures, without trailing zeros, for reading: "1.5915", "20", "−0.043214";
 * very small or large numbers as a power of ten, "−5.462×10⁻⁵".
 */
export function formatNumber(value: number, digits = 5): string {
  if (!Number.isFinite(value)) return value > 0 ? "∞" : value < 0 ? "−∞" : "—";
  if (value === 0) return "0";
  const text = plainNumber(value, digits).replace(
    /e([-+]?\d+)$/,
    (_, exp: string) => `×10${[...exp].map((c) => SUPERSCRIPT[c] ?? c).join("")}`,
  );
  return text.replace(/^-/, "−");
}

/** A value with its unit: "1.5915 kHz", "−9.5424 dB", "45.2°", "3.18". */
export function formatQuantity(value: number | null, unit: string, digits = 5): string {
  if (value === null) return "—";
  if (unit === "deg" || unit === "°") return `${formatNumber(value, digits)}°`;
  if (unit === "%") return `${formatNumber(value, digits)} %`;
  if (!PREFIXED_UNITS.has(unit) || value === 0 || !Number.isFinite(value)) {
    return unit ? `${formatNumber(value, digits)} ${unit}` : formatNumber(value, digits);
  }
  const abs = Math.abs(value);
  const [scale, prefix] = PREFIXES.find(([s]) => abs >= s * 0.999_999_5) ?? [1, ""];
  const u = unit === "ohm" ? "Ω" : unit;
  return `${formatNumber(value / scale, digits)} ${prefix}${u}`;
}

/** A signed difference: "+12.5 Hz", "−0.31 dB". */
export function formatDelta(value: number | null, unit: string, digits = 4): string {
  if (value === null) return "—";
  const text = formatQuantity(value, unit, digits);
  return value > 0 ? `+${text}` : text;
}

/** A signed percentage: "+4.2 %", "−54.64 %". */
export function formatPercent(value: number | null, digits = 4): string {
  if (value === null) return "—";
  const text = `${formatNumber(value, digits)} %`;
  return value > 0 ? `+${text}` : text;
}

/** A bare number with an SI prefix, as a netlist would write it: "4.7n", "22k", "1.5M", "500m". */
export function formatSiCompact(value: number, digits = 4): string {
  if (!Number.isFinite(value) || value === 0) return formatNumber(value, digits);
  const abs = Math.abs(value);
  if (abs >= 1 && abs < 1000) return plainNumber(value, digits);
  const [scale, prefix] = PREFIXES.find(([s]) => abs >= s * 0.999_999_5) ?? [1, ""];
  return `${plainNumber(value / scale, digits)}${prefix === "µ" ? "u" : prefix}`;
}
