import { type NextRequest, NextResponse } from "next/server";
import { PATH_HEADER } from "@/lib/safe-callback";
import { API_CSP, contentSecurityPolicy, makeNonce, securityHeaders } from "@/lib/security-headers";

/**
 * Whether every `%XX` sequence of the path decodes (issue 13: a malformed one, e.g. `/api/runs/%E0%A4%A`,
 * made Next.js's parameter decoding throw: 500 on every `[id]` route). One guard for all routes and pages.
 */
export function pathDecodes(pathname: string): boolean {
  if (!pathname.includes("%")) return true;
  try {
    for (const segment of pathname.split("/")) decodeURIComponent(segment);
    return true;
  } catch {
    return false;
  }
}

/**
 * Served over https: the request itself, a trusted proxy's X-Forwarded-Proto (TRUST_PROXY), or a
 * public origin (NEXTAUTH_URL) that says https.
 */
function servedOverHttps(request: NextRequest): boolean {
  if (request.nextUrl.protocol === "https:") return true;
  const trust = process.env.TRUST_PROXY === "1" || process.env.TRUST_PROXY === "true";
  if (trust && request.headers.get("x-forwarded-proto") === "https") return true;
  return (process.env.NEXTAUTH_URL ?? "").startsWith("https://");
}

function harden(res: NextResponse, https: boolean, csp: string): NextResponse {
  for (const [k, v] of Object.entries(securityHeaders(https))) res.headers.set(k, v);
  res.headers.set("Content-Security-Policy", csp);
  return res;
}

export function proxy(request: NextRequest) {
  const https = servedOverHttps(request);
  const { pathname } = request.nextUrl;
  if (pathname.startsWith("/api/")) {
    const res = pathDecodes(pathname)
      ? NextResponse.next()
      : NextResponse.json({ error: { code: "not_found", message: "Not found." } }, { status: 404 });
    return harden(res, https, API_CSP);
  }
  const nonce = makeNonce();
  const csp = contentSecurityPolicy(nonce, { dev: process.env.NODE_ENV === "development", https });
  if (!pathDecodes(pathname)) {
    const res = new NextResponse("Not found.", {
      status: 404,
      headers: { "content-type": "text/plain; charset=utf-8" },
    });
    return harden(res, https, csp);
  }
  const headers = new Headers(request.headers);
  headers.set(PATH_HEADER, pathname + request.nextUrl.search);
  headers.set("Content-Security-Policy", csp);
  return harden(NextResponse.next({ request: { headers } }), https, csp);
}

export const config = {
  // The whole API (export.csv included), and pages: not Next's assets or files with an extension.
  matcher: ["/api/:path*", "/((?!api/|_next/|.*\\.[a-zA-Z0-9]+$).*)"],
};
