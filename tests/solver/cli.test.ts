import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { formatSi, parseArgs, run } from "@/solver/cli";

const ROOT = path.resolve(__dirname, "../..");
const EXAMPLES = path.join(ROOT, "solver/examples");
const dir = mkdtempSync(path.join(tmpdir(), "pw-cli-"));
function file(name: string, text: string): string {
  const p = path.join(dir, name);
  writeFileSync(p, text);
  return p;
}

function call(args: string[]) {
  let out = "";
  let err = "";
  const code = run(
    args,
    (s) => {
      out += s;
    },
    (s) => {
      err += s;
    },
  );
  return { code, out, err };
}

describe("arguments", () => {
  it("one file and at most one of --json/--csv", () => {
    expect(parseArgs(["a.pwn"])).toEqual({ file: "a.pwn", mode: "summary" });
    expect(parseArgs(["--csv", "a.pwn"])).toEqual({ file: "a.pwn", mode: "csv" });
    expect(parseArgs([])).toHaveProperty("error");
    expect(parseArgs(["a", "b"])).toHaveProperty("error");
    expect(parseArgs(["a", "--json", "--csv"])).toHaveProperty("error");
    expect(parseArgs(["a", "--xml"])).toHaveProperty("error");
  });

  it("bad flags and a missing file exit with 1", () => {
    expect(call(["--xml", "a.pwn"])).toMatchObject({ code: 1, out: "" });
    const missing = call([path.join(dir, "nope.pwn")]);
    expect(missing.code).toBe(1);
    expect(missing.err).toContain("cannot read");
  });
});

describe("netlist errors exit with 2", () => {
  const bad = file("bad.pwn", "R1: resistr a gnd 1k\nC1: capacitor a gnd 1meg\n");

  it("prints FILE:line:col: message (hint)", () => {
    const r = call([bad]);
    expect(r.code).toBe(2);
    expect(r.err.split("\n").filter(Boolean)).toEqual([
      `${bad}:1:5: unknown part kind \`resistr\` (did you mean \`resistor\`?)`,
      `${bad}:2:21: \`1meg\`: "meg" is not a prefix here (write 1M for mega; M is mega, m is milli)`,
    ]);
  });

  it("--json prints the error JSON on stdout", () => {
    const r = call([bad, "--json"]);
    expect(r.code).toBe(2);
    const json = JSON.parse(r.out);
    expect(json.ok).toBe(false);
    expect(json.errors[0]).toEqual({
      line: 1,
      column: 5,
      endColumn: 12,
      message: "unknown part kind `resistr`",
      hint: "did you mean `resistor`?",
      fix: { line: 1, column: 5, endColumn: 12, text: "resistor", label: "Write resistor" },
    });
  });
});

describe("solved netlists", () => {
  it("summary of the series RLC example: centre, bandwidth and Q (CHECKS.md §8: 5032.921210 Hz, 1591.549431 Hz, 3.162278)", () => {
    const r = call([path.join(EXAMPLES, "rlc-bandpass.pwn")]);
    expect(r.code).toBe(0);
    expect(r.out).toContain("Tone detector input filter, 5 kHz");
    expect(r.out).toMatch(/centre\s+5\.0329 kHz/);
    expect(r.out).toMatch(/width\s+1\.5915 kHz/);
    expect(r.out).toMatch(/quality\s+3\.1623/);
    expect(r.out).toContain("PASS  quality > 3");
  });

  it("--json carries the contract's fields; the Wien example's f0 and poles (CHECKS.md §2: 1591.5494309 Hz; K = 3.05 → 250 ± j9996.874512 rad/s)", () => {
    const r = call([path.join(EXAMPLES, "wien-bridge.pwn"), "--json"]);
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    expect(Object.keys(json)).toEqual(
      expect.arrayContaining([
        "ok",
        "title",
        "solverVersion",
        "frequencies",
        "traces",
        "measures",
        "checks",
        "warnings",
        "stats",
      ]),
    );
    const f0 = json.measures.find((m: { name: string }) => m.name === "f0");
    expect(f0.value).toBeCloseTo(1591.5494309, 5);
    expect(json.measures.find((m: { name: string }) => m.name === "beta").value).toBeCloseTo(1 / 3, 9);
    const upper = json.poles.find((p: { im: number }) => p.im > 0);
    expect(upper.re).toBeCloseTo(250, 6);
    expect(upper.im).toBeCloseTo(9996.874512, 5);
  });

  it("--csv has a header and one row per frequency with re/im/dB/deg/group delay per trace", () => {
    const r = call([path.join(EXAMPLES, "twin-t-notch.pwn"), "--csv"]);
    expect(r.code).toBe(0);
    const rows = r.out.trim().split("\r\n");
    expect(rows[0]).toBe("frequency_hz,H_re,H_im,H_db,H_deg,H_delay_s");
    // 10 Hz … 100 kHz at 200 per decade: 4·200 + 1 = 801 points.
    expect(rows).toHaveLength(802);
    const [f, re, im, db, , delay] = rows[1]!.split(",").map(Number);
    expect(f).toBe(10);
    expect(db).toBeCloseTo(20 * Math.log10(Math.hypot(re!, im!)), 9);
    // Twin-T H = (1 + x²)/(1 + 4x + x²), x = sRC, RC = 1e-4 s: at DC the delay is 4·RC (CHECKS §6, −d∠H/dω at ω → 0).
    expect(delay).toBeCloseTo(4e-4, 6);
  });

  it("the npm script runs end to end with the exit codes", () => {
    // Run from the examples folder with a relative path: the CLI resolves it against INIT_CWD.
    const ok = spawnSync("npm", ["run", "--silent", "solve", "--", "phase-shift.pwn"], {
      cwd: EXAMPLES,
      encoding: "utf8",
    });
    expect(ok.status).toBe(0);
    // Series-C/shunt-R network is real at 1/(2π√6·RC) = 649.74733436 Hz (CHECKS.md §7).
    expect(ok.stdout).toMatch(/fosc\s+649\.75 Hz/);
    const bad = spawnSync("npm", ["run", "--silent", "solve", "--", file("bad2.pwn", "swep 1k\n")], {
      cwd: ROOT,
      encoding: "utf8",
    });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain(":1:1: unknown statement `swep` (did you mean `sweep`?)");
  }, 30_000);
});

describe("formatSi", () => {
  it("uses SI prefixes for hertz and five significant digits, like the screens", () => {
    expect(formatSi(1591.5494309, "Hz")).toBe("1.5915 kHz");
    expect(formatSi(0.5, "Hz")).toBe("500 mHz");
    expect(formatSi(45.82789, "deg")).toBe("45.828°");
    expect(formatSi(0.333333333, "")).toBe("0.33333");
  });
});
