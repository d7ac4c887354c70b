import type { SolveSuccess, TraceResult } from "./types";

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

/** The CSV header for the given traces: frequency_hz, then re, im, dB and degrees per trace. */
export function csvHeader(traces: Pick<TraceResult, "name">[]): string {
  const cells = ["frequency_hz"];
  for (const t of traces) {
    for (const suffix of ["re", "im", "db", "deg"]) cells.push(csvField(`${t.name}_${suffix}`));
  }
  return cells.join(",");
}

/**
 * A solved sweep as RFC 4180 CSV (CRLF line ends): one row per frequency, columns
 * `frequency_hz,<trace>_re,<trace>_im,<trace>_db,<trace>_deg,…` in the order of `result.traces`.
 */
export function resultToCsv(result: Pick<SolveSuccess, "frequencies" | "traces">): string {
  const rows = [csvHeader(result.traces)];
  result.frequencies.forEach((f, k) => {
    const cells = [csvNumber(f)];
    for (const t of result.traces) {
      cells.push(
        csvNumber(t.re[k]),
        csvNumber(t.im[k]),
        csvNumber(t.magnitudeDb[k]),
        csvNumber(t.phaseDeg[k]),
      );
    }
    rows.push(cells.join(","));
  });
  return `${rows.join("\r\n")}\r\n`;
}
