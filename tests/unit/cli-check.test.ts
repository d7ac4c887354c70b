import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { type Baseline, judgeAgainst, locateRun } from "@/cli/against";
import { parseCheckArgs } from "@/cli/args";
import { check, type Io } from "@/cli/check";
import { runCommand } from "@/cli/command";
import { expandPattern } from "@/cli/glob";
import { parseTolerance, within } from "@/cli/tolerance";
import { solveNetlist } from "@/solver";
import type { SolveSuccess } from "@/solver/types";

// First-order RC low-pass (OAFE §16.2, Fig. 16-2 — CHECKS.md §1): fc = 1/(2πRC);
// R = 10 kΩ, C = 10 nF → 1591.5494 Hz. With R = 10.1 kΩ: fc·10/10.1 = 1575.7915 Hz (−0.990 %).
const rc = (r: string, extraCheck = "") => `title RC low-pass
Vin: vsource   in  gnd 1
R1:  resistor  in  out ${r}
C1:  capacitor out gnd 10n
sweep 100Hz to 100kHz log 50 per decade
show H = volts(out) / volts(in)
measure fc = crossing(H, half-power)
check fc between 1.5kHz and 1.7kHz
${extraCheck}
`;

const dir = mkdtempSync(path.join(tmpdir(), "pw-check-"));
function put(rel: string, text: string): string {
  const p = path.join(dir, rel);
  mkdirSync(path.dirname(p), { recursive: true });
  writeFileSync(p, text);
  return p;
}
put("designs/a/pass.pwn", rc("10k"));
put("designs/b/fail.pwn", rc("10k", "check fc > 2kHz"));
put("designs/notes.txt", "not a netlist");
put("broken/bad.pwn", "R1: resistr a gnd 1k\n");

async function call(args: string[], env: Record<string, string | undefined> = {}) {
  let out = "";
  let err = "";
  const io: Io = {
    out: (s) => {
      out += s;
    },
    err: (s) => {
      err += s;
    },
    cwd: dir,
    env,
    version: "test",
  };
  const code = await runCommand(args, io);
  return { code, out, err };
}

describe("patterns", () => {
  it("** crosses folders, * stays in one, {a,b} picks; results are sorted and relative", () => {
    expect(expandPattern("designs/**/*.pwn", dir)).toEqual(["designs/a/pass.pwn", "designs/b/fail.pwn"]);
    expect(expandPattern("designs/*.pwn", dir)).toEqual([]);
    expect(expandPattern("**/*.pwn", dir)).toEqual([
      "broken/bad.pwn",
      "designs/a/pass.pwn",
      "designs/b/fail.pwn",
    ]);
    expect(expandPattern("designs/{a,b}/p*.pwn", dir)).toEqual(["designs/a/pass.pwn"]);
    expect(expandPattern("designs/a/pass.pwn", dir)).toEqual(["designs/a/pass.pwn"]);
  });
});

describe("arguments and tolerances", () => {
  it("reads reports, jobs, baseline and tolerances; refuses what it cannot use", () => {
    const a = parseCheckArgs(["x.pwn", "--report", "junit", "r.xml", "--jobs=2", "--against", "id"]);
    expect(a).toMatchObject({ patterns: ["x.pwn"], reports: [{ format: "junit", file: "r.xml" }], jobs: 2 });
    expect(parseCheckArgs(["--report", "xml", "r"])).toEqual({ error: "--report xml: choose junit or json" });
    expect(parseCheckArgs(["x.pwn", "--tolerance", "f0=1%"])).toEqual({
      error: "--tolerance applies to --against only",
    });
    expect(parseCheckArgs(["x.pwn", "--jobs", "0"])).toHaveProperty("error");
    expect(parseCheckArgs([])).toHaveProperty("error");
  });

  it("relative limits in %, absolute ones in the measure's unit with SI prefixes", () => {
    expect(parseTolerance("f0=0.5%")).toMatchObject({ name: "f0", kind: "relative", value: 0.005 });
    expect(parseTolerance("pm=2deg")).toMatchObject({ kind: "absolute", value: 2, unit: "deg" });
    expect(parseTolerance("f0=1.5kHz")).toMatchObject({ kind: "absolute", value: 1500, unit: "Hz" });
    expect(parseTolerance("*=1%")).toMatchObject({ name: "*", value: 0.01 });
    expect(parseTolerance("f0")).toHaveProperty("error");
    expect(parseTolerance("f0=1meg")).toHaveProperty("error");
    const half = parseTolerance("f0=0.5%");
    if ("error" in half) throw new Error(half.error);
    expect(within(1000, 1004.9, "Hz", half)).toMatchObject({ ok: true });
    expect(within(1000, 1005.1, "Hz", half)).toMatchObject({ ok: false });
    expect(within(1000, 1000 * (1 + 1e-12), "Hz", null)).toMatchObject({ ok: true, limit: "rounding" });
    const deg = parseTolerance("f0=2deg");
    if ("error" in deg) throw new Error(deg.error);
    expect(within(1000, 1001, "Hz", deg)).toHaveProperty("error");
  });
});

describe("phasewright check", () => {
  it("all checks pass → 0, one line per design and a summary", async () => {
    const r = await call(["check", "designs/a/*.pwn"]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^PASS {2}designs\/a\/pass\.pwn — 1 check pass \(\d+ ms\)$/m);
    expect(r.out).toMatch(/^1 design: 1 pass, 0 fail, 0 with netlist errors/m);
  });

  it("a failing check → 1, with a line for the check that failed", async () => {
    const r = await call(["check", "designs/**/*.pwn"]);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/^FAIL {2}designs\/b\/fail\.pwn — 1 of 2 checks fail/m);
    expect(r.out).toMatch(/^ {8}check fc > 2kHz fails/m);
  });

  it("netlist errors → 2 (before failing checks), with FILE:line:col", async () => {
    const r = await call(["check", "designs/**/*.pwn", "broken/bad.pwn"]);
    expect(r.code).toBe(2);
    expect(r.out).toContain("broken/bad.pwn:1:5: unknown part kind `resistr` (did you mean `resistor`?)");
  });

  it("nothing matched, or an unknown option → 3", async () => {
    expect((await call(["check", "nowhere/**/*.pwn"])).code).toBe(3);
    expect((await call(["check", "x.pwn", "--fast"])).code).toBe(3);
    expect((await call(["frobnicate"])).code).toBe(3);
  });

  it("writes JUnit XML and JSON reports with every check as a test case", async () => {
    // A report under a file (not a folder) cannot be written: exit 3 and a message.
    const blocked = await call([
      "check",
      "designs/a/pass.pwn",
      "--report",
      "json",
      "designs/notes.txt/r.json",
    ]);
    expect(blocked.code).toBe(3);
    expect(blocked.err).toContain("cannot write designs/notes.txt/r.json");
    // A missing folder is created.
    const ok = await call([
      "check",
      "designs/**/*.pwn",
      "broken/*.pwn",
      "--report",
      "junit",
      "out/junit.xml",
      "--report",
      "json",
      "out/report.json",
    ]);
    expect(ok.code).toBe(2);
    const xml = readFileSync(path.join(dir, "out/junit.xml"), "utf8");
    expect(xml).toMatch(
      /^<\?xml version="1.0" encoding="UTF-8"\?>\n<testsuites name="phasewright check" tests="4" failures="1" errors="1"/,
    );
    expect(xml).toContain('<testsuite name="designs/b/fail.pwn" tests="2" failures="1" errors="0"');
    expect(xml).toContain('<testcase classname="designs/b/fail.pwn" name="check fc &gt; 2kHz"');
    expect(xml).toContain("broken/bad.pwn:1:5: unknown part kind `resistr`");
    expect(xml.match(/<testsuite /g)).toHaveLength(3);
    const json = JSON.parse(readFileSync(path.join(dir, "out/report.json"), "utf8"));
    expect(json.summary).toEqual({ designs: 3, pass: 1, fail: 1, error: 1 });
    const pass = json.designs.find((d: { file: string }) => d.file === "designs/a/pass.pwn");
    expect(pass.measures[0].name).toBe("fc");
    expect(pass.measures[0].value).toBeCloseTo(1591.5494, 3);
  });

  it("solve keeps today's summary and exit codes", async () => {
    const r = await call(["solve", "designs/a/pass.pwn"]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^ {2}fc {2}1\.5915 kHz$/m);
    expect((await call(["solve", "broken/bad.pwn"])).code).toBe(2);
  });
});

describe("against a baseline (pure part)", () => {
  const solved = (r: string): SolveSuccess => {
    const s = solveNetlist(rc(r));
    if (!s.ok) throw new Error(s.errors[0]?.message);
    return s;
  };
  const baseline: Baseline = {
    id: "00000000-0000-4000-8000-000000000001",
    title: "signed off",
    url: "http://x/runs/1",
    netlist: rc("10k"),
    result: solved("10k"),
  };
  const tol = (t: string) => {
    const p = parseTolerance(t);
    if ("error" in p) throw new Error(p.error);
    return p;
  };

  it("a 1 % larger resistor moves fc by −0.990 %: fails a 0.5 % limit, passes 2 %", () => {
    const local = solved("10.1k");
    const tight = judgeAgainst(baseline, rc("10.1k"), local, [tol("fc=0.5%")]);
    const fc = tight.measures.find((m) => m.name === "fc")!;
    expect(fc.a).toBeCloseTo(1591.5494, 2);
    expect(fc.b).toBeCloseTo(1575.7915, 2);
    expect(fc.deltaPct).toBeCloseTo(-0.990099, 3);
    expect(fc.ok).toBe(false);
    expect(tight.ok).toBe(false);
    expect(tight.partsChanged).toBe(1);
    expect(judgeAgainst(baseline, rc("10.1k"), local, [tol("fc=2%")]).ok).toBe(true);
    expect(judgeAgainst(baseline, rc("10.1k"), local, [tol("fc=20Hz")]).ok).toBe(true);
    expect(judgeAgainst(baseline, rc("10.1k"), local, []).ok).toBe(false);
  });

  it("reports the largest trace difference: 20·log10(10/10.1) = −0.0864 dB far above the corner", () => {
    const c = judgeAgainst(baseline, rc("10.1k"), solved("10.1k"), [tol("fc=2%"), tol("H=0.05dB")]);
    const h = c.traces.find((t) => t.name === "H")!;
    expect(h.maxDb!.value).toBeCloseTo(-0.0864, 3);
    expect(h.maxDb!.at).toBeCloseTo(100e3, -2);
    // Phase: atan(f/fc) − atan(f/fc′) is largest near the corner, ≈ 0.28°.
    expect(Math.abs(h.maxDeg!.value)).toBeGreaterThan(0.25);
    expect(Math.abs(h.maxDeg!.value)).toBeLessThan(0.3);
    expect(h.ok).toBe(false);
    expect(c.ok).toBe(false);
  });

  it("a tolerance naming nothing, or in the wrong unit, is a problem that fails", () => {
    const c = judgeAgainst(baseline, rc("10k"), solved("10k"), [tol("f1=1%"), tol("fc=2dB")]);
    expect(c.problems).toEqual([
      "--tolerance fc=2dB: fc is in Hz, not dB",
      "--tolerance f1=1%: no measure or trace named f1",
    ]);
    expect(c.ok).toBe(false);
  });

  it("finds the run in an id with PHASEWRIGHT_URL or in the run's URL", () => {
    const id = "3f2a6c1e-1b2c-4d5e-8f90-123456789abc";
    expect(locateRun(id, { PHASEWRIGHT_URL: "https://pw.example/" })).toEqual({
      origin: "https://pw.example",
      id,
    });
    expect(locateRun(`https://pw.example/runs/${id}`, {})).toEqual({ origin: "https://pw.example", id });
    expect(locateRun(`https://h/pw/api/runs/${id}`, {})).toEqual({ origin: "https://h/pw", id });
    expect(locateRun(id, {})).toHaveProperty("error");
    expect(locateRun("latest", { PHASEWRIGHT_URL: "https://x" })).toHaveProperty("error");
  });

  it("--against without a token says where to get one (exit 3)", async () => {
    const r = await call([
      "check",
      "designs/a/pass.pwn",
      "--against",
      "https://pw.example/runs/3f2a6c1e-1b2c-4d5e-8f90-123456789abc",
    ]);
    expect(r.code).toBe(3);
    expect(r.err).toContain("PHASEWRIGHT_TOKEN");
  });
});

describe("check in-process with an Io", () => {
  it("check() itself returns the exit code", async () => {
    let out = "";
    const code = await check(["designs/a/pass.pwn"], {
      out: (s) => {
        out += s;
      },
      err: () => {},
      cwd: dir,
      env: {},
      version: "t",
    });
    expect(code).toBe(0);
    expect(out.split("\n").filter(Boolean)).toHaveLength(2);
  });
});
