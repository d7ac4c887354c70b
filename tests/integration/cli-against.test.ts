// `phasewright check --against RUN` against the real service code: a run saved through the route
// handler, read back over HTTP from the real `GET /api/runs/:id` handler (served by a small node:http
// server in this test — the integration stage has no Next.js server), with a real API token.
import { execFile } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { POST as createRunRoute } from "@/app/api/projects/[id]/runs/route";
import { GET as getRunRoute } from "@/app/api/runs/[id]/route";
import { runCommand } from "@/cli/command";
import { call, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

// First-order RC low-pass (OAFE §16.2, Fig. 16-2 — CHECKS.md §1): fc = 1/(2πRC) = 1591.5494 Hz for
// 10 kΩ, 10 nF; with 10.1 kΩ fc = 1575.7915 Hz, Δ = −15.758 Hz (−0.990 %).
const rc = (r: string) => `title RC low-pass
Vin: vsource   in  gnd 1
R1:  resistor  in  out ${r}
C1:  capacitor out gnd 10n
sweep 100Hz to 100kHz log 50 per decade
show H = volts(out) / volts(in)
measure fc = crossing(H, half-power)
check fc between 1.5kHz and 1.7kHz
`;

let server: Server;
let base = "";
let fx: Fixtures;
let tokens: Record<Who, string>;
let runId = "";
const dir = mkdtempSync(path.join(tmpdir(), "pw-against-"));
writeFileSync(path.join(dir, "drifted.pwn"), rc("10.1k"));
writeFileSync(path.join(dir, "same.pwn"), rc("10k"));

beforeAll(async () => {
  process.env.OUTBOX_AUTODELIVER = "0";
  // Only the route the command reads; anything else is a 404 like the app's.
  server = createServer(async (req, res) => {
    const m = /^\/api\/runs\/([^/?]+)$/.exec(req.url ?? "");
    if (!m || req.method !== "GET") {
      res.writeHead(404).end();
      return;
    }
    const headers = new Headers();
    for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
    const answer = await getRunRoute(new Request(`${base}${req.url}`, { headers }), {
      params: Promise.resolve({ id: decodeURIComponent(m[1]!) }),
    });
    res.writeHead(answer.status, {
      "content-type": answer.headers.get("content-type") ?? "application/json",
    });
    res.end(Buffer.from(await answer.arrayBuffer()));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

beforeEach(async () => {
  fx = await createFixtures();
  tokens = await tokensFor(fx);
  const saved = await call(createRunRoute, {
    token: tokens.designer,
    params: { id: fx.project.id },
    body: { title: "Signed-off corner", netlist: rc("10k") },
  });
  expect(saved.status).toBe(201);
  runId = saved.body.run.id;
});

async function check(args: string[], token: string) {
  let out = "";
  let err = "";
  const code = await runCommand(["check", ...args], {
    out: (s) => {
      out += s;
    },
    err: (s) => {
      err += s;
    },
    cwd: dir,
    env: { PHASEWRIGHT_URL: base, PHASEWRIGHT_TOKEN: token },
    version: "test",
  });
  return { code, out, err };
}

describe("phasewright check --against a saved run", () => {
  it("a measure that moved past its limit fails (exit 1) and says by how much", async () => {
    const r = await check(["drifted.pwn", "--against", runId, "--tolerance", "fc=0.5%"], tokens.viewer);
    expect(r.err).toBe("");
    expect(r.code).toBe(1);
    expect(r.out).toContain(
      `against run ${runId} "Signed-off corner" (${base}/runs/${runId}): 1 measure moved too far, 1 part changed`,
    );
    expect(r.out).toMatch(
      /MOVED fc {2}1\.5915 kHz → 1\.5758 kHz {2}Δ −15\.75\d* Hz \(−0\.99 %\) {2}\[limit 0\.5%\]/,
    );
    expect(r.out).toMatch(/trace H: largest difference −0\.0864 dB at 100 kHz, −0\.28\d° at 1\.58\d* kHz/);
    expect(r.out).toMatch(/^FAIL {2}drifted\.pwn — 1 check pass, 1 moved from the baseline/m);
  });

  it("within the limit passes (exit 0); the run may be named by its URL", async () => {
    const r = await check(
      ["drifted.pwn", "--against", `${base}/runs/${runId}`, "--tolerance", "fc=2%"],
      tokens.viewer,
    );
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/ok {4}fc {2}1\.5915 kHz → 1\.5758 kHz/);
    const same = await check(["same.pwn", "--against", runId], tokens.viewer);
    expect(same.code).toBe(0);
    expect(same.out).toContain("every measure within its limit");
  });

  it("a run the token's user may not see is a 404, a bad token a 401: exit 3", async () => {
    const hidden = await check(["same.pwn", "--against", runId], tokens.outsider);
    expect(hidden.code).toBe(3);
    expect(hidden.err).toContain(`404 — no run ${runId} that this token's user may see`);
    const bad = await check(["same.pwn", "--against", runId], "pw_not-a-token");
    expect(bad.code).toBe(3);
    expect(bad.err).toContain("401 — PHASEWRIGHT_TOKEN is not a valid API token there");
  });

  it("the built command in its own process does the same over HTTP", async () => {
    const root = path.resolve(__dirname, "../..");
    await promisify(execFile)(process.execPath, ["scripts/build-cli.mjs", "--if-stale", "--quiet"], {
      cwd: root,
    });
    const run = promisify(execFile)(
      process.execPath,
      [
        path.join(root, "bin/phasewright.mjs"),
        "check",
        "drifted.pwn",
        "--against",
        runId,
        "--tolerance",
        "fc=0.5%",
        "--report",
        "json",
        "r.json",
      ],
      { cwd: dir, env: { ...process.env, PHASEWRIGHT_URL: base, PHASEWRIGHT_TOKEN: tokens.reviewer } },
    );
    const failed = await run.then(
      () => null,
      (e: { code: number; stdout: string }) => e,
    );
    expect(failed?.code).toBe(1);
    expect(failed?.stdout).toMatch(/MOVED fc/);
  });
});
