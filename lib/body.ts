import { BadRequestError, TooLargeError } from "@/lib/errors";

/**
 * Reads a request body as UTF-8 text, counting bytes as they stream in: past `maxBytes` the stream is
 * cancelled and TooLargeError (413) thrown at once, so a chunked body without Content-Length is never
 * buffered whole (issue 13: 60 MB were read before the 413). A declared Content-Length over the limit
 * is refused before reading anything.
 */
export async function readBodyText(
  req: Request,
  maxBytes: number,
  what = "The request body",
): Promise<string> {
  const tooLarge = () =>
    new TooLargeError(`${what} is larger than ${formatBytes(maxBytes)}.`, { limitBytes: maxBytes });
  const declared = Number(req.headers.get("content-length") ?? "");
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge();
  if (!req.body) return "";
  const reader = req.body.getReader();
  const decoder = new TextDecoder("utf-8");
  let received = 0;
  let text = "";
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    received += value.byteLength;
    if (received > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    text += decoder.decode(value, { stream: true });
  }
  return text + decoder.decode();
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
