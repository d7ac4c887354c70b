import { describe, expect, it } from "vitest";
import { compile } from "@/solver/lang";
import { circuitOf, errorsOf } from "./lang-helpers";

const STAGE = `block stage(in, out) gain=2 rbase=Rb
  let Rtop = rbase*(gain-1)
  Ra:  resistor in  mid rbase
  Rb2: resistor mid out Rtop
  U:   opamp    in2 mid out
  Rin: resistor in  in2 1k
end
`;

describe("blocks", () => {
  it("flattens instances with dotted names, maps terminals, keeps gnd global", () => {
    const c = circuitOf(`let Rb = 10k\n${STAGE}Vin: vsource a gnd 1\nX1: stage a b\nRl: resistor b gnd 1k\n`);
    const byName = Object.fromEntries(c.parts.map((p) => [p.name, p]));
    expect(Object.keys(byName)).toEqual(["Vin", "X1.Ra", "X1.Rb2", "X1.U", "X1.Rin", "Rl"]);
    expect(byName["X1.Ra"]).toMatchObject({ nodes: ["a", "X1.mid"], value: 10_000 });
    expect(byName["X1.Rb2"]).toMatchObject({ nodes: ["X1.mid", "b"], value: 10_000 });
    expect(byName["X1.U"]!.nodes).toEqual(["X1.in2", "X1.mid", "b"]);
    // The part's place is its line inside the block.
    expect(byName["X1.Ra"]!.span.line).toBe(4);
  });

  it("parameters: defaults, instance values (numbers, lets, expressions), local lets", () => {
    const c = circuitOf(
      `let Rb = 10k\nlet G = 5\n${STAGE}Vin: vsource a gnd 1\nX1: stage a b gain=3\nX2: stage b c gain=G rbase=(2*Rb)\nX3: stage c d\nRl: resistor d gnd 1k\n`,
    );
    const v = (n: string) => c.parts.find((p) => p.name === n)!.value;
    expect([v("X1.Rb2"), v("X2.Ra"), v("X2.Rb2"), v("X3.Rb2")]).toEqual([20_000, 20_000, 80_000, 10_000]);
  });

  it("nests blocks, names nodes through every level, and accepts a terminal's dotted name as its node", () => {
    const c = circuitOf(
      `let Rb = 10k\n${STAGE}block pair(x, y)\n  S1: stage x m gain=3\n  S2: stage m y\nend\nVin: vsource a gnd 1\nP: pair a b\nRl: resistor b gnd 1k\nshow mid = volts(P.m)\nshow same = volts(P.S1.out)\nshow deep = volts(P.S2.mid)\nloop T cut P.m before P.S2.Ra\n`,
    );
    expect(c.parts.map((p) => p.name)).toContain("P.S2.Rin");
    expect(c.shows.map((s) => s.probe)).toEqual([
      { op: "v", node: "P.m" },
      { op: "v", node: "P.m" },
      { op: "v", node: "P.S2.mid" },
    ]);
    expect(c.loops[0]).toMatchObject({ node: "P.m", before: ["P.S2.Ra"] });
    expect(c.nodes).toEqual(["a", "P.S1.mid", "P.m", "P.S1.in2", "P.S2.mid", "b", "P.S2.in2"]);
  });

  it("a block used before its definition", () => {
    const c = circuitOf(`V1: vsource a gnd 1\nX1: load a\nblock load(p)\n  R: resistor p gnd 1k\nend\n`);
    expect(c.parts[1]).toMatchObject({ name: "X1.R", nodes: ["a", "gnd"] });
  });

  it("errors: unknown parameter, wrong terminal count, self-use, depth, structure", () => {
    const base = `let Rb = 10k\n${STAGE}V1: vsource a gnd 1\nRl: resistor b gnd 1k\n`;
    expect(errorsOf(`${base}X1: stage a b gian=3\n`)).toEqual([
      {
        line: 11,
        column: 15,
        endColumn: 19,
        message: "block `stage` has no parameter `gian`",
        hint: "did you mean `gain`?",
      },
    ]);
    expect(errorsOf(`${base}X1: stage a\n`)[0]).toMatchObject({
      line: 11,
      message: "stage connects 2 nodes, found 1",
    });
    const self = errorsOf("block loopy(a)\n  X: loopy a\nend\nV1: vsource n gnd 1\nY: loopy n\n");
    expect(self[0]).toMatchObject({
      line: 2,
      column: 6,
      endColumn: 11,
      message: "block `loopy` uses itself",
      hint: "loopy → loopy",
    });
    expect(errorsOf("block a(x)\n  R: resistor x gnd 1k\n")[0]).toMatchObject({
      line: 1,
      column: 7,
      message: "block `a` has no `end`",
    });
    expect(errorsOf("end\nV1: vsource n gnd 1\nR: resistor n gnd 1\n")[0]).toMatchObject({
      line: 1,
      column: 1,
      message: "`end` without a `block` to close",
    });
    expect(errorsOf("block a(x)\n  sweep at 1k\nend\n")[0]).toMatchObject({
      line: 2,
      column: 3,
      message: "only parts and lets go inside a block",
    });
    expect(errorsOf("block a(x)\n block b(y)\nend\n")[0]).toMatchObject({
      line: 2,
      column: 2,
      message: "block `a` is still open",
    });
    expect(errorsOf("block a(gnd)\nend\n")[0]).toMatchObject({
      line: 1,
      column: 9,
      message: "`gnd` is global and can't be a block terminal",
    });
  });

  it("instances nest at most 16 deep (NETLIST.md)", () => {
    const chain = (levels: number) => {
      let text = "block b0(x)\n  R: resistor x gnd 1k\nend\n";
      for (let i = 1; i < levels; i++) text += `block b${i}(x)\n  X: b${i - 1} x\nend\n`;
      return `${text}V1: vsource n gnd 1\nTop: b${levels - 1} n\n`;
    };
    const ok = circuitOf(chain(16));
    expect(ok.parts[1]!.name).toBe(`Top.${"X.".repeat(15)}R`);
    const errors = errorsOf(chain(17));
    expect(errors[0]!.message).toBe("blocks are nested more than 16 deep here");
  });

  it("a block's body errors are reported once, however many instances", () => {
    const errors = errorsOf("block b(x)\n  R: resistor x gnd Rq\nend\nV1: vsource n gnd 1\nA: b n\nB: b n\n");
    expect(errors).toEqual([{ line: 2, column: 21, endColumn: 23, message: "unknown name `Rq`" }]);
  });

  it("an unused block is a warning", () => {
    const r = compile(
      "block spare(x)\n  R: resistor x gnd 1k\nend\nV1: vsource n gnd 1\nR1: resistor n gnd 1k\n",
    );
    expect(r.ok).toBe(true);
    expect(r.warnings).toContainEqual({ line: 1, message: "block `spare` is defined but never used" });
  });
});

describe("presets", () => {
  it("apply their options; options on the line win", () => {
    const c = circuitOf(
      "preset fastamp = opamp gbw=10M gain=1e5\npreset precise = resistor tol=0.1%\nV1: vsource in gnd 1\nU1: fastamp in n o\nU2: fastamp in n2 o2 gbw=1M rout=50\nR1: precise n o 9k\nR2: precise n gnd 1k tol=5%\nR3: resistor n2 o2 1k\nR4: resistor n2 gnd 1k\n",
    );
    const byName = Object.fromEntries(c.parts.map((p) => [p.name, p]));
    expect(byName.U1).toMatchObject({ kind: "opamp", opamp: { gbw: 1e7, gain: 1e5 } });
    expect(byName.U2!.opamp).toEqual({ gbw: 1e6, gain: 1e5, rout: 50 });
    expect(byName.R1).toMatchObject({ kind: "resistor", value: 9000, tol: 0.001 });
    expect(byName.R2!.tol).toBe(0.05);
  });

  it("a preset may be used before it is defined, inside a block too", () => {
    const c = circuitOf(
      "block buf(i, o)\n  U: quick i o o\nend\nV1: vsource a gnd 1\nB: buf a b\nRl: resistor b gnd 1k\npreset quick = opamp gbw=5M\n",
    );
    expect(c.parts[1]).toMatchObject({ name: "B.U", opamp: { gbw: 5e6 } });
  });

  it("errors: unknown base kind, positional entries, options the kind lacks, names clashing", () => {
    expect(errorsOf("preset p = opmap gbw=1M\n")[0]).toMatchObject({
      column: 12,
      hint: "did you mean `opamp`?",
    });
    expect(errorsOf("preset p = resistor 1k\n")[0]).toMatchObject({
      column: 21,
      message: "a preset holds options only, written key=value",
    });
    expect(errorsOf("preset p = resistor gbw=1M\n")[0]).toMatchObject({
      column: 21,
      message: "unknown option `gbw`",
      hint: "options here: tol",
    });
    expect(errorsOf("preset resistor = opamp gbw=1M\n")[0]).toMatchObject({
      column: 8,
      message: "`resistor` is already a part kind",
    });
    expect(errorsOf("preset p = opamp gbw=1M\npreset p = opamp gbw=2M\n")[0]).toMatchObject({
      line: 2,
      column: 8,
      message: "preset `p` is already defined on line 1",
    });
  });
});
