import { type NextRequest, NextResponse } from "next/server";

/** Request header carrying the page's path and query, so a signed-out visit can come back after sign-in. */
export const PATH_HEADER = "x-pw-path";

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

function notFound(request: NextRequest): NextResponse {
  if (request.nextUrl.pathname.startsWith("/api/")) {
    return NextResponse.json({ error: { code: "not_found", message: "Not found." } }, { status: 404 });
  }
  return new NextResponse("Not found.", {
    status: 404,
    headers: { "content-type": "text/plain; charset=utf-8" },
  });
}

export function proxy(request: NextRequest) {
  if (!pathDecodes(request.nextUrl.pathname)) return notFound(request);
  if (request.nextUrl.pathname.startsWith("/api/")) return NextResponse.next();
  const headers = new Headers(request.headers);
  headers.set(PATH_HEADER, request.nextUrl.pathname + request.nextUrl.search);
  return NextResponse.next({ request: { headers } });
}

export const config = {
  // The whole API (export.csv included), and pages: not Next's assets or files with an extension.
  matcher: ["/api/:path*", "/((?!api/|_next/|.*\\.[a-zA-Z0-9]+$).*)"],
};
