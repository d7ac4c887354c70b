import { ConnectionRefusedError } from "sequelize";
import { describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { readJson, withApi } from "@/lib/api";
import {
  DatabaseUnavailableError,
  ForbiddenError,
  isDatabaseConnectionError,
  NetlistInvalidError,
  RateLimitError,
  withDb,
} from "@/lib/errors";
import { createRateLimiter } from "@/lib/rate-limit";
import { safeCallback } from "@/lib/safe-callback";
import { cn, issuesToFields } from "@/lib/utils";
import { signInSchema, signUpSchema } from "@/lib/validations/auth";
import { projectCreateSchema } from "@/lib/validations/project";
import { memberRoleUpdateSchema } from "@/lib/validations/team";

const fieldsOf = (r: { success: boolean; error?: z.ZodError }) =>
  r.error ? issuesToFields(r.error.issues) : {};

describe("auth schemas", () => {
  it("normalises the e-mail and names the failing fields", () => {
    expect(signInSchema.parse({ email: "  Ada@Example.COM ", password: "x" }).email).toBe("ada@example.com");
    expect(fieldsOf(signInSchema.safeParse({ email: "ada@", password: "" }))).toEqual({
      email: ["Enter a valid e-mail address, like ada@example.com."],
      password: ["Enter your password."],
    });
    expect(fieldsOf(signUpSchema.safeParse({ name: " ", email: "a@b.co", password: "short" }))).toEqual({
      name: ["Enter your name."],
      password: ["Use at least 10 characters."],
    });
    expect(fieldsOf(signUpSchema.safeParse({}))).toEqual({
      name: ["Enter your name."],
      email: ["Enter your e-mail address."],
      password: ["Choose a password."],
    });
  });
});

describe("project and team schemas", () => {
  it("trims names, turns an empty description into null, rejects bad ids", () => {
    const ok = projectCreateSchema.parse({
      teamId: "6f1c2a4e-0b7d-4c35-9a0e-2d3f4b5c6d7e",
      name: "  Twin-T notch ",
      description: "   ",
    });
    expect(ok).toEqual({
      teamId: "6f1c2a4e-0b7d-4c35-9a0e-2d3f4b5c6d7e",
      name: "Twin-T notch",
      description: null,
    });
    expect(fieldsOf(projectCreateSchema.safeParse({ teamId: "x", name: "n".repeat(121) }))).toEqual({
      teamId: ["Choose a team."],
      name: ["Keep the name under 120 characters."],
    });
    const role = memberRoleUpdateSchema.safeParse({
      teamId: "6f1c2a4e-0b7d-4c35-9a0e-2d3f4b5c6d7e",
      membershipId: "6f1c2a4e-0b7d-4c35-9a0e-2d3f4b5c6d7f",
      role: "admin",
    });
    expect(fieldsOf(role)).toEqual({ role: ["Choose one of owner, designer, reviewer or viewer."] });
  });
});

describe("helpers", () => {
  it("keeps sign-in destinations on this site", () => {
    expect(safeCallback("/projects/abc?x=1")).toBe("/projects/abc?x=1");
    expect(safeCallback("https://evil.test/")).toBe("/projects");
    expect(safeCallback("//evil.test")).toBe("/projects");
    expect(safeCallback(undefined, { fallback: "/" })).toBe("/");
  });

  it("merges our type-scale classes without dropping the colour", () => {
    expect(cn("text-body text-ink-900", "text-caption")).toBe("text-ink-900 text-caption");
    expect(cn("px-2", false, "px-4")).toBe("px-4");
  });

  it("sliding window: refuses the 4th hit within the window and frees slots one by one", () => {
    const rl = createRateLimiter({ limit: 3, windowMs: 1000 });
    expect([0, 100, 200].map((t) => rl.hit("k", t).ok)).toEqual([true, true, true]);
    expect(rl.hit("k", 500)).toEqual({ ok: false, remaining: 0, retryAfterMs: 500 });
    expect(rl.hit("other", 500).ok).toBe(true);
    expect(rl.hit("k", 1000).ok).toBe(true); // the hit at 0 has left (0 > 1000 - 1000 is false)
    expect(rl.hit("k", 1050).ok).toBe(false);
    rl.reset("k");
    expect(rl.hit("k", 1050)).toEqual({ ok: true, remaining: 2, retryAfterMs: 0 });
  });
});

describe("lib/api error shape", () => {
  const call = (fn: () => Promise<Response>) =>
    withApi(async () => fn())(new Request("http://x/"), undefined);
  const body = async (res: Response) => (await res.json()) as { error: Record<string, unknown> };

  it("maps domain errors to their status and code", async () => {
    const forbidden = await call(async () => {
      throw new ForbiddenError();
    });
    expect(forbidden.status).toBe(403);
    expect((await body(forbidden)).error).toEqual({
      code: "forbidden",
      message: "Your role in this team does not allow that.",
    });
    const netlist = await call(async () => {
      throw new NetlistInvalidError("The netlist has 1 error.", {
        errors: [{ line: 3, column: 7, message: "m" }],
      });
    });
    expect(netlist.status).toBe(422);
    expect((await body(netlist)).error.details).toEqual({ errors: [{ line: 3, column: 7, message: "m" }] });
    const limited = await call(async () => {
      throw new RateLimitError(undefined, { retryAfterSeconds: 12.2 });
    });
    expect([limited.status, limited.headers.get("Retry-After")]).toEqual([429, "13"]);
  });

  it("answers 400 with fields for a zod failure and malformed JSON", async () => {
    const schema = z.object({ n: z.number({ error: "n must be a number" }) });
    const zod = await call(async () => {
      schema.parse({ n: "1" });
      return new Response();
    });
    expect(zod.status).toBe(400);
    expect((await body(zod)).error.details).toEqual({ fields: { n: ["n must be a number"] } });
    const req = new Request("http://x/", { method: "POST", body: "{oops" });
    await expect(readJson(req, schema)).rejects.toMatchObject({ status: 400, code: "bad_request" });
    const good = new Request("http://x/", { method: "POST", body: '{"n":2}' });
    expect(await readJson(good, schema)).toEqual({ n: 2 });
  });

  it("answers 503 for a lost database and 500 without details for anything else", async () => {
    const quiet = vi.spyOn(console, "error").mockImplementation(() => {});
    const down = await call(async () => {
      throw new ConnectionRefusedError(new Error("connect ECONNREFUSED 127.0.0.1:55432"));
    });
    expect(down.status).toBe(503);
    expect((await body(down)).error.code).toBe("db_unavailable");
    const boom = await call(async () => {
      throw new Error("secret internals at /srv/app/lib/x.ts:12");
    });
    expect(boom.status).toBe(500);
    expect(JSON.stringify(await body(boom))).not.toContain("secret internals");
    quiet.mockRestore();
  });

  it("turns connection failures into DatabaseUnavailableError with the digest the error page reads", async () => {
    const refused = Object.assign(new Error("connect ECONNREFUSED"), { code: "ECONNREFUSED" });
    expect(isDatabaseConnectionError(refused)).toBe(true);
    expect(isDatabaseConnectionError(new Error("syntax error at or near"))).toBe(false);
    const err = await withDb(async () => {
      throw refused;
    }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DatabaseUnavailableError);
    expect((err as DatabaseUnavailableError).digest).toBe("PW_DB_UNAVAILABLE");
  });
});
