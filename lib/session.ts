import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { decode } from "next-auth/jwt";
import { User } from "@/lib/db";
import { env } from "@/lib/env";
import { ForbiddenError, isDatabaseConnectionError, UnauthorizedError, withDb } from "@/lib/errors";
import { PATH_HEADER, safeCallback } from "@/lib/safe-callback";
import { currentSessionVersion } from "@/lib/session-version";
import { verifyBearerToken } from "@/lib/tokens";

/** Who is calling: from the next-auth session cookie or an `Authorization: Bearer <api token>` header. */
export type Actor = { userId: string; email: string; name: string };

/** next-auth's session cookie: `__Secure-` on https; split into `.0`, `.1`, … chunks when large. */
export const SESSION_COOKIES = ["__Secure-next-auth.session-token", "next-auth.session-token"] as const;

function bearerFrom(h: Headers): string | null {
  const auth = h.get("authorization");
  const match = auth ? /^Bearer\s+(\S+)\s*$/i.exec(auth) : null;
  return match?.[1] ?? null;
}

function parseCookieHeader(header: string | null): Map<string, string> {
  const jar = new Map<string, string>();
  for (const part of (header ?? "").split(";")) {
    const eq = part.indexOf("=");
    if (eq <= 0) continue;
    const name = part.slice(0, eq).trim();
    const raw = part.slice(eq + 1).trim();
    try {
      jar.set(name, decodeURIComponent(raw));
    } catch {
      jar.set(name, raw);
    }
  }
  return jar;
}

function sessionToken(jar: Map<string, string>): string | null {
  for (const base of SESSION_COOKIES) {
    const whole = jar.get(base);
    if (whole) return whole;
    const chunks: string[] = [];
    for (let i = 0; jar.has(`${base}.${i}`); i++) chunks.push(jar.get(`${base}.${i}`) ?? "");
    if (chunks.length > 0) return chunks.join("");
  }
  return null;
}

/**
 * Whether a session issued at version `sv` still stands (lib/session-version.ts). When the database is
 * unreachable the token is trusted as before: nothing else works then, and pages explain the outage.
 */
async function sessionStillValid(userId: string, sv: number): Promise<boolean> {
  try {
    return (await currentSessionVersion(userId)) === sv;
  } catch (err) {
    if (isDatabaseConnectionError(err)) return true;
    throw err;
  }
}

/** Decodes next-auth's encrypted session JWT (expiry checked); null when absent, expired or forged. */
export async function actorFromSessionToken(token: string | null): Promise<Actor | null> {
  if (!token) return null;
  try {
    const payload = await decode({ token, secret: env.NEXTAUTH_SECRET });
    if (!payload || typeof payload.sub !== "string") return null;
    if (!(await sessionStillValid(payload.sub, typeof payload.sv === "number" ? payload.sv : 0))) return null;
    return {
      userId: payload.sub,
      email: typeof payload.email === "string" ? payload.email : "",
      name: typeof payload.name === "string" ? payload.name : "",
    };
  } catch {
    return null;
  }
}

/**
 * The caller, or null when signed out (or the bearer token is unknown or revoked).
 * With `req` its headers are read; without, the current request's headers and cookies (next/headers).
 */
export async function getActor(req?: Request): Promise<Actor | null> {
  if (req) {
    const bearer = bearerFrom(req.headers);
    if (bearer) return verifyBearerToken(bearer);
    return actorFromSessionToken(sessionToken(parseCookieHeader(req.headers.get("cookie"))));
  }
  const bearer = bearerFrom(await headers());
  if (bearer) return verifyBearerToken(bearer);
  const jar = new Map((await cookies()).getAll().map((c) => [c.name, c.value] as const));
  return actorFromSessionToken(sessionToken(jar));
}

/** The caller, or UnauthorizedError (401) when signed out. For route handlers. */
export async function requireActor(req?: Request): Promise<Actor> {
  const actor = await getActor(req);
  if (!actor) throw new UnauthorizedError();
  return actor;
}

/**
 * The caller signed in through the browser session only: a request carrying an API token is refused
 * (403), so a leaked token cannot mint more tokens. For routes that manage tokens.
 */
export async function requireSessionActor(req: Request): Promise<Actor> {
  if (bearerFrom(req.headers)) {
    throw new ForbiddenError(
      "API tokens cannot create tokens. Sign in to Phasewright and create one in Settings.",
    );
  }
  return requireActor(req);
}

/**
 * The signed-in user for server components and actions; redirects to /signin when signed out, with the
 * current page (set by proxy.ts) as the place to come back to.
 */
export async function requireUser(): Promise<Actor> {
  const actor = await getActor();
  if (!actor) {
    const back = safeCallback((await headers()).get(PATH_HEADER), { fallback: "" });
    redirect(back ? `/signin?callbackUrl=${encodeURIComponent(back)}` : "/signin");
  }
  return actor;
}

/** The stored name and e-mail of a user (the session token may hold an older name), or null. */
export async function getUserProfile(userId: string): Promise<{ name: string; email: string } | null> {
  const user = await withDb(() => User.findByPk(userId, { attributes: ["name", "email"] }));
  return user ? { name: user.name, email: user.email } : null;
}
