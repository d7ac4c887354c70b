import { describe, expect, it } from "vitest";
import { collectNames, completionContext, hoverDoc, MEASURE_FNS, PART_KINDS } from "@/lib/netlist-language";

// The invented test-tone generator of NETLIST.md, shortened.
const NETLIST = [
  "title Test-tone generator",
  "let R = 16k",
  "Rs: resistor  amp_out mid   R",
  "Cs: capacitor mid     pos   10n   # series arm",
  "U1: opamp     pos     neg   amp_out gbw=1M",
  "Zt: ccvs      sense_o gnd   Vx 1k",
  "preset fastamp = opamp gbw=10M",
  "show  bridge = volts(pos) / volts(amp_out)",
  "show volts(mid)",
  "loop  T cut amp_out before Rs",
  "measure f0   = zero-phase(bridge)",
  "check f0 between 950Hz and 1.05kHz",
].join("\n");

describe("collectNames", () => {
  it("finds parts, nodes, lets, traces, measures and presets", () => {
    const n = collectNames(NETLIST);
    expect(n.parts).toEqual(["Rs", "Cs", "U1", "Zt"]);
    // ccvs has two node terminals, then its sense part: Vx is not a node.
    expect(n.nodes).toEqual(["gnd", "amp_out", "mid", "pos", "neg", "sense_o"]);
    expect(n.lets).toEqual(["R"]);
    expect(n.traces).toEqual(["bridge", "volts(mid)", "T"]);
    expect(n.measures).toEqual(["f0"]);
    expect(n.presets).toEqual(["fastamp"]);
  });
});

describe("completionContext", () => {
  it("tells what fits where the cursor is", () => {
    expect(completionContext("")).toBe("statement");
    expect(completionContext("  mea")).toBe("statement");
    expect(completionContext("R1: ")).toBe("kind");
    expect(completionContext("R1: capa")).toBe("kind");
    expect(completionContext("show x = volts(")).toBe("node");
    expect(completionContext("show x = amps(R")).toBe("part");
    expect(completionContext("loop T cut amp_out before ")).toBe("part");
    expect(completionContext("loop T cut ")).toBe("node");
    expect(completionContext("measure f0 = ")).toBe("function");
    expect(completionContext("measure f0 = zero-ph")).toBe("function");
    expect(completionContext("measure f0 = peak(")).toBe("trace");
    expect(completionContext("measure g = mag(T) at ")).toBe("measure");
    expect(completionContext("check ")).toBe("measure");
    expect(completionContext("R1: resistor a b 10k ")).toBe("option");
    // After a loop's parts: its option, then the option's values.
    expect(completionContext("loop T cut amp_out before Rs ")).toBe("loop-option");
    expect(completionContext("loop T cut amp_out before Rs, Rf me")).toBe("loop-option");
    expect(completionContext("loop T cut amp_out before Rs, ")).toBe("part");
    expect(completionContext("loop T cut amp_out before Rs method=")).toBe("loop-method");
    expect(completionContext("loop T cut amp_out before Rs method=inj")).toBe("loop-method");
  });
});

describe("hoverDoc", () => {
  it("documents every kind and measure function, and options", () => {
    for (const k of PART_KINDS) expect(hoverDoc(k)).toContain(`**${k}** (part kind)`);
    for (const f of MEASURE_FNS) expect(hoverDoc(f)).toContain(`\`${f}(`);
    expect(hoverDoc("opamp")).toContain("Terminals: in+ in- out");
    expect(hoverDoc("gbw")).toContain("Gain-bandwidth");
    expect(hoverDoc("sweep")).toContain("per decade");
    expect(hoverDoc("amp_out")).toBeNull();
    expect(hoverDoc("method")).toContain("`method=injection`");
    expect(hoverDoc("injection")).toContain("(loop method)");
  });
});
