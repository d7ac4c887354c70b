/**
 * Attachments of bench readings: what a file is, judged by its content (magic bytes for images, a
 * text check for CSV), never by its name or the type the browser claims; and its size limit
 * (lib/limits.ts). Pure.
 */
import { BadRequestError, TooLargeError } from "@/lib/errors";
import { MAX_READING_CSV_BYTES, MAX_READING_IMAGE_BYTES } from "@/lib/limits";

export type AttachmentType = "image/png" | "image/jpeg" | "text/csv";

const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const JPEG = [0xff, 0xd8, 0xff];
const startsWith = (b: Uint8Array, magic: number[]) => magic.every((m, i) => b[i] === m);

/** Text a person or an instrument would write: valid UTF-8, no NUL or other control bytes but tab/CR/LF/FF. */
function isCsvText(bytes: Uint8Array): boolean {
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return false;
  }
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if ((c < 32 && c !== 9 && c !== 10 && c !== 12 && c !== 13) || c === 127) return false;
  }
  const lines = text
    .replace(/^\uFEFF/, "")
    .split(/\r?\n/)
    .filter((l) => l.trim() !== "");
  // At least one line with a separator: a single word is not a table.
  return lines.length > 0 && lines.some((l) => /[,;\t]/.test(l));
}

const MB = (n: number) => `${n / (1024 * 1024)} MB`;
const fileError = (message: string) => ({ fields: { file: [message] } });

/** The attachment's type from its content; too large → 413, neither PNG, JPEG nor CSV → 400 (field `file`). */
export function sniffAttachment(bytes: Uint8Array): AttachmentType {
  if (bytes.byteLength === 0)
    throw new BadRequestError("The file is empty.", fileError("The file is empty."));
  if (bytes.byteLength > MAX_READING_IMAGE_BYTES) {
    const message = `Files are accepted up to ${MB(MAX_READING_IMAGE_BYTES)} (images) and ${MB(MAX_READING_CSV_BYTES)} (CSV).`;
    throw new TooLargeError(message, fileError(message));
  }
  if (startsWith(bytes, PNG)) return "image/png";
  if (startsWith(bytes, JPEG)) return "image/jpeg";
  if (isCsvText(bytes)) {
    if (bytes.byteLength > MAX_READING_CSV_BYTES) {
      const message = `A CSV is accepted up to ${MB(MAX_READING_CSV_BYTES)}.`;
      throw new TooLargeError(message, fileError(message));
    }
    return "text/csv";
  }
  const message = "Attach a PNG or JPEG scope capture or a CSV file (the content was checked, not the name).";
  throw new BadRequestError(message, fileError(message));
}

/** The file name as shown and offered on download: no folders, no control characters, at most 200 characters. */
export function cleanFileName(name: string, type: AttachmentType): string {
  const base = (name.split(/[\\/]/).pop() ?? "")
    .split("")
    .filter((ch) => ch.charCodeAt(0) >= 32 && ch.charCodeAt(0) !== 127 && ch !== '"')
    .join("")
    .trim()
    .slice(0, 200);
  const ext = type === "image/png" ? ".png" : type === "image/jpeg" ? ".jpg" : ".csv";
  return base || `attachment${ext}`;
}

/** `Content-Disposition` for a download: images open in the browser, CSV files are saved. */
export function contentDisposition(name: string, type: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, "_").replace(/[\\"]/g, "_");
  const kind = type.startsWith("image/") ? "inline" : "attachment";
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}
