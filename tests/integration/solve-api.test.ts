import { beforeEach, describe, expect, it, vi } from "vitest";
import type { Actor } from "@/lib/session";
import { createFixtures, useTestDb } from "./setup";

// The route reads the caller through lib/session. The session cookie needs a Next.js request scope, so
// most tests set the caller directly; `useRealSession` switches to the real lookup (bearer tokens).
let actor: Actor | null = null;
let useRealSession = false;
vi.mock("@/lib/session", async (importOriginal) => {
  const real = await importOriginal<typeof import("@/lib/session")>();
  const { UnauthorizedError } = await import("@/lib/errors");
  return {
    ...real,
    getActor: async (req?: Request) => (useRealSession ? real.getActor(req) : actor),
    requireActor: async (req?: Request) => {
      if (useRealSession) return real.requireActor(req);
      if (!actor) throw new UnauthorizedError();
      return actor;
    },
  };
});

useTestDb();

const { POST } = await import("@/app/api/solve/route");
const { MAX_NETLIST_BYTES, SOLVE_RATE_PER_MINUTE } = await import("@/lib/limits");

function post(body: string, headers: Record<string, string> = {}): Promise<Response> {
  const req = new Request("http://localhost/api/solve", {
    method: "POST",
    headers: { "content-type": "application/json", ...headers },
    body,
  });
  return POST(req, undefined);
}

let userCounter = 0;
beforeEach(() => {
  useRealSession = false;
  // A fresh user per test so the per-user rate limit of one test does not leak into the next.
  userCounter += 1;
  actor = {
    userId: `00000000-0000-4000-8000-${String(userCounter).padStart(12, "0")}`,
    email: "d@x.test",
    name: "D",
  };
});

// First-order RC low-pass, R = 10 kΩ, C = 10 nF: fc = 1591.5494309190 Hz; at 10·fc −20.043214 dB
// (OAFE §16.2, Fig. 16-2 — CHECKS.md §1).
const RC = [
  "title RC low-pass check",
  "V1: vsource in gnd 1",
  "R1: resistor in out 10k",
  "C1: capacitor out gnd 10n",
  "sweep 100Hz to 100kHz log 50 per decade",
  "show h = volts(out) / volts(in)",
  "measure fc = crossing(h, half-power)",
  "measure lp10 = db(h) at 15915.494309190Hz",
  "check fc between 1.5kHz and 1.7kHz",
].join("\n");

describe("POST /api/solve", () => {
  it("solves a netlist and returns the result JSON with refined measures", async () => {
    const res = await post(JSON.stringify({ netlist: RC }));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.ok).toBe(true);
    expect(body.title).toBe("RC low-pass check");
    expect(body.frequencies).toHaveLength(151);
    expect(body.traces.map((t: { name: string }) => t.name)).toEqual(["h"]);
    const fc = body.measures.find((m: { name: string }) => m.name === "fc");
    expect(fc.unit).toBe("Hz");
    expect(Math.abs(fc.value / 1591.549430919 - 1)).toBeLessThan(1e-7);
    const lp10 = body.measures.find((m: { name: string }) => m.name === "lp10");
    expect(lp10.value).toBeCloseTo(-20.043214, 5);
    expect(body.checks).toEqual([
      { name: "fc", expression: "fc between 1.5kHz and 1.7kHz", pass: true, reason: null },
    ]);
  });

  it("answers 200 with ok:false and located errors for a bad netlist (a normal preview state)", async () => {
    const res = await post(
      JSON.stringify({ netlist: "R1: resistor in out 10k\nC1: capacitor out gnd 10kΩ\n" }),
    );
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.ok).toBe(false);
    expect(body.errors.length).toBeGreaterThan(0);
    const err = body.errors.find((e: { line: number }) => e.line === 2);
    expect(err).toBeDefined();
    expect(err.column).toBeGreaterThan(1);
    expect(err.endColumn).toBeGreaterThan(err.column);
  });

  it("answers 401 when signed out", async () => {
    actor = null;
    const res = await post(JSON.stringify({ netlist: RC }));
    expect(res.status).toBe(401);
    expect((await res.json()).error.code).toBe("unauthorized");
  });

  it("answers 400 for malformed JSON and for a missing netlist field", async () => {
    const bad = await post("{netlist:");
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.code).toBe("bad_request");
    const missing = await post(JSON.stringify({ text: RC }));
    expect(missing.status).toBe(400);
    const body = await missing.json();
    expect(body.error.code).toBe("bad_request");
    expect(Object.keys(body.error.details.fields)).toEqual(["netlist"]);
  });

  it("answers 413 for a netlist over the byte limit, counting UTF-8 bytes", async () => {
    // 'µ' is two bytes in UTF-8: this string has fewer characters than the limit but more bytes.
    const big = `# ${"µ".repeat(MAX_NETLIST_BYTES / 2 + 10)}\n`;
    expect(big.length).toBeLessThan(MAX_NETLIST_BYTES);
    const res = await post(JSON.stringify({ netlist: big }));
    expect(res.status).toBe(413);
    const body = await res.json();
    expect(body.error.code).toBe("too_large");
    expect(body.error.details).toEqual({ field: "netlist", limitBytes: MAX_NETLIST_BYTES });
  });

  it("answers 429 once a user exceeds the per-minute preview rate", async () => {
    const statuses: number[] = [];
    for (let i = 0; i <= SOLVE_RATE_PER_MINUTE; i++) statuses.push((await post("not json")).status);
    expect(statuses.slice(0, SOLVE_RATE_PER_MINUTE).every((s) => s === 400)).toBe(true);
    expect(statuses.at(-1)).toBe(429);
    const again = await post("not json");
    expect(again.headers.get("retry-after")).not.toBeNull();
  });

  it("accepts an API token as the caller and refuses an unknown or revoked one", async () => {
    const { createApiToken, revokeApiToken } = await import("@/lib/tokens");
    const fx = await createFixtures();
    const { token, summary } = await createApiToken(fx.users.designer.id, "preview script");
    useRealSession = true;
    const ok = await post(JSON.stringify({ netlist: RC }), { authorization: `Bearer ${token}` });
    expect(ok.status).toBe(200);
    const body = await ok.json();
    expect(Math.abs(body.measures[0].value / 1591.549430919 - 1)).toBeLessThan(1e-7); // CHECKS.md §1
    const unknown = await post(JSON.stringify({ netlist: RC }), {
      authorization: "Bearer pw_not-a-real-token",
    });
    expect(unknown.status).toBe(401);
    await revokeApiToken(fx.users.designer.id, summary.id);
    const revoked = await post(JSON.stringify({ netlist: RC }), { authorization: `Bearer ${token}` });
    expect(revoked.status).toBe(401);
  });

  it("prices the netlist before solving: monte-carlo 4000 in 500 bytes previews the nominal sweep and says why", async () => {
    const netlist = `${RC.replace("R1: resistor in out 10k", "R1: resistor in out 10k tol=1%")}\nmonte-carlo 4000\n`;
    expect(netlist.length).toBeLessThan(600);
    const res = await post(JSON.stringify({ netlist }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as {
      ok: boolean;
      deferred?: string;
      monteCarlo?: unknown;
      frequencies: number[];
    };
    expect(body.ok).toBe(true);
    expect(body.monteCarlo).toBeUndefined();
    // 100 Hz–100 kHz at 50 per decade = 151 points; × (1 + 4000 samples) = 604 151.
    expect(body.frequencies).toHaveLength(151);
    expect(body.deferred).toContain("monte-carlo 4000 samples");
    expect(body.deferred).toContain("604 151 sweep points of work");
    expect(body.deferred).toContain("Run the full analysis");
  });

  it('stage "sweep" answers the nominal sweep first and names the studies still to come', async () => {
    const netlist = `${RC.replace("R1: resistor in out 10k", "R1: resistor in out 10k tol=1%")}\nmonte-carlo 40 seed=5\n`;
    const first = await post(JSON.stringify({ netlist, stage: "sweep" }));
    expect(first.status).toBe(200);
    expect(first.headers.get("server-timing")).toMatch(
      /^read;dur=[\d.]+, solve;dur=[\d.]+, engine;dur=[\d.]+$/,
    );
    const sweep = await first.json();
    expect(sweep.ok).toBe(true);
    expect(sweep.pending).toEqual(["monte-carlo"]);
    expect(sweep.monteCarlo).toBeUndefined();
    expect(sweep.deferred).toBeUndefined();
    // The nominal sweep is the one the whole preview holds: fc of CHECKS.md §1.
    const fc = sweep.measures.find((m: { name: string }) => m.name === "fc");
    expect(Math.abs(fc.value / 1591.549430919 - 1)).toBeLessThan(1e-7);

    const whole = await (await post(JSON.stringify({ netlist, stage: "all" }))).json();
    expect(whole.pending).toBeUndefined();
    expect(whole.monteCarlo.samples).toBe(40);
    expect(whole.monteCarlo.seed).toBe(5);
    expect(sweep.frequencies).toEqual(whole.frequencies);
    expect(sweep.traces).toEqual(whole.traces);
    expect(sweep.measures).toEqual(whole.measures);
    expect(sweep.checks).toEqual(whole.checks);
    // Without `stage` the answer is the whole preview, as before.
    const plain = await (await post(JSON.stringify({ netlist }))).json();
    expect(plain.monteCarlo).toEqual(whole.monteCarlo);
  });

  it('stage "sweep" of a netlist without studies is the whole answer; an unknown stage is a 400 on its field', async () => {
    const sweep = await (await post(JSON.stringify({ netlist: RC, stage: "sweep" }))).json();
    expect(sweep.pending).toBeUndefined();
    expect(sweep.frequencies).toHaveLength(151);
    const bad = await post(JSON.stringify({ netlist: RC, stage: "fast" }));
    expect(bad.status).toBe(400);
    expect(Object.keys((await bad.json()).error.details.fields)).toEqual(["stage"]);
  });

  it('stage "sweep" over the budget is the deferred nominal sweep, with nothing pending', async () => {
    const netlist = `${RC.replace("R1: resistor in out 10k", "R1: resistor in out 10k tol=1%")}\nmonte-carlo 4000\n`;
    const body = await (await post(JSON.stringify({ netlist, stage: "sweep" }))).json();
    expect(body.pending).toBeUndefined();
    expect(body.deferred).toContain("monte-carlo 4000 samples");
  });

  it("a preview whose request is gone before a thread takes it is dropped, not solved", async () => {
    const req = new Request("http://localhost/api/solve", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ netlist: RC, stage: "sweep" }),
      signal: AbortSignal.abort(),
    });
    const res = await POST(req, undefined);
    expect(res.status).toBe(503);
    expect((await res.json()).error.code).toBe("cancelled");
  });

  it("counts a sensitivity study as two re-solves per part", async () => {
    const sections = Array.from(
      { length: 400 },
      (_, i) => `R${i}: resistor n${i} n${i + 1} 1k\nC${i}: capacitor n${i + 1} gnd 1n`,
    );
    const netlist = [
      "title ladder",
      "V1: vsource n0 gnd 1",
      ...sections,
      "sweep 100Hz to 100kHz log 50 per decade",
      "show h = volts(n400) / volts(n0)",
      "measure g = db(h) at 1kHz",
      "sensitivity g",
    ].join("\n");
    const res = await post(JSON.stringify({ netlist }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as { deferred?: string; sensitivity?: unknown };
    expect(body.sensitivity).toBeUndefined();
    // 801 parts (400 R, 400 C, the source): 151 × (1 + 2 × 801) = 242 053.
    expect(body.deferred).toContain("242 053 sweep points of work");
  });

  it("refuses a chunked body over the limit while it streams, without reading it all (413)", async () => {
    let pulled = 0;
    const chunk = new TextEncoder().encode(`{"netlist":"${"x".repeat(64 * 1024)}`);
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        pulled += chunk.byteLength;
        if (pulled > 50_000_000) controller.close();
        else controller.enqueue(chunk);
      },
    });
    const req = new Request("http://localhost/api/solve", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: stream,
      duplex: "half",
    } as RequestInit);
    const res = await POST(req, undefined);
    expect(res.status).toBe(413);
    expect(pulled).toBeLessThan(1_000_000);
  });
});
