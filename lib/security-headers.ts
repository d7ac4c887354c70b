/**
 * Browser hardening headers (issue 13 item 5), set on every page and API answer by proxy.ts. Pure:
 * no Node.js imports, so it runs wherever the proxy runs.
 *
 * What the app needs, as verified by the browser suite under this policy:
 * - scripts: Next.js's own inline scripts carry the per-request nonce; the editor's AMD loader and its
 *   modules (served from /monaco/vs) are added by nonce'd scripts, which 'strict-dynamic' trusts. No
 *   'unsafe-eval' in production (development adds it: React's refresh runtime evaluates code).
 * - styles: the editor and the charting library insert <style> elements and style attributes at run
 *   time, so style-src keeps 'unsafe-inline' (styles cannot run script).
 * - workers: the editor's web workers start from blob: URLs; Monte Carlo threads are server-side.
 * - images: the plot's PNG export and the editor's icons use data: and blob: URLs.
 */
export function makeNonce(): string {
  const bytes = new Uint8Array(18);
  crypto.getRandomValues(bytes);
  let binary = "";
  for (const b of bytes) binary += String.fromCharCode(b);
  return btoa(binary);
}

export function contentSecurityPolicy(nonce: string, opts: { dev?: boolean; https?: boolean } = {}): string {
  const script = ["'self'", `'nonce-${nonce}'`, "'strict-dynamic'"];
  if (opts.dev) script.push("'unsafe-eval'");
  const directives = [
    "default-src 'self'",
    `script-src ${script.join(" ")}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ];
  if (opts.https) directives.push("upgrade-insecure-requests");
  return directives.join("; ");
}

/** For JSON and CSV answers: nothing may load or frame them. */
export const API_CSP = "default-src 'none'; frame-ancestors 'none'";

/** Headers for every answer; HSTS only when the app is served over https. */
export function securityHeaders(https: boolean): Record<string, string> {
  const h: Record<string, string> = {
    "X-Frame-Options": "DENY",
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "strict-origin-when-cross-origin",
    "Cross-Origin-Opener-Policy": "same-origin",
    "Permissions-Policy": "camera=(), microphone=(), geolocation=(), payment=()",
  };
  if (https) h["Strict-Transport-Security"] = "max-age=31536000; includeSubDomains";
  return h;
}
