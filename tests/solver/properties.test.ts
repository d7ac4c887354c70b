import { readFileSync } from "node:fs";
import path from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver/index";
import { type CompileResult, compile, parse } from "@/solver/lang";
import { parseNumberText } from "@/solver/lang/numbers";
import type { Circuit, Part } from "@/solver/types";

const EXAMPLES = path.resolve(__dirname, "../../solver/examples");
const example = (name: string) => readFileSync(path.join(EXAMPLES, name), "utf8");
const ALL_EXAMPLES = [
  "wien-bridge.pwn",
  "phase-shift.pwn",
  "lowpass-2nd-order.pwn",
  "twin-t-notch.pwn",
  "rlc-bandpass.pwn",
  "cable-driver-gbw.pwn",
  "buffered-rc-blocks.pwn",
];

/** Errors must point inside the text: 1-based, endColumn after column, line within the text. */
function wellFormed(text: string, r: CompileResult): void {
  expect(typeof r.ok).toBe("boolean");
  if (r.ok) return;
  expect(r.errors.length).toBeGreaterThan(0);
  const lines = text.split(/\r\n|\n|\r/).length;
  for (const e of r.errors) {
    expect(e.line).toBeGreaterThanOrEqual(1);
    expect(e.line).toBeLessThanOrEqual(Math.max(1, lines));
    expect(e.column).toBeGreaterThanOrEqual(1);
    expect(e.endColumn).toBeGreaterThan(e.column);
    expect(e.message.length).toBeGreaterThan(0);
    // A caught surprise is reported as an internal fault; none may happen.
    expect(e.message).not.toContain("internal fault");
  }
}

const NETLIST_ALPHABET = [..."abcRCLVUXgnd0123456789kMmunpµΩ%.,:;=()+-*/^<>#\\ \t\n\r_°'\"{}[]|&$@!?~"];

describe("compile never throws", () => {
  it("on arbitrary strings", () => {
    fc.assert(
      fc.property(fc.string({ unit: "binary", maxLength: 200 }), (text) => {
        wellFormed(text, compile(text));
        const parsed = parse(text);
        for (const e of parsed.errors) expect(e.message).not.toContain("internal fault");
      }),
      { seed: 1, numRuns: 400 },
    );
  });

  it("on strings over the netlist's own characters and words", () => {
    const words = [
      "resistor",
      "capacitor",
      "opamp",
      "vsource",
      "block",
      "end",
      "let",
      "sweep",
      "show",
      "loop",
      "measure",
      "check",
      "volts(",
      "v(",
      "amps(",
      "i(",
      "to",
      "log",
      "per",
      "decade",
      "at",
      "between",
      "and",
      "cut",
      "before",
      "gnd",
      "preset",
      "vary",
      "over",
      "monte-carlo",
      "poles",
      "sensitivity",
      "snap(E24,",
      "4k7",
      "1meg",
      "tol=",
      "gbw=",
    ];
    const piece = fc.oneof(
      fc.constantFrom(...NETLIST_ALPHABET),
      fc.constantFrom(...words.map((w) => ` ${w} `)),
    );
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 80 }), (pieces) => {
        const text = pieces.join("");
        wellFormed(text, compile(text));
      }),
      { seed: 2, numRuns: 400 },
    );
  });

  it("on mutated example netlists", () => {
    const mutation = fc.record({
      file: fc.constantFrom(...ALL_EXAMPLES),
      edits: fc.array(
        fc.record({
          kind: fc.constantFrom("delete", "insert", "duplicate-line", "drop-line", "swap-lines", "truncate"),
          at: fc.nat(),
          other: fc.nat(),
          char: fc.constantFrom(...NETLIST_ALPHABET),
        }),
        { minLength: 1, maxLength: 5 },
      ),
    });
    fc.assert(
      fc.property(mutation, ({ file, edits }) => {
        let text = example(file);
        for (const e of edits) {
          const lines = text.split("\n");
          const i = e.at % Math.max(1, text.length);
          const l = e.at % lines.length;
          const m = e.other % lines.length;
          if (e.kind === "delete") text = text.slice(0, i) + text.slice(i + 1);
          if (e.kind === "insert") text = text.slice(0, i) + e.char + text.slice(i);
          if (e.kind === "truncate") text = text.slice(0, i);
          if (e.kind === "duplicate-line") lines.splice(l, 0, lines[l]!);
          if (e.kind === "drop-line") lines.splice(l, 1);
          if (e.kind === "swap-lines") [lines[l], lines[m]] = [lines[m]!, lines[l]!];
          if (e.kind.endsWith("line") || e.kind === "swap-lines") text = lines.join("\n");
        }
        wellFormed(text, compile(text));
      }),
      { seed: 3, numRuns: 300 },
    );
  });
});

/** A netlist whose node names are all distinct from every other word in it. */
const BASE = [
  "title Property base, two-section filter",
  "Vin: vsource nd_in gnd 1",
  "R1: resistor nd_in nd_a 10k",
  "C1: capacitor nd_a gnd 10n tol=5%",
  "R2: resistor nd_a nd_b 10k",
  "C2: capacitor nd_b nd_c 22n",
  "U1: opamp nd_b nd_c nd_c gbw=1M",
  "Rl: resistor nd_c gnd 2k",
];
const TAIL = [
  "sweep 10Hz to 100kHz log 20 per decade",
  "show H = volts(nd_c) / volts(nd_in)",
  "measure fc = crossing(H, -3dB)",
  "measure pk = peak(H)",
  "measure g1 = db(H) at 1kHz",
];

const strip = (p: Part) => {
  const { span: _span, ...rest } = p;
  return rest;
};
const byName = (c: Circuit) => [...c.parts].sort((a, b) => a.name.localeCompare(b.name)).map(strip);
const numbers = (text: string) => {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.measures.map((m) => m.value);
};

describe("invariance", () => {
  it("reordering part lines gives the same circuit up to order, and the same results", () => {
    const reference = compile([...BASE, ...TAIL].join("\n"));
    if (!reference.ok) expect.fail("base netlist must compile");
    const referenceNumbers = numbers([...BASE, ...TAIL].join("\n"));
    fc.assert(
      fc.property(
        fc.shuffledSubarray(BASE.slice(1), { minLength: BASE.length - 1, maxLength: BASE.length - 1 }),
        (parts) => {
          const text = [BASE[0]!, ...parts, ...TAIL].join("\n");
          const r = compile(text);
          expect(r.ok).toBe(true);
          if (!r.ok) return;
          expect(byName(r.circuit)).toEqual(byName(reference.circuit));
          expect(new Set(r.circuit.nodes)).toEqual(new Set(reference.circuit.nodes));
          const values = numbers(text);
          values.forEach((v, i) => {
            expect(v! / referenceNumbers[i]!).toBeCloseTo(1, 9);
          });
        },
      ),
      { seed: 4, numRuns: 25 },
    );
  });

  it("renaming nodes gives the same circuit up to names, and the same results", () => {
    const text = [...BASE, ...TAIL].join("\n");
    const reference = compile(text);
    if (!reference.ok) expect.fail("base netlist must compile");
    const referenceNumbers = numbers(text);
    const oldNames = ["nd_in", "nd_a", "nd_b", "nd_c"];
    const fresh = fc.uniqueArray(
      fc.stringMatching(/^[a-z][a-z0-9_]{0,5}$/).map((s) => `q_${s}`),
      { minLength: 4, maxLength: 4 },
    );
    fc.assert(
      fc.property(fresh, (newNames) => {
        const map = new Map(oldNames.map((o, i) => [o, newNames[i]!]));
        const renamed = text.replace(/\bnd_(in|a|b|c)\b/g, (m) => map.get(m)!);
        const r = compile(renamed);
        expect(r.ok).toBe(true);
        if (!r.ok) return;
        const expected = reference.circuit.parts.map((p) => ({
          ...strip(p),
          nodes: p.nodes.map((n) => map.get(n) ?? n),
        }));
        expect(r.circuit.parts.map(strip)).toEqual(expected);
        expect(r.circuit.nodes).toEqual(reference.circuit.nodes.map((n) => map.get(n)!));
        const values = numbers(renamed);
        values.forEach((v, i) => {
          expect(v! / referenceNumbers[i]!).toBeCloseTo(1, 12);
        });
      }),
      { seed: 5, numRuns: 25 },
    );
  });
});

describe("number properties (SI prefixes and IEC 60062 codes: common practice)", () => {
  const PREFIX: [string, number][] = [
    ["f", 1e-15],
    ["p", 1e-12],
    ["n", 1e-9],
    ["u", 1e-6],
    ["µ", 1e-6],
    ["m", 1e-3],
    ["", 1],
    ["k", 1e3],
    ["M", 1e6],
    ["G", 1e9],
    ["T", 1e12],
  ];

  it("mantissa with prefix reads as mantissa × scale", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 999_999 }),
        fc.integer({ min: 0, max: 3 }),
        fc.constantFrom(...PREFIX),
        (digits, decimals, [p, scale]) => {
          const mantissa = digits / 10 ** decimals;
          const r = parseNumberText(`${mantissa}${p}`);
          expect(r.ok).toBe(true);
          if (r.ok) expect(r.value / (mantissa * scale)).toBeCloseTo(1, 12);
        },
      ),
      { seed: 6, numRuns: 300 },
    );
  });

  it("a letter code AbB reads as A.B × scale", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 999 }),
        fc.integer({ min: 0, max: 99 }),
        fc.constantFrom(...PREFIX.filter(([p]) => p !== "")),
        (a, b, [p, scale]) => {
          const r = parseNumberText(`${a}${p}${b}`);
          expect(r.ok).toBe(true);
          if (r.ok) expect(r.value / (Number(`${a}.${b}`) * scale)).toBeCloseTo(1, 12);
        },
      ),
      { seed: 8, numRuns: 300 },
    );
  });
});
