/**
 * Post-sign-in destinations (issue 13: `callbackUrl=/%09/evil.test` left the site). A callback is
 * accepted only when, parsed as a URL against the app's origin, it stays on that origin, and only
 * after refusing the shapes browsers and servers normalise differently: control characters and
 * whitespace (raw or percent-encoded; browsers drop tabs and newlines, so `/\t/evil` becomes
 * `//evil`), backslashes (read as `/`), encoded slashes and backslashes, and paths starting `//`.
 * Pure (no env import) so client and server code can both use it; returns a path (`/projects?x=1`).
 */

/**
 * Request header carrying the page's path and query, set by proxy.ts on every page request and read
 * by `requireUser` (lib/session.ts), so a signed-out visit can come back after sign-in.
 */
export const PATH_HEADER = "x-pw-path";

/** Control characters (C0, DEL, C1), line/paragraph separators, backslash; with `space`, the space too. */
function hasForbidden(text: string, space: boolean): boolean {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x20 || (c >= 0x7f && c <= 0x9f) || c === 0x5c || c === 0x2028 || c === 0x2029) return true;
    if (space && c === 0x20) return true;
  }
  return false;
}
const ENCODED_SEPARATOR = /%(2f|5c)/i;
const MAX_LENGTH = 2000;

/** Decodes up to three layers of percent-encoding; null when a layer is malformed. */
function layers(value: string): string[] | null {
  const out = [value];
  let current = value;
  for (let i = 0; i < 3 && current.includes("%"); i++) {
    try {
      current = decodeURIComponent(current);
    } catch {
      return null;
    }
    out.push(current);
  }
  return out;
}

export function safeCallback(
  value: string | null | undefined,
  opts: { origin?: string; fallback?: string } = {},
): string {
  const fallback = opts.fallback ?? "/projects";
  const origin = opts.origin ?? "http://localhost";
  if (typeof value !== "string" || value.length === 0 || value.length > MAX_LENGTH) return fallback;
  const decoded = layers(value);
  if (!decoded) return fallback;
  if (hasForbidden(value, true)) return fallback;
  for (const layer of decoded) {
    if (hasForbidden(layer, false) || ENCODED_SEPARATOR.test(layer)) return fallback;
    if (layer.startsWith("//")) return fallback;
  }
  let base: URL;
  let url: URL;
  try {
    base = new URL(origin);
    url = new URL(value, base);
  } catch {
    return fallback;
  }
  // Relative values must be paths; absolute ones must name this very origin.
  if (!value.startsWith("/") && !value.startsWith(`${base.origin}/`) && value !== base.origin)
    return fallback;
  if (url.origin !== base.origin || url.username || url.password) return fallback;
  if (url.pathname.startsWith("//")) return fallback;
  return `${url.pathname}${url.search}${url.hash}`;
}
