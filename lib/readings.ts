/**
 * Bench readings of a run: record, list, delete, download the attachment. Every call asks lib/authz.ts
 * (reading as for the run, recording and deleting as for bench measurements). An attachment is written
 * to the object store first and the row after it, in a transaction; when the row fails the object is
 * removed again, and when the store is down nothing is saved (503).
 */
import { randomUUID } from "node:crypto";
import { type AttachmentType, cleanFileName, sniffAttachment } from "@/lib/attachments";
import { authorizeRun } from "@/lib/authz";
import { BenchReading, sequelize, User } from "@/lib/db";
import { BadRequestError, NotFoundError, withDb } from "@/lib/errors";
import { MAX_READINGS_PER_RUN } from "@/lib/limits";
import { QUANTITY_LABEL, type ReadingForm, type ReadingQuantity } from "@/lib/reading-kinds";
import {
  type Comparison,
  comparableMeasures,
  compareReading,
  comparisonLine,
  deriveReading,
  type Prediction,
} from "@/lib/reading-math";
import { storedPrediction } from "@/lib/run-columns";
import type { Actor } from "@/lib/session";
import { deleteObject, getObject, putObject } from "@/lib/storage/object-store";
import type { ReadingCreateInput } from "@/lib/validations/reading";

export type { Prediction } from "@/lib/reading-math";

export type ReadingView = {
  id: string;
  runId: string;
  authorId: string;
  authorName: string;
  createdAt: string;
  measureName: string | null;
  quantity: ReadingQuantity;
  form: ReadingForm;
  value: number | null;
  divisions: number | null;
  perDivision: number | null;
  node: string | null;
  note: string | null;
  /** The arithmetic in words: "9.8 div × 10 µs/div = 98 µs → 10.2 kHz". */
  steps: string;
  comparison: Comparison;
  attachment: { name: string; type: string; size: number; url: string } | null;
};

/** A stored reading beside the prediction (pure; used by the page, the API, compare and e-mail). */
export function toReadingView(r: BenchReading, p: Prediction, authorName?: string): ReadingView {
  const derived = deriveReading({ ...r.get({ plain: true }), form: r.inputForm });
  const comparison: Comparison = derived
    ? compareReading(derived, r.measureName, p.measures, p.monteCarlo)
    : {
        measured: null,
        unit: null,
        predicted: null,
        deviationPct: null,
        spread: null,
        reason: "Incomplete reading.",
      };
  return {
    id: r.id,
    runId: r.runId,
    authorId: r.authorId,
    authorName: authorName ?? r.author?.name ?? "",
    createdAt: r.createdAt.toISOString(),
    measureName: r.measureName,
    quantity: r.quantity,
    form: r.inputForm,
    value: r.value,
    divisions: r.divisions,
    perDivision: r.perDivision,
    node: r.node,
    note: r.note,
    steps: derived?.steps ?? "—",
    comparison,
    attachment:
      r.attachmentKey && r.attachmentType
        ? {
            name: r.attachmentName ?? "attachment",
            type: r.attachmentType,
            size: r.attachmentSize ?? 0,
            url: `/api/runs/${r.runId}/readings/${r.id}/attachment`,
          }
        : null,
  };
}

/** Readings of runs the caller may already read (compare, e-mail), oldest first, grouped by run id. */
export async function readingsOfRuns(runIds: string[]): Promise<Map<string, ReadingView[]>> {
  const out = new Map<string, ReadingView[]>(runIds.map((id) => [id, []]));
  if (runIds.length === 0) return out;
  const rows = await withDb(() =>
    BenchReading.findAll({
      where: { runId: runIds },
      include: [{ model: User, as: "author", attributes: ["id", "name"] }],
      order: [["createdAt", "ASC"]],
    }),
  );
  for (const runId of runIds) {
    const mine = rows.filter((r) => r.runId === runId);
    if (mine.length === 0) continue;
    const p = await withDb(() => storedPrediction(runId));
    out.set(
      runId,
      mine.map((r) => toReadingView(r, p)),
    );
  }
  return out;
}

/** One line per reading for the review e-mails: what was read, how, and how it stands against the prediction. */
export async function readingSummaryLines(runId: string): Promise<string[]> {
  const views = (await readingsOfRuns([runId])).get(runId) ?? [];
  return views.map((r) => {
    const where = r.node ? ` at ${r.node}` : "";
    return `${QUANTITY_LABEL[r.quantity]}${where}: ${r.steps} — ${comparisonLine(r.measureName, r.comparison)} (${r.authorName})`;
  });
}

/** The run's readings, oldest first (any member of the team). */
export async function listReadings(actor: Actor, runId: string): Promise<ReadingView[]> {
  await authorizeRun(actor.userId, runId, "run:read");
  return (await readingsOfRuns([runId])).get(runId) ?? [];
}

export type UploadedFile = { bytes: Uint8Array; name: string };

function checkMeasure(input: ReadingCreateInput, p: Prediction): void {
  if (!input.measureName) return;
  const comparable = comparableMeasures(p.measures, input.quantity).map((m) => m.name);
  if (comparable.includes(input.measureName)) return;
  const message = p.measures.some((m) => m.name === input.measureName)
    ? `“${input.measureName}” cannot be set beside ${input.quantity === "amplitude" ? "an" : "a"} ${input.quantity} reading (its unit differs).`
    : `The run has no measure “${input.measureName}”.`;
  const hint = comparable.length ? ` Choose ${comparable.join(", ")}, or none.` : " Leave it empty.";
  throw new BadRequestError("Some fields are not valid.", { fields: { measureName: [message + hint] } });
}

/** Records a reading (designer/owner), with its attachment stored first; nothing is saved on failure. */
export async function createReading(
  actor: Actor,
  runId: string,
  input: ReadingCreateInput,
  file: UploadedFile | null,
): Promise<ReadingView> {
  await authorizeRun(actor.userId, runId, "measurement:upload");
  const p = await withDb(() => storedPrediction(runId));
  checkMeasure(input, p);
  if ((await withDb(() => BenchReading.count({ where: { runId } }))) >= MAX_READINGS_PER_RUN) {
    throw new BadRequestError(`A run keeps at most ${MAX_READINGS_PER_RUN} readings; delete some first.`);
  }
  let attachment: { key: string; type: AttachmentType; size: number; name: string } | null = null;
  if (file) {
    const type = sniffAttachment(file.bytes);
    attachment = {
      key: `runs/${runId}/readings/${randomUUID()}`,
      type,
      size: file.bytes.byteLength,
      name: cleanFileName(file.name, type),
    };
    await putObject(attachment.key, file.bytes, type); // 503 here: nothing written
  }
  try {
    const row = await withDb(() =>
      sequelize.transaction((transaction) =>
        BenchReading.create(
          {
            runId,
            authorId: actor.userId,
            measureName: input.measureName ?? null,
            quantity: input.quantity,
            inputForm: input.form,
            value: input.form === "divisions" ? null : (input.value ?? null),
            divisions: input.form === "divisions" ? (input.divisions ?? null) : null,
            perDivision: input.form === "divisions" ? (input.perDivision ?? null) : null,
            node: input.node ?? null,
            note: input.note ?? null,
            attachmentKey: attachment?.key ?? null,
            attachmentType: attachment?.type ?? null,
            attachmentSize: attachment?.size ?? null,
            attachmentName: attachment?.name ?? null,
          },
          { transaction },
        ),
      ),
    );
    return toReadingView(row, p, actor.name);
  } catch (err) {
    if (attachment) await deleteObject(attachment.key).catch(() => undefined);
    throw err;
  }
}

async function findReading(runId: string, readingId: string): Promise<BenchReading> {
  const row = await withDb(() => BenchReading.findOne({ where: { id: readingId, runId } }));
  if (!row) throw new NotFoundError("Reading not found.");
  return row;
}

/** Deletes a reading and its stored object together: when the store is down, the reading stays (503). */
export async function deleteReading(actor: Actor, runId: string, readingId: string): Promise<void> {
  await authorizeRun(actor.userId, runId, "measurement:upload");
  const row = await findReading(runId, readingId);
  await withDb(() =>
    sequelize.transaction(async (transaction) => {
      await row.destroy({ transaction });
      if (row.attachmentKey) await deleteObject(row.attachmentKey);
    }),
  );
}

/** The attachment's bytes for an authorized download. */
export async function readAttachment(
  actor: Actor,
  runId: string,
  readingId: string,
): Promise<{ body: Uint8Array; type: string; name: string }> {
  await authorizeRun(actor.userId, runId, "run:read");
  const row = await findReading(runId, readingId);
  if (!row.attachmentKey || !row.attachmentType) throw new NotFoundError("This reading has no attachment.");
  const { body } = await getObject(row.attachmentKey);
  return { body, type: row.attachmentType, name: row.attachmentName ?? "attachment" };
}
