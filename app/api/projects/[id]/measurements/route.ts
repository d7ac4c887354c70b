import { json, readJson, withActor } from "@/lib/api";
import { readBodyText, readFormData } from "@/lib/body";
import { BadRequestError } from "@/lib/errors";
import { createMeasurement, listMeasurementsWithData, MAX_MEASUREMENT_BYTES } from "@/lib/measurements";
import { measurementUploadSchema } from "@/lib/validations/measurement";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/projects/:id/measurements → the project's bench data, newest first. */
export const GET = withActor<Ctx>(async (actor, { id }) => {
  return json({ measurements: await listMeasurementsWithData(actor, id) });
});

/**
 * POST /api/projects/:id/measurements — a CSV of frequency (Hz), magnitude (dB), phase (deg), as
 * multipart form data (`file`, `name`), as JSON `{name, csv}`, or as `text/csv` with `?name=`.
 * Bad rows → 400 with `details.errors` [{line, message}].
 */
export const POST = withActor<Ctx>(async (actor, { id }, req) => {
  // Counted while the body streams in (lib/body.ts): 413 before an oversized upload is buffered.
  const limit = MAX_MEASUREMENT_BYTES + 64_000;
  const what = "The file";
  const type = req.headers.get("content-type") ?? "";
  let input: { name: string; csv: string };
  if (type.startsWith("multipart/form-data")) {
    const form = await readFormData(req, limit, what);
    const file = form.get("file");
    if (!(file instanceof Blob)) {
      throw new BadRequestError("Attach a CSV file.", { fields: { file: ["Choose a CSV file."] } });
    }
    const fallback = file instanceof File ? file.name.replace(/\.[^.]+$/, "") : "";
    input = { name: String(form.get("name") || fallback), csv: await file.text() };
  } else if (type.startsWith("text/csv") || type.startsWith("text/plain")) {
    input = {
      name: new URL(req.url).searchParams.get("name") ?? "",
      csv: await readBodyText(req, limit, what),
    };
  } else {
    input = await readJson(req, measurementUploadSchema, limit * 2);
  }
  return json({ measurement: await createMeasurement(actor, id, input) }, 201);
});
