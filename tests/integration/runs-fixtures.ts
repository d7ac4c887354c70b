// Shared helpers of the runs/comments/review/outbox/invitation integration tests: bearer tokens per
// fixture user, direct calls of route handlers, and runs inserted without the solver.
import { createHash } from "node:crypto";
import { Run } from "@/lib/db";
import { createApiToken } from "@/lib/tokens";
import type { SolveSuccess } from "@/solver/types";
import type { Fixtures } from "./setup";

export type Who = "owner" | "designer" | "reviewer" | "viewer" | "outsider";
export const EVERYONE: Who[] = ["owner", "designer", "reviewer", "viewer", "outsider"];

/** One live API token per fixture user. */
export async function tokensFor(fx: Fixtures): Promise<Record<Who, string>> {
  const out = {} as Record<Who, string>;
  for (const who of EVERYONE) out[who] = (await createApiToken(fx.users[who].id, "integration")).token;
  return out;
}

type Handler<P> = (req: Request, ctx: { params: Promise<P> }) => Promise<Response>;

/** Calls a route handler the way Next.js would, with a bearer token and an optional JSON body. */
export async function call<P>(
  handler: Handler<P>,
  opts: {
    token?: string;
    method?: string;
    path?: string;
    params?: P;
    body?: unknown;
    rawBody?: string;
    headers?: Record<string, string>;
  },
  // biome-ignore lint/suspicious/noExplicitAny: JSON bodies of many shapes, read field by field in the tests
): Promise<{ status: number; body: any; text: string; headers: Headers }> {
  const headers: Record<string, string> = { ...(opts.headers ?? {}) };
  if (opts.token) headers.authorization = `Bearer ${opts.token}`;
  let body: string | undefined;
  if (opts.rawBody !== undefined) body = opts.rawBody;
  else if (opts.body !== undefined) body = JSON.stringify(opts.body);
  if (body !== undefined && !headers["content-type"]) headers["content-type"] = "application/json";
  const req = new Request(`http://localhost${opts.path ?? "/api/test"}`, {
    method: opts.method ?? (body === undefined ? "GET" : "POST"),
    headers,
    body,
  });
  const res = await handler(req, { params: Promise.resolve((opts.params ?? {}) as P) });
  const text = await res.text();
  let parsed: unknown = null;
  try {
    parsed = JSON.parse(text);
  } catch {
    parsed = null;
  }
  return { status: res.status, body: parsed, text, headers: res.headers };
}

/**
 * A small hand-made result: one probe trace "H" of a first-order low-pass, H = 1/(1 + j·f/fc) with
 * fc = 1 kHz, at 100 Hz, 1 kHz and 10 kHz (closed form, common practice). Enough for pins and exports.
 */
export function smallResult(): SolveSuccess {
  const frequencies = [100, 1000, 10000];
  const re: number[] = [];
  const im: number[] = [];
  for (const f of frequencies) {
    const x = f / 1000;
    re.push(1 / (1 + x * x));
    im.push(-x / (1 + x * x));
  }
  return {
    ok: true,
    title: "fixture",
    solverVersion: "fixture",
    frequencies,
    traces: [
      {
        name: "H",
        kind: "probe",
        re,
        im,
        magnitudeDb: re.map((r, k) => 10 * Math.log10(r * r + (im[k] ?? 0) ** 2)),
        phaseDeg: re.map((r, k) => (Math.atan2(im[k] ?? 0, r) * 180) / Math.PI),
      },
    ],
    measures: [{ name: "fc", value: 1000, unit: "Hz", reason: null }],
    checks: [{ name: "fc", expression: "fc > 500Hz", pass: true, reason: null }],
    warnings: [],
    stats: { nodes: 2, unknowns: 3, points: 3, solveMs: 0.1 },
  };
}

/** Inserts a run directly (no solver), e.g. to comment on or review. */
export async function insertRun(
  projectId: string,
  authorId: string,
  opts: { title?: string; reviewState?: Run["reviewState"]; netlist?: string } = {},
): Promise<Run> {
  const netlist = opts.netlist ?? "title fixture\n";
  const result = smallResult();
  return Run.create({
    projectId,
    authorId,
    title: opts.title ?? "Fixture run",
    netlist,
    netlistHash: createHash("sha256").update(netlist).digest("hex"),
    solverVersion: result.solverVersion,
    status: "ok",
    reviewState: opts.reviewState ?? "draft",
    result,
    measures: result.measures,
    checks: result.checks,
    checksPassed: 1,
    checksTotal: 1,
    timings: { solveMs: 0.1 },
  });
}
