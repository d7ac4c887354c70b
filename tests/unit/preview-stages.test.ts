// The sweep-first preview: which studies a preview leaves to its second answer (lib/jobs.ts
// previewPlan), their words, and the whole answer keeping the first answer's arrays when its sweep is
// the same number for number (so the plot is not redrawn when the studies arrive).
import { describe, expect, it } from "vitest";
import { previewPlan } from "@/lib/jobs";
import { keepSweepOf, studiesInWords } from "@/lib/preview-stages";
import { solveNetlist } from "@/solver";
import type { SolveSuccess } from "@/solver/types";

const RC = `title RC
V1: vsource in gnd 1
R1: resistor in out 10k tol=1%
C1: capacitor out gnd 10n tol=5%
sweep 100Hz to 10kHz log 20 per decade
show h = volts(out) / volts(in)
measure fc = crossing(h, half-power)
`;

function solved(text: string, options = {}): SolveSuccess {
  const r = solveNetlist(text, options);
  if (!r.ok) throw new Error(r.errors[0]!.message);
  return r;
}

describe("previewPlan", () => {
  it("names the studies the preview solves beyond the sweep, in the netlist's own words", () => {
    expect(previewPlan(RC, 1000)).toEqual({ options: { maxPoints: 1000 }, studies: [] });
    const mc = previewPlan(`${RC}monte-carlo 50\n`, 1000);
    expect(mc).toEqual({ options: { maxPoints: 1000 }, studies: ["monte-carlo"] });
    const both = previewPlan(`${RC}monte-carlo 50\nsensitivity fc\nvary R1 over 1k, 2k\n`, 1000);
    expect(both.studies).toEqual(["vary", "monte-carlo", "sensitivity"]);
  });

  it("over the budget the preview is the nominal sweep anyway: nothing is left to follow", () => {
    // 41 points × (1 + 5000 samples) is over MAX_INLINE_WORK and the inline sample limit.
    const plan = previewPlan(`${RC}monte-carlo 5000\n`, 1000);
    expect(plan.studies).toEqual([]);
    expect(plan.options.nominalOnly).toContain("monte-carlo 5000 samples");
  });

  it("a netlist with errors plans nothing", () => {
    expect(previewPlan("R1: resistor in\n", 1000)).toEqual({ options: { maxPoints: 1000 }, studies: [] });
  });
});

describe("studiesInWords", () => {
  it("joins the studies' names", () => {
    expect(studiesInWords(["monte-carlo"])).toBe("the Monte Carlo samples");
    expect(studiesInWords(["vary", "monte-carlo", "steady"])).toBe(
      "the vary family, the Monte Carlo samples and the steady oscillation",
    );
  });
});

describe("keepSweepOf", () => {
  const text = `${RC}monte-carlo 30 seed=2\n`;
  const first = solved(text, { nominalOnly: "still solving" });
  const whole = solved(text);

  it("keeps the first answer's frequency and trace arrays when the sweep is the same", () => {
    expect(whole.traces).not.toBe(first.traces);
    const kept = keepSweepOf(first, whole);
    expect(kept.frequencies).toBe(first.frequencies);
    expect(kept.traces).toBe(first.traces);
    // Everything else is the whole answer's: the samples, and its own stats.
    expect(kept.monteCarlo).toBe(whole.monteCarlo);
    expect(kept.monteCarlo?.samples).toBe(30);
    expect(kept.stats).toBe(whole.stats);
  });

  it("takes the whole answer's arrays when any number differs", () => {
    const other = solved(text.replace("10n tol", "12n tol"));
    const kept = keepSweepOf(first, other);
    expect(kept).toBe(other);
    expect(kept.traces[0]!.magnitudeDb).not.toEqual(first.traces[0]!.magnitudeDb);
    const shorter = solved(text.replace("20 per decade", "10 per decade"));
    expect(keepSweepOf(first, shorter).frequencies).toHaveLength(21);
  });
});
