import { ZodError, type z } from "zod";
import { readJsonBody } from "@/lib/body";
import { AppError, BadRequestError, isDatabaseConnectionError } from "@/lib/errors";
import { MAX_JSON_BODY_BYTES } from "@/lib/limits";
import { type Actor, requireActor } from "@/lib/session";
import { issuesToFields } from "@/lib/utils";

export type ErrorBody = { error: { code: string; message: string; details?: Record<string, unknown> } };

/** A JSON response with the given status. */
export function json(data: unknown, status = 200, headers?: HeadersInit): Response {
  return Response.json(data, { status, headers });
}

function errorResponse(
  status: number,
  code: string,
  message: string,
  details?: Record<string, unknown>,
  headers?: HeadersInit,
): Response {
  const body: ErrorBody = { error: details === undefined ? { code, message } : { code, message, details } };
  return json(body, status, headers);
}

/** Zod issues grouped by field path ("teamId", "members.0.email"; "_form" for the whole body). */
export function zodFieldErrors(err: ZodError): Record<string, string[]> {
  return issuesToFields(err.issues);
}

/** Maps any thrown value to the JSON error shape; nothing internal leaks on a 500. */
export function toErrorResponse(err: unknown): Response {
  if (err instanceof AppError) {
    const retry = err.details?.retryAfterSeconds;
    const headers = typeof retry === "number" ? { "Retry-After": String(Math.ceil(retry)) } : undefined;
    return errorResponse(err.status, err.code, err.message, err.details, headers);
  }
  if (err instanceof ZodError) {
    return errorResponse(400, "bad_request", "Some fields are not valid.", { fields: zodFieldErrors(err) });
  }
  if (isDatabaseConnectionError(err)) {
    console.error("[api] database unavailable:", err instanceof Error ? err.message : err);
    return errorResponse(
      503,
      "db_unavailable",
      "The database is not reachable right now. Try again shortly.",
    );
  }
  console.error("[api] unexpected error:", err);
  return errorResponse(500, "internal", "Something went wrong on our side.");
}

/** Wraps a route handler so every failure answers `{error:{code,message,details?}}` with the right status. */
export function withApi<C = unknown>(
  handler: (req: Request, ctx: C) => Promise<Response>,
): (req: Request, ctx: C) => Promise<Response> {
  return async (req, ctx) => {
    try {
      return await handler(req, ctx);
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}

type NoParams = { params: Promise<Record<string, never>> };

/**
 * `withApi` for a route that needs a caller: the actor (session cookie or bearer token; 401 without
 * one) and the route's params are resolved before the handler runs.
 */
export function withActor<C extends { params: Promise<unknown> } = NoParams>(
  handler: (actor: Actor, params: Awaited<C["params"]>, req: Request) => Promise<Response>,
): (req: Request, ctx?: C) => Promise<Response> {
  return withApi(async (req: Request, ctx?: C) => {
    const actor = await requireActor(req);
    return handler(actor, (await ctx?.params) as Awaited<C["params"]>, req);
  });
}

/** Reads and validates a JSON body: malformed JSON → 400; schema failure → 400 with `details.fields`. */
export async function readJson<S extends z.ZodType>(
  req: Request,
  schema: S,
  maxBytes = MAX_JSON_BODY_BYTES,
): Promise<z.output<S>> {
  // Counted while streaming (lib/body.ts): an oversized body is refused before it is buffered.
  const raw = await readJsonBody(req, maxBytes);
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    throw new BadRequestError("Some fields are not valid.", { fields: zodFieldErrors(parsed.error) });
  }
  return parsed.data;
}
