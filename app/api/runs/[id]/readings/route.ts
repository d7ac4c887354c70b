import { json, readJson, withActor, zodFieldErrors } from "@/lib/api";
import { BadRequestError, TooLargeError } from "@/lib/errors";
import { MAX_READING_IMAGE_BYTES } from "@/lib/limits";
import { createReading, listReadings, type UploadedFile } from "@/lib/readings";
import { readingCreateSchema } from "@/lib/validations/reading";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/runs/:id/readings → `{readings}`, each beside the run's prediction. */
export const GET = withActor<Ctx>(async (actor, { id }) => {
  return json({ readings: await listReadings(actor, id) });
});

/** Reads a multipart form: its fields through the schema, its optional `file`. */
async function readForm(req: Request) {
  const form = await req.formData().catch(() => {
    throw new BadRequestError("The form data could not be read.");
  });
  const fields = Object.fromEntries(
    [...form.entries()].filter(([k, v]) => k !== "file" && typeof v === "string"),
  );
  const parsed = readingCreateSchema.safeParse(fields);
  if (!parsed.success) {
    throw new BadRequestError("Some fields are not valid.", { fields: zodFieldErrors(parsed.error) });
  }
  const entry = form.get("file");
  let file: UploadedFile | null = null;
  if (entry instanceof Blob && entry.size > 0) {
    file = {
      bytes: new Uint8Array(await entry.arrayBuffer()),
      name: entry instanceof File ? entry.name : "",
    };
  }
  return { input: parsed.data, file };
}

/**
 * POST /api/runs/:id/readings — JSON, or multipart form data with the same fields and an optional
 * `file` (PNG/JPEG scope capture ≤ 10 MB, CSV ≤ 5 MB; the content decides the type).
 */
export const POST = withActor<Ctx>(async (actor, { id }, req) => {
  if (Number(req.headers.get("content-length") ?? "0") > MAX_READING_IMAGE_BYTES + 64_000) {
    const message = `Files are accepted up to ${MAX_READING_IMAGE_BYTES / (1024 * 1024)} MB.`;
    throw new TooLargeError(message, { fields: { file: [message] } });
  }
  const type = req.headers.get("content-type") ?? "";
  const { input, file } = type.startsWith("multipart/form-data")
    ? await readForm(req)
    : { input: await readJson(req, readingCreateSchema), file: null };
  return json({ reading: await createReading(actor, id, input, file) }, 201);
});
