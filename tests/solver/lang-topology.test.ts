import { describe, expect, it } from "vitest";
import { compile } from "@/solver/lang";
import { didYouMean, editDistance, nearest } from "@/solver/lang/hints";
import { circuitOf, errorsOf } from "./lang-helpers";

describe("structure warnings", () => {
  it("a node touching only one part names node and part", () => {
    const r = compile("V1: vsource in gnd 1\nR1: resistor in out 1k\nR2: resistor in gnd 1k\n");
    expect(r.ok).toBe(true);
    expect(r.warnings).toEqual([
      { line: 2, message: "node out connects only to R1: that terminal is left open" },
    ]);
  });

  it("a part with every terminal on one node", () => {
    const r = compile("V1: vsource in gnd 1\nR1: resistor in gnd 1k\nC1: capacitor in in 1n\n");
    expect(r.warnings).toContainEqual({
      line: 3,
      message: "every terminal of C1 is on node in, so it does nothing",
    });
  });

  it("the loop cut warns when no ideal voltage output drives the node, and not otherwise", () => {
    const passive = compile(
      "V1: vsource in gnd 1\nR1: resistor in a 1k\nR2: resistor a gnd 1k\nloop T cut a before R2\n",
    );
    expect(passive.warnings).toEqual([
      { line: 4, message: expect.stringMatching(/^loop T: node a is not driven by an ideal voltage output/) },
    ]);
    const driven = compile(
      "V1: vsource in gnd 1\nU1: opamp in n o\nR1: resistor o n 1k\nR2: resistor n gnd 1k\nloop T cut o before R1\n",
    );
    expect(driven.ok && driven.warnings).toEqual([]);
    const withRout = compile(
      "V1: vsource in gnd 1\nU1: opamp in n o rout=50\nR1: resistor o n 1k\nR2: resistor n gnd 1k\nloop T cut o before R1\n",
    );
    expect(withRout.warnings).toHaveLength(1);
  });

  it("monte-carlo with no toleranced part", () => {
    const r = compile("V1: vsource in gnd 1\nR1: resistor in gnd 1k\nmonte-carlo 10\n");
    expect(r.warnings).toEqual([
      { line: 3, message: "monte-carlo: no part has a tolerance (tol=…), so every sample is the same" },
    ]);
  });
});

describe("structure errors", () => {
  it("parts that each fix a voltage around one loop are named", () => {
    expect(errorsOf("V1: vsource a gnd 1\nV2: vsource a gnd 2\nR1: resistor a gnd 1k\n")).toEqual([
      {
        line: 2,
        column: 1,
        endColumn: 20,
        message: "V1, V2 each fix a voltage around one closed loop, so their voltages can't all hold",
        hint: "put a resistor in the loop or remove one of these parts",
      },
    ]);
    const three = errorsOf(
      "V1: vsource a gnd 1\nBuf: vcvs b a c gnd 2\nR1: resistor c gnd 1k\nZt: ccvs b gnd V1 5\n",
    );
    // Named in the order met walking the loop from Zt's p terminal: b → a (Buf) → gnd (V1) → b (Zt).
    expect(three[0]!.message).toBe(
      "Buf, V1, Zt each fix a voltage around one closed loop, so their voltages can't all hold",
    );
    expect(three[0]!.line).toBe(4);
    const outputs = errorsOf(
      "V1: vsource a gnd 1\nU1: opamp a n o\nU2: opamp a n o\nR1: resistor o n 1k\nR2: resistor n gnd 1k\n",
    );
    expect(outputs[0]).toMatchObject({
      line: 3,
      message: "U1, U2 each fix a voltage around one closed loop, so their voltages can't all hold",
    });
    expect(errorsOf("V1: vsource a a 1\nR1: resistor a gnd 1k\n")[0]!.message).toBe(
      "V1 fixes the voltage between a node and itself (both ends on a)",
    );
  });

  it("an opamp output with rout does not fix a voltage", () => {
    circuitOf("V1: vsource a gnd 1\nU1: opamp a n a rout=10\nR2: resistor n gnd 1k\nR3: resistor n a 1k\n");
  });

  it("nothing on gnd, with a hint for a look-alike name", () => {
    expect(errorsOf("V1: vsource a b 1\nR1: resistor a b 1k\n")).toEqual([
      {
        line: 1,
        column: 1,
        endColumn: 18,
        message: "nothing connects to gnd, so no voltage has a reference",
        hint: "connect the circuit's reference node to gnd",
      },
    ]);
    expect(errorsOf("V1: vsource a GND 1\nR1: resistor a GND 1k\n")[0]!.hint).toBe(
      "ground is `gnd`, not GND",
    );
  });

  it("nodes with no conducting path to gnd; current sources and sensing inputs don't conduct", () => {
    expect(
      errorsOf(
        "V1: vsource a gnd 1\nR1: resistor a gnd 1k\nR2: resistor x y 1k\nI1: isource x gnd 1m\nR3: resistor y x 1k\n",
      ),
    ).toEqual([
      {
        line: 3,
        column: 1,
        endColumn: 20,
        message: "nodes `x`, `y` have no path to gnd",
        hint: expect.stringContaining("current sources and sensing inputs don't count"),
      },
    ]);
    const sensing = errorsOf(
      "V1: vsource a gnd 1\nR1: resistor a gnd 1k\nBuf: vcvs o gnd s gnd 2\nRo: resistor o gnd 1k\nI1: isource s gnd 1m\n",
    );
    expect(sensing[0]!.message).toBe("node `s` has no path to gnd");
  });

  it("0 is ground too", () => {
    const c = circuitOf("V1: vsource a gnd 1\nR1: resistor a gnd 1k\nshow volts(a, gnd)\n");
    expect(c.parts[0]!.nodes).toEqual(["a", "gnd"]);
    expect(c.nodes).toEqual(["a"]);
    expect(c.shows[0]!.probe).toEqual({ op: "v", node: "a", ref: "gnd" });
  });

  it("an empty netlist", () => {
    expect(errorsOf("# nothing here\n")).toEqual([
      {
        line: 1,
        column: 1,
        endColumn: 2,
        message: "the netlist has no parts",
        hint: "add parts such as `R1: resistor in out 10k`",
      },
    ]);
  });
});

describe("did-you-mean", () => {
  it("edit distance counts a swap of neighbours as one edit", () => {
    expect(editDistance("gian", "gain")).toBe(1);
    expect(editDistance("kitten", "sitting")).toBe(3); // textbook example: common practice
    expect(editDistance("", "abc")).toBe(3);
  });

  it("suggests only close candidates; a case-only difference always qualifies", () => {
    expect(nearest("Gnd", ["gnd", "out"])).toBe("gnd");
    expect(nearest("xyz", ["gnd", "out"])).toBeNull();
    expect(didYouMean("captor", ["capacitor", "resistor"])).toBeUndefined();
    expect(didYouMean("capacitr", ["capacitor", "resistor"])).toBe("did you mean `capacitor`?");
  });
});
