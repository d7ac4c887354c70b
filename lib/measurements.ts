import { authorizeProject } from "@/lib/authz";
import { Measurement, type MeasurementData, sequelize, User } from "@/lib/db";
import { BadRequestError, TooLargeError, withDb } from "@/lib/errors";
import type { Actor } from "@/lib/session";

/** Bench data limits: 2 MB of CSV, 20 000 rows. */
export const MAX_MEASUREMENT_BYTES = 2_000_000;
export const MAX_MEASUREMENT_ROWS = 20_000;

export type CsvLineError = { line: number; message: string };
export type ParsedMeasurement = { ok: true; data: MeasurementData } | { ok: false; errors: CsvLineError[] };

const CELL = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([A-Za-zµ°]*)$/;
const PREFIX: Record<string, number> = {
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  µ: 1e-6,
  m: 1e-3,
  k: 1e3,
  M: 1e6,
  G: 1e9,
  T: 1e12,
};
/** The unit words each column accepts after its number (none is fine too). */
const UNITS = [["Hz"], ["dB"], ["°", "deg"]] as const;

/**
 * A cell as a number: plain ("1591.5", "1.5e3"), with an SI prefix in the frequency column ("1k",
 * "1.5 kHz", "2M"), with its unit ("−3.01 dB", "45°", "45 deg"). Null when it is not one of those.
 */
export function readCell(text: string, column: number): number | null {
  const m = CELL.exec(text.replace(/\u2212/g, "-"));
  if (!m) return null;
  const value = Number(m[1]);
  let rest = m[2] ?? "";
  const unit = (UNITS[column] ?? []).find((u) => rest.endsWith(u));
  if (unit) rest = rest.slice(0, -unit.length);
  if (rest === "") return value;
  // Only frequencies take a prefix (a magnitude in dB or a phase in degrees never does).
  const scale = column === 0 ? PREFIX[rest] : undefined;
  return scale === undefined ? null : value * scale;
}

/**
 * Parses bench data: one row per frequency with three columns — frequency in Hz, magnitude in dB,
 * phase in degrees — separated by commas, semicolons or tabs; a frequency may carry an SI prefix and
 * each cell its unit (`1.5k`, `1.5 kHz`, `-3.01 dB`, `45°`). An optional header line (any first
 * line that isn't numeric), blank lines and `#` comments are skipped. Frequencies must be positive
 * and rise strictly. Every bad line is reported with its 1-based line number.
 */
export function parseMeasurementCsv(text: string): ParsedMeasurement {
  const errors: CsvLineError[] = [];
  const data: MeasurementData = { frequencies: [], magnitudeDb: [], phaseDeg: [] };
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/);
  let sawData = false;
  lines.forEach((raw, i) => {
    const line = i + 1;
    const trimmed = raw.trim();
    if (trimmed === "" || trimmed.startsWith("#")) return;
    const cells = trimmed.split(/[,;\t]/).map((c) => c.trim().replace(/^"(.*)"$/, "$1"));
    const values = cells.map((c, k) => readCell(c, k));
    const numeric = values.every((v) => v !== null);
    if (!sawData && !numeric) {
      sawData = true; // a header line
      return;
    }
    sawData = true;
    if (cells.length !== 3) {
      errors.push({
        line,
        message: `Expected 3 columns (frequency, magnitude dB, phase deg), found ${cells.length}.`,
      });
      return;
    }
    const bad = values.indexOf(null);
    if (bad >= 0) {
      const expected = [
        "a frequency (e.g. 1500, 1.5k or 1.5 kHz)",
        "a magnitude in dB",
        "a phase in degrees",
      ][bad];
      errors.push({ line, message: `Column ${bad + 1} is not ${expected}: "${cells[bad]}".` });
      return;
    }
    const [f, db, deg] = values as [number, number, number];
    if (!(f > 0)) {
      errors.push({ line, message: "The frequency must be above 0 Hz." });
      return;
    }
    const prev = data.frequencies[data.frequencies.length - 1];
    if (prev !== undefined && f <= prev) {
      errors.push({ line, message: `Frequencies must rise: ${f} Hz follows ${prev} Hz.` });
      return;
    }
    data.frequencies.push(f);
    data.magnitudeDb.push(db);
    data.phaseDeg.push(deg);
  });
  if (errors.length === 0 && data.frequencies.length < 2) {
    errors.push({ line: Math.max(1, lines.length), message: "The file needs at least 2 data rows." });
  }
  if (data.frequencies.length > MAX_MEASUREMENT_ROWS) {
    errors.push({ line: 1, message: `At most ${MAX_MEASUREMENT_ROWS} rows are accepted.` });
  }
  return errors.length > 0 ? { ok: false, errors: errors.slice(0, 50) } : { ok: true, data };
}

export type MeasurementSummary = {
  id: string;
  name: string;
  points: number;
  uploadedByName: string;
  createdAt: string;
  fromHz: number | null;
  toHz: number | null;
};
export type MeasurementView = MeasurementSummary & { data: MeasurementData };

function toSummary(
  m: Measurement,
  range: { fromHz: number | null; toHz: number | null },
): MeasurementSummary {
  return {
    id: m.id,
    name: m.name,
    points: m.points,
    uploadedByName: m.uploadedBy?.name ?? "",
    createdAt: m.createdAt.toISOString(),
    ...range,
  };
}

function toView(m: Measurement): MeasurementView {
  const f = m.data.frequencies;
  return { ...toSummary(m, { fromHz: f[0] ?? null, toHz: f[f.length - 1] ?? null }), data: m.data };
}

/** A measurement's range, read inside PostgreSQL so that its points stay there. */
const RANGE_ATTRIBUTES: [ReturnType<typeof sequelize.literal>, string][] = [
  [sequelize.literal(`("Measurement"."data"->'frequencies'->>0)::float8`), "fromHz"],
  [sequelize.literal(`("Measurement"."data"->'frequencies'->>-1)::float8`), "toHz"],
];

const LIST_LIMIT = 50;

/** Stores an uploaded CSV for the project (designer/owner); bad lines → 400 with their line numbers. */
export async function createMeasurement(
  actor: Actor,
  projectId: string,
  input: { name: string; csv: string },
): Promise<MeasurementSummary> {
  await authorizeProject(actor.userId, projectId, "measurement:upload");
  const name = input.name.trim();
  if (name.length === 0 || name.length > 200) {
    throw new BadRequestError("Give the measurement a name (up to 200 characters).", {
      fields: { name: ["Required, up to 200 characters."] },
    });
  }
  if (Buffer.byteLength(input.csv, "utf8") > MAX_MEASUREMENT_BYTES) {
    throw new TooLargeError(`The file is larger than ${MAX_MEASUREMENT_BYTES / 1e6} MB.`);
  }
  const parsed = parseMeasurementCsv(input.csv);
  if (!parsed.ok) {
    throw new BadRequestError(`The CSV has ${parsed.errors.length} bad line(s).`, { errors: parsed.errors });
  }
  const row = await withDb(() =>
    Measurement.create({
      projectId,
      uploadedById: actor.userId,
      name,
      data: parsed.data,
      points: parsed.data.frequencies.length,
    }),
  );
  const { data: _data, ...summary } = toView(row);
  return { ...summary, uploadedByName: actor.name };
}

/** The project's measurements, newest first, without their points (the project and run pages list them). */
export async function listMeasurements(actor: Actor, projectId: string): Promise<MeasurementSummary[]> {
  await authorizeProject(actor.userId, projectId, "project:read");
  const rows = await withDb(() =>
    Measurement.findAll({
      where: { projectId },
      attributes: ["id", "name", "points", "createdAt", ...RANGE_ATTRIBUTES],
      include: [{ model: User, as: "uploadedBy", attributes: ["id", "name"] }],
      order: [["createdAt", "DESC"]],
      limit: LIST_LIMIT,
    }),
  );
  return rows.map((m) =>
    toSummary(m, { fromHz: numberOrNull(m.get("fromHz")), toHz: numberOrNull(m.get("toHz")) }),
  );
}

function numberOrNull(v: unknown): number | null {
  return v === null || v === undefined ? null : Number(v);
}

/** The same list with every measurement's points (`GET /api/projects/:id/measurements`). */
export async function listMeasurementsWithData(actor: Actor, projectId: string): Promise<MeasurementView[]> {
  await authorizeProject(actor.userId, projectId, "project:read");
  const rows = await withDb(() =>
    Measurement.findAll({
      where: { projectId },
      include: [{ model: User, as: "uploadedBy", attributes: ["id", "name"] }],
      order: [["createdAt", "DESC"]],
      limit: LIST_LIMIT,
    }),
  );
  return rows.map(toView);
}
