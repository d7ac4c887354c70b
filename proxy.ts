import { type NextRequest, NextResponse } from "next/server";

/** Request header carrying the page's path and query, so a signed-out visit can come back after sign-in. */
export const PATH_HEADER = "x-pw-path";

export function proxy(request: NextRequest) {
  const headers = new Headers(request.headers);
  headers.set(PATH_HEADER, request.nextUrl.pathname + request.nextUrl.search);
  return NextResponse.next({ request: { headers } });
}

export const config = {
  // Pages only: not the API, not Next's assets, not files with an extension.
  matcher: ["/((?!api/|_next/|.*\\.[a-zA-Z0-9]+$).*)"],
};
