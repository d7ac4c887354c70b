import { BadRequestError, TooLargeError } from "@/lib/errors";

/**
 * Reads a request body as UTF-8 text, counting bytes as they stream in: past `maxBytes` the stream is
 * cancelled and TooLargeError (413) thrown at once, so a chunked body without Content-Length is never
 * buffered whole (issue 13: 60 MB were read before the 413). A declared Content-Length over the limit
 * is refused before reading anything.
 */
export async function readBodyBytes(
  req: Request,
  maxBytes: number,
  what = "The request body",
): Promise<Uint8Array> {
  const tooLarge = () =>
    new TooLargeError(`${what} is larger than ${formatBytes(maxBytes)}.`, { limitBytes: maxBytes });
  const declared = Number(req.headers.get("content-length") ?? "");
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge();
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let received = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    received += value.byteLength;
    if (received > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    chunks.push(value);
  }
  const out = new Uint8Array(new ArrayBuffer(received));
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** `readBodyBytes` decoded as UTF-8. */
export async function readBodyText(req: Request, maxBytes: number, what?: string): Promise<string> {
  return new TextDecoder("utf-8").decode(await readBodyBytes(req, maxBytes, what));
}

/** Form data read under the byte limit (multipart or urlencoded); unreadable → 400. */
export async function readFormData(req: Request, maxBytes: number, what?: string): Promise<FormData> {
  const bytes = await readBodyBytes(req, maxBytes, what);
  const copy = new Request(req.url, {
    method: "POST",
    headers: req.headers,
    body: bytes as Uint8Array<ArrayBuffer>,
  });
  return copy.formData().catch(() => {
    throw new BadRequestError("The form data could not be read.");
  });
}

/** Reads and parses a JSON body under the byte limit; malformed JSON → 400. */
export async function readJsonBody(req: Request, maxBytes: number, what?: string): Promise<unknown> {
  const text = await readBodyText(req, maxBytes, what);
  try {
    return JSON.parse(text);
  } catch {
    throw new BadRequestError("The request body is not valid JSON.");
  }
}

function formatBytes(n: number): string {
  return n >= 1_000_000 ? `${n / 1_000_000} MB` : `${n / 1000} kB`;
}
