import { describe, expect, it } from "vitest";
import { compile, parse } from "@/solver/lang";
import { circuitOf, DIVIDER, errorsOf } from "./lang-helpers";

describe("title and let", () => {
  it("reads the rest of a title line verbatim: %, apostrophes, quotes, numbers; \\# is a literal #", () => {
    const title = (text: string) => circuitOf(`${text}\n${DIVIDER}`).title;
    expect(title(`title Op-amp's 1% "bench" 2*3 = 6; v(x) 0 — ok`)).toBe(
      `Op-amp's 1% "bench" 2*3 = 6; v(x) 0 — ok`,
    );
    expect(title("title Rev \\#3 bench # a comment")).toBe("Rev #3 bench");
    expect(title("title Long \\\n   continued")).toBe("Long continued");
    expect(title("\ttitle\tTabbed")).toBe("Tabbed");
    expect(errorsOf("title   # only a comment\n")[0]).toMatchObject({
      line: 1,
      message: "the title is missing",
    });
  });

  it("keeps the title as written and evaluates lets with prefixes, functions and earlier or later lets", () => {
    const c = circuitOf(
      `title  Bench sweep source,   1 kHz   # note\nlet f = 1/(2*pi*R*C)\nlet R = 16k\nlet C = 10n\nlet K = 1 + Rf/Rg\nlet Rf = 24k\nlet Rg = 11k\nlet w = sqrt(4) * log10(1k) + exp(0) - 2^3\nlet s = snap(E24, 9.6k)\n${DIVIDER}R2: resistor out gnd (s*K)\nR3: resistor out gnd (f)\nR4: resistor out gnd (w + 10)\n`,
    );
    expect(c.title).toBe("Bench sweep source,   1 kHz");
    const [, , , r2, r3, r4] = c.parts;
    // 1/(2π·16k·10n) = 994.7183 Hz (NETLIST.md example comment: 994.7 Hz).
    expect(r3!.value).toBeCloseTo(994.71836, 4);
    // snap(E24, 9.6k) = 10k (IEC 60063 E24 list, CHECKS.md §9); K = 1 + 24/11.
    expect(r2!.value).toBeCloseTo(10_000 * (1 + 24 / 11), 9);
    expect(r4!.value).toBe(2 * 3 + 1 - 8 + 10);
  });

  it("lets accept units (ignored) and percent", () => {
    const c = circuitOf(`let C = 10nF\nlet t = 5%\n${DIVIDER}C2: capacitor out gnd C tol=t\n`);
    expect(c.parts[3]).toMatchObject({ value: 1e-8, tol: 0.05 });
  });
});

describe("parts", () => {
  it("reads every kind with its terminals, values and options", () => {
    const c = circuitOf(
      [
        "Vin: vsource in gnd 2 phase=30",
        "Iin: isource gnd in 1m",
        "R1: resistor in a 1k tol=1%",
        "C1: capacitor a gnd 1n",
        "L1: inductor a b 1m tol=10%",
        "Vs: vsource b gnd 0",
        "Buf: vcvs c gnd a gnd 10",
        "Gm: vccs c gnd a b 2m",
        "Zt: ccvs d gnd Vs 1k",
        "Mir: cccs d gnd L1 3",
        "U1: opamp a c e",
        "U2: opamp a c f gbw=1M",
        "Rl: resistor e f 1k",
      ].join("\n"),
    );
    const byName = Object.fromEntries(c.parts.map((p) => [p.name, p]));
    expect(byName.Vin).toMatchObject({ kind: "vsource", nodes: ["in", "gnd"], value: 2, phaseDeg: 30 });
    expect(byName.Iin).toMatchObject({ kind: "isource", nodes: ["gnd", "in"], value: 0.001 });
    expect(byName.R1).toMatchObject({ kind: "resistor", nodes: ["in", "a"], value: 1000, tol: 0.01 });
    expect(byName.L1).toMatchObject({ kind: "inductor", value: 0.001, tol: 0.1 });
    expect(byName.Buf).toMatchObject({ kind: "vcvs", nodes: ["c", "gnd", "a", "gnd"], value: 10 });
    expect(byName.Gm).toMatchObject({ kind: "vccs", nodes: ["c", "gnd", "a", "b"], value: 0.002 });
    expect(byName.Zt).toMatchObject({ kind: "ccvs", nodes: ["d", "gnd"], value: 1000, sense: "Vs" });
    expect(byName.Mir).toMatchObject({ kind: "cccs", nodes: ["d", "gnd"], value: 3, sense: "L1" });
    expect(byName.U1).toMatchObject({ kind: "opamp", nodes: ["a", "c", "e"], value: 0 });
    expect(byName.U1!.opamp).toBeUndefined();
    expect(byName.U2!.opamp).toEqual({ gbw: 1e6 });
    expect(c.nodes).toEqual(["in", "a", "b", "c", "d", "e", "f"]);
    expect(byName.R1!.span).toEqual({ line: 3, column: 1, endColumn: 28 });
  });

  it("sources default to an amplitude of 1", () => {
    const c = circuitOf("V1: vsource a gnd\nR1: resistor a gnd 1k\n");
    expect(c.parts[0]!.value).toBe(1);
  });

  it("IEC codes and let names in value places; a let named like an R-code wins", () => {
    const c = circuitOf(
      "let R10 = 5k\nV1: vsource a gnd\nR1: resistor a b R47\nR2: resistor b gnd R10\nR3: resistor b gnd 2R2\n",
    );
    expect(c.parts.map((p) => p.value)).toEqual([1, 0.47, 5000, 2.2]);
  });
});

describe("sweeps", () => {
  it("log, linear and list forms", () => {
    expect(circuitOf(`${DIVIDER}sweep 10Hz to 1MHz log 100 per decade\n`).sweep).toEqual({
      kind: "log",
      start: 10,
      stop: 1e6,
      perDecade: 100,
    });
    expect(circuitOf(`${DIVIDER}sweep 1kHz to 20kHz linear 500 points\n`).sweep).toEqual({
      kind: "linear",
      start: 1000,
      stop: 20_000,
      points: 500,
    });
    const list = circuitOf(`${DIVIDER}sweep at 10kHz, 50Hz, 1k, 50\n`);
    expect(list.sweep).toEqual({ kind: "list", points: [50, 1000, 10_000] });
    expect(list.defaultSweep).toBe(false);
  });

  it("defaults to 10 Hz … 10 MHz at 100 per decade (NETLIST.md)", () => {
    const c = circuitOf(DIVIDER);
    expect(c.sweep).toEqual({ kind: "log", start: 10, stop: 10e6, perDecade: 100 });
    expect(c.defaultSweep).toBe(true);
  });

  it("a sweep continued over two lines", () => {
    expect(circuitOf(`${DIVIDER}sweep 10Hz to 1MHz \\\n   log 20 per decade\n`).sweep).toMatchObject({
      perDecade: 20,
    });
  });
});

describe("show, loop, measure, check", () => {
  const text = `${DIVIDER}U1: opamp out fb o2\nRf: resistor o2 fb 10k\nRg: resistor fb gnd 10k
show H = volts(out) / volts(in)
show volts(in, out) * 2 - -1
show Z = volts(in) / amps(Vin)
loop T cut o2 before Rf
measure f0 = zero-phase(H)
measure fc = crossing(H, -3dB)
measure fm = crossing(H, 0.5)
measure fp = crossing(H, -45deg)
measure fh = crossing(H, half-power)
measure pk = peak(H)
measure dp = dip(H)
measure bw = bandwidth(H)
measure bw6 = bandwidth(H, -6dB)
measure qq = q(H)
measure u = unity(T)
measure pm = phase-margin(T)
measure gm = gain-margin(T)
measure m1 = mag(H) at 1kHz
measure d1 = db(H) at fc
measure p1 = phase(T) at 2k
check pm > 45deg
check gm >= 6dB
check fc between 1.5kHz and 1.7kHz
check qq < 0.8
check d1 <= -3
`;

  it("reads traces and probes into trees", () => {
    const c = circuitOf(text);
    expect(c.shows.map((s) => s.name)).toEqual(["H", "volts(in, out) * 2 - -1", "Z"]);
    expect(c.shows[0]!.probe).toEqual({
      op: "/",
      left: { op: "v", node: "out" },
      right: { op: "v", node: "in" },
    });
    expect(c.shows[1]!.probe).toEqual({
      op: "-",
      left: { op: "*", left: { op: "v", node: "in", ref: "out" }, right: { op: "num", value: 2 } },
      right: { op: "neg", arg: { op: "num", value: 1 } },
    });
    expect(c.shows[2]!.probe).toEqual({
      op: "/",
      left: { op: "v", node: "in" },
      right: { op: "i", part: "Vin" },
    });
    expect(c.loops).toEqual([
      { name: "T", node: "o2", before: ["Rf"], span: { line: 10, column: 1, endColumn: 24 } },
    ]);
  });

  it("reads every measure function, level and `at`", () => {
    const c = circuitOf(text);
    const m = Object.fromEntries(c.measures.map((x) => [x.name, x]));
    expect(m.f0).toMatchObject({ fn: "zero-phase", target: "H" });
    expect(m.fc!.level).toEqual({ kind: "db", value: -3 });
    expect(m.fm!.level).toEqual({ kind: "mag", value: 0.5 });
    expect(m.fp!.level).toEqual({ kind: "deg", value: -45 });
    expect(m.fh!.level).toEqual({ kind: "half-power" });
    expect(m.bw!.level).toBeUndefined();
    expect(m.bw6!.level).toEqual({ kind: "db", value: -6 });
    expect(c.measures.map((x) => x.fn)).toEqual([
      "zero-phase",
      "crossing",
      "crossing",
      "crossing",
      "crossing",
      "peak",
      "dip",
      "bandwidth",
      "bandwidth",
      "q",
      "unity",
      "phase-margin",
      "gain-margin",
      "mag",
      "db",
      "phase",
    ]);
    expect(m.m1!.at).toEqual({ hz: 1000 });
    expect(m.d1!.at).toEqual({ measure: "fc" });
    expect(m.p1).toMatchObject({ target: "T", at: { hz: 2000 } });
  });

  it("reads checks with every operator", () => {
    const c = circuitOf(text);
    expect(c.checks.map(({ span: _s, ...rest }) => rest)).toEqual([
      { measure: "pm", op: ">", value: 45, expression: "pm > 45deg" },
      { measure: "gm", op: ">=", value: 6, expression: "gm >= 6dB" },
      { measure: "fc", op: "between", value: 1500, value2: 1700, expression: "fc between 1.5kHz and 1.7kHz" },
      { measure: "qq", op: "<", value: 0.8, expression: "qq < 0.8" },
      { measure: "d1", op: "<=", value: -3, expression: "d1 <= -3" },
    ]);
  });
});

describe("loop cuts", () => {
  it("move several parts, listed with or without blanks after the commas", () => {
    const text =
      "V1: vsource in gnd 1\nU1: opamp in n o\nRa: resistor o n 1k\nRb: resistor o x 1k\nRc: resistor x gnd 1k\nRg: resistor n gnd 1k\n";
    expect(circuitOf(`${text}loop T cut o before Ra, Rb\n`).loops[0]!.before).toEqual(["Ra", "Rb"]);
    expect(circuitOf(`${text}loop T cut o before Ra,Rb\n`).loops[0]!.before).toEqual(["Ra", "Rb"]);
  });
});

describe("analyses beyond one sweep", () => {
  it("vary over a list of part values, with the part's unit", () => {
    const c = circuitOf(`${DIVIDER}vary R1 over 1k, 2.2kΩ, 4k7\n`);
    expect(c.vary).toMatchObject({ target: "R1", targetKind: "part", values: [1000, 2200, 4700] });
  });

  it("vary a let over a log range, both ends included", () => {
    const c = circuitOf(`let C = 10n\n${DIVIDER.replace("10n", "C")}vary C from 1n to 100n log 3 points\n`);
    expect(c.vary).toMatchObject({ target: "C", targetKind: "let" });
    expect(c.vary!.values).toEqual([1e-9, 1e-8, 1e-7]);
  });

  it("vary over a linear range", () => {
    expect(circuitOf(`${DIVIDER}vary R1 from 1k to 2k linear 5 points\n`).vary!.values).toEqual([
      1000, 1250, 1500, 1750, 2000,
    ]);
  });

  it("monte-carlo with and without options, poles, sensitivity", () => {
    const a = circuitOf(
      `${DIVIDER.replace("10k", "10k tol=1%")}monte-carlo 500 seed=7 dist=normal\npoles\nshow H = volts(out)\nmeasure fc = crossing(H, -3dB)\nsensitivity fc\n`,
    );
    expect(a.monteCarlo).toEqual({
      samples: 500,
      seed: 7,
      dist: "normal",
      span: { line: 4, column: 1, endColumn: 35 },
    });
    expect(a.poles).toBe(true);
    expect(a.sensitivity).toEqual([{ measure: "fc", span: { line: 8, column: 1, endColumn: 15 } }]);
    const b = circuitOf(`${DIVIDER.replace("10k", "10k tol=1%")}monte-carlo 20\n`);
    expect(b.monteCarlo).toMatchObject({ samples: 20, seed: 1, dist: "uniform" });
    expect(b.poles).toBe(false);
    expect(b.vary).toBeNull();
  });
});

describe("overrides", () => {
  it("replace a let's value and a part's value", () => {
    const text = `let R = 10k\nVin: vsource in gnd 1\nR1: resistor in out R\nR2: resistor out gnd R\n`;
    const c = circuitOf(text, { lets: { R: 22_000 }, parts: { R2: 1000 } });
    expect(c.parts.map((p) => p.value)).toEqual([1, 22_000, 1000]);
  });

  it("compiling the same text again gives independent results (the parse is reused, errors do not pile up)", () => {
    const text = "let R = 10k\nVin: vsource in gnd 1\nR1: resistor in gnd R\n";
    expect(circuitOf(text, { lets: { R: 1 } }).parts[1]!.value).toBe(1);
    expect(circuitOf(text).parts[1]!.value).toBe(10_000);
    const bad = "R1: resistr a gnd 1k\n";
    const first = compile(bad);
    const second = compile(bad);
    expect(!first.ok && !second.ok && second.errors).toEqual(!first.ok && first.errors);
    expect(!second.ok && second.errors).toHaveLength(1);
  });

  it("an unknown override name is an error", () => {
    const r = compile(DIVIDER, { lets: { nope: 1 } });
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.errors[0]).toMatchObject({ line: 1, column: 1, message: "no let named `nope` to replace" });
  });
});

describe("parse", () => {
  it("returns the statements for the editor", () => {
    const { tree, errors } = parse(
      `title T\nlet R = 1k\n${DIVIDER}block b(x)\n  R: resistor x gnd 1k\nend\n`,
    );
    expect(errors).toEqual([]);
    expect(tree.statements.map((s) => s.type)).toEqual(["title", "let", "part", "part", "part", "block"]);
  });
});
