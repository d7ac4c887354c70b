/**
 * Domain errors. Route handlers turn them into `{error: {code, message, details?}}` through
 * `withApi` (lib/api.ts); server components let them bubble to app/error.tsx.
 */
export class AppError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details?: Record<string, unknown>;

  constructor(status: number, code: string, message: string, details?: Record<string, unknown>) {
    super(message);
    this.name = new.target.name;
    this.status = status;
    this.code = code;
    if (details !== undefined) this.details = details;
  }
}

export class BadRequestError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(400, "bad_request", message, details);
  }
}

export class UnauthorizedError extends AppError {
  constructor(message = "Sign in to continue.", details?: Record<string, unknown>) {
    super(401, "unauthorized", message, details);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = "Your role in this team does not allow that.", details?: Record<string, unknown>) {
    super(403, "forbidden", message, details);
  }
}

export class NotFoundError extends AppError {
  constructor(message = "Not found.", details?: Record<string, unknown>) {
    super(404, "not_found", message, details);
  }
}

/** 409: the resource is not in a state where this step applies (a review step, a supersede link). */
export class ConflictError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(409, "conflict", message, details);
  }
}

export class TooLargeError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(413, "too_large", message, details);
  }
}

/** details: `{errors}` — the solver's NetlistError list (line and column each). */
export class NetlistInvalidError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(422, "invalid_netlist", message, details);
  }
}

export class RateLimitError extends AppError {
  constructor(
    message = "Too many attempts. Wait a moment and try again.",
    details?: Record<string, unknown>,
  ) {
    super(429, "rate_limited", message, details);
  }
}

/** Digest that app/error.tsx recognises: Next.js keeps an error's own `digest` across the server boundary. */
export const DB_UNAVAILABLE_DIGEST = "PW_DB_UNAVAILABLE";

export class DatabaseUnavailableError extends AppError {
  readonly digest = DB_UNAVAILABLE_DIGEST;
  constructor(message = "The database is not reachable right now.", details?: Record<string, unknown>) {
    super(503, "db_unavailable", message, details);
  }
}

/** The object store (attachments) does not answer; nothing was saved. */
export class StorageUnavailableError extends AppError {
  constructor(
    message = "The file store is not reachable right now, so nothing was saved. Try again shortly.",
    details?: Record<string, unknown>,
  ) {
    super(503, "storage_unavailable", message, details);
  }
}

const CONNECTION_ERROR_NAMES = new Set([
  "SequelizeConnectionError",
  "SequelizeConnectionRefusedError",
  "SequelizeConnectionTimedOutError",
  "SequelizeConnectionAcquireTimeoutError",
  "SequelizeHostNotFoundError",
  "SequelizeHostNotReachableError",
  "SequelizeAccessDeniedError",
  "SequelizeInvalidConnectionError",
]);
const CONNECTION_ERROR_CODES = new Set([
  "ECONNREFUSED",
  "ECONNRESET",
  "ETIMEDOUT",
  "ENOTFOUND",
  "57P01",
  "57P03",
]);

/** True for a failure to reach PostgreSQL (Sequelize connection errors, refused sockets, server shutting down). */
export function isDatabaseConnectionError(err: unknown): boolean {
  if (err instanceof DatabaseUnavailableError) return true;
  if (!(err instanceof Error)) return false;
  if (CONNECTION_ERROR_NAMES.has(err.name)) return true;
  const code = (err as { code?: unknown }).code;
  if (typeof code === "string" && CONNECTION_ERROR_CODES.has(code)) return true;
  const parent = (err as { parent?: unknown; original?: unknown }).parent;
  return parent !== undefined && parent !== err && isDatabaseConnectionError(parent);
}

/** Runs a database read/write; a connection failure becomes DatabaseUnavailableError, anything else passes through. */
export async function withDb<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (err) {
    if (isDatabaseConnectionError(err) && !(err instanceof DatabaseUnavailableError)) {
      throw new DatabaseUnavailableError();
    }
    throw err;
  }
}
