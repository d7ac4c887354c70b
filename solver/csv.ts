import type { NoiseResult, SolveSuccess, TraceResult } from "./types";

/**
 * A text cell that a spreadsheet would run as a formula (starting with =, +, -, @, tab or CR) gets a
 * leading apostrophe, as the OWASP "CSV Injection" guidance recommends; other text is unchanged.
 */
export function neutralizeCell(value: string): string {
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
}

/**
 * A text cell (trace and column names): neutralized against formula injection, then quoted when
 * RFC 4180 requires it (comma, double quote, CR or LF inside). Every text cell of every CSV export
 * goes through here; numbers go through `csvNumber` (digits, '.', 'e' and a sign only: never a formula).
 */
export function csvField(value: string): string {
  const safe = neutralizeCell(value);
  if (/[",\r\n]/.test(safe)) return `"${safe.replaceAll('"', '""')}"`;
  return safe;
}

/** A number as CSV text: shortest round-trip form; NaN, ±Infinity and missing values become empty. */
export function csvNumber(value: number | null | undefined): string {
  return typeof value === "number" && Number.isFinite(value) ? String(value) : "";
}

type CsvTrace = Pick<TraceResult, "name"> & { groupDelay?: unknown };
type CsvNoise = Pick<NoiseResult, "name" | "inputDensity">;

/**
 * The CSV header: frequency_hz, then re, im, dB and degrees per trace (and `_delay_s` when the trace
 * has a group delay), then per noise `<name>_noise_v_per_rthz` (and `_input_noise_v_per_rthz`).
 */
export function csvHeader(traces: CsvTrace[], noise: CsvNoise[] = []): string {
  const cells = ["frequency_hz"];
  for (const t of traces) {
    for (const suffix of ["re", "im", "db", "deg"]) cells.push(csvField(`${t.name}_${suffix}`));
    if (t.groupDelay) cells.push(csvField(`${t.name}_delay_s`));
  }
  for (const n of noise) {
    cells.push(csvField(`${n.name}_noise_v_per_rthz`));
    if (n.inputDensity) cells.push(csvField(`${n.name}_input_noise_v_per_rthz`));
  }
  return cells.join(",");
}

/**
 * A solved sweep as RFC 4180 CSV (CRLF line ends): one row per frequency, columns
 * `frequency_hz,<trace>_re,<trace>_im,<trace>_db,<trace>_deg[,<trace>_delay_s],…` in the order of
 * `result.traces`, then the noise densities (V/√Hz) of `result.noise`.
 */
export function resultToCsv(result: Pick<SolveSuccess, "frequencies" | "traces" | "noise">): string {
  const noise = result.noise ?? [];
  const rows = [csvHeader(result.traces, noise)];
  result.frequencies.forEach((f, k) => {
    const cells = [csvNumber(f)];
    for (const t of result.traces) {
      cells.push(
        csvNumber(t.re[k]),
        csvNumber(t.im[k]),
        csvNumber(t.magnitudeDb[k]),
        csvNumber(t.phaseDeg[k]),
      );
      if (t.groupDelay) cells.push(csvNumber(t.groupDelay[k]));
    }
    for (const n of noise) {
      cells.push(csvNumber(n.density[k]));
      if (n.inputDensity) cells.push(csvNumber(n.inputDensity[k]));
    }
    rows.push(cells.join(","));
  });
  return `${rows.join("\r\n")}\r\n`;
}
