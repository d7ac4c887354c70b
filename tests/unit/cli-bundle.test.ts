import { spawnSync } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";

// The built command (dist-cli/phasewright.mjs through bin/phasewright.mjs) in a fresh process: the
// path CI uses, with designs solved on worker threads.
const ROOT = path.resolve(__dirname, "../..");
const BIN = path.join(ROOT, "bin/phasewright.mjs");
const dir = mkdtempSync(path.join(tmpdir(), "pw-bin-"));

// First-order RC low-pass (OAFE §16.2 — CHECKS.md §1): fc = 1/(2π·10 kΩ·10 nF) = 1591.55 Hz.
const rc = (check: string) => `title RC
Vin: vsource   in  gnd 1
R1:  resistor  in  out 10k
C1:  capacitor out gnd 10n
sweep 100Hz to 100kHz log 20 per decade
show H = volts(out) / volts(in)
measure fc = crossing(H, half-power)
check ${check}
`;

beforeAll(() => {
  const built = spawnSync(process.execPath, ["scripts/build-cli.mjs", "--if-stale", "--quiet"], {
    cwd: ROOT,
  });
  expect(built.status, built.stderr.toString()).toBe(0);
  mkdirSync(path.join(dir, "designs/sub"), { recursive: true });
  for (let i = 0; i < 4; i++)
    writeFileSync(path.join(dir, `designs/pass${i}.pwn`), rc("fc between 1.5kHz and 1.7kHz"));
  writeFileSync(path.join(dir, "designs/sub/fail.pwn"), rc("fc < 1kHz"));
}, 60_000);

const cmd = (...args: string[]) => {
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd: dir, encoding: "utf8" });
  return { code: r.status, out: r.stdout, err: r.stderr };
};

describe("the built phasewright command", () => {
  it("checks designs on worker threads: one line each, exit 1 for the failing one, a JUnit report", () => {
    const r = cmd("check", "designs/**/*.pwn", "--jobs", "2", "--report", "junit", "junit.xml");
    expect(r.err).toBe("");
    expect(r.code).toBe(1);
    const lines = r.out.trim().split("\n");
    expect(lines.filter((l) => l.startsWith("PASS "))).toHaveLength(4);
    expect(lines).toContainEqual(
      expect.stringMatching(/^FAIL {2}designs\/sub\/fail\.pwn — 1 of 1 check fail/),
    );
    expect(lines).toContainEqual(expect.stringMatching(/^ {8}check fc < 1kHz fails/));
    expect(lines.at(-1)).toMatch(/^5 designs: 4 pass, 1 fail, 0 with netlist errors/);
    const xml = readFileSync(path.join(dir, "junit.xml"), "utf8");
    expect(xml.match(/<testsuite /g)).toHaveLength(5);
    expect(xml).toContain('failures="1" errors="0"');
  });

  it("solves one file as before", () => {
    const r = cmd("solve", "designs/pass0.pwn");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^ {2}fc {2}1\.5915 kHz$/m);
    expect(cmd("solve", "--json", "designs/pass0.pwn").out).toContain('"solverVersion"');
    expect(cmd("--version").out).toMatch(/^phasewright \d+\.\d+\.\d+\n$/);
  });

  it("bundles no database code (no Sequelize, pg, models or lib/db)", () => {
    const meta = JSON.parse(readFileSync(path.join(ROOT, "dist-cli/meta.json"), "utf8"));
    const inputs = Object.keys(meta.inputs);
    expect(inputs).toContain("lib/compare.ts");
    expect(
      inputs.filter((f) =>
        /node_modules\/(sequelize|pg|pg-boss)\/|^models\/|^lib\/db\.ts$|^lib\/runs\.ts$/.test(f),
      ),
    ).toEqual([]);
  });
});
