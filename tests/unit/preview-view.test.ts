// The editor preview shows nothing of another text than the one on screen, except the last good
// result marked stale while an edit is on its way; every count of errors is the one list's length.
import { describe, expect, it } from "vitest";
import { type PreviewInput, previewStatus, previewView } from "@/components/editor/preview-view";
import { solveNetlist } from "@/solver";
import type { SolveSuccess } from "@/solver/types";

const GOOD = `title Divider
Vin: vsource in gnd 1
R1: resistor in out 1k
R2: resistor out gnd 1k
sweep 10Hz to 1kHz log 5 per decade
show volts(out)
`;
const BROKEN = `${GOOD}R3: resistr out gnd 1k\nR4: resistor out\n`;

const good = solveNetlist(GOOD) as SolveSuccess;
const broken = solveNetlist(BROKEN);

function input(over: Partial<PreviewInput>): PreviewInput {
  return {
    text: GOOD,
    answer: null,
    lastGood: null,
    lastComplete: null,
    pending: false,
    failure: null,
    saveErrors: [],
    ...over,
  };
}

describe("previewView", () => {
  it("an emptied editor shows no result, whatever was solved before", () => {
    const view = previewView(
      input({ text: "  \n", answer: { text: GOOD, result: good }, lastGood: { text: GOOD, result: good } }),
    );
    expect(view).toEqual({ kind: "empty" });
    expect(previewStatus(view)).toBe("No result — type a netlist to see its response.");
  });

  it("the answer for the text on screen is shown fresh", () => {
    const view = previewView(
      input({ answer: { text: GOOD, result: good }, lastGood: { text: GOOD, result: good } }),
    );
    expect(view.kind).toBe("result");
    expect(view.kind === "result" && view.stale).toBe(false);
  });

  it("while typing, the last good result is shown marked stale", () => {
    const view = previewView(
      input({
        text: `${GOOD}# note`,
        answer: { text: GOOD, result: good },
        lastGood: { text: GOOD, result: good },
        pending: true,
      }),
    );
    expect(view).toMatchObject({ kind: "result", stale: true });
    expect(previewStatus(view)).toMatch(/before your last edit/);
  });

  it("a netlist with errors shows no plot and one count: the length of the list", () => {
    expect(broken.ok).toBe(false);
    if (broken.ok) return;
    const view = previewView(
      input({
        text: BROKEN,
        answer: { text: BROKEN, result: broken },
        lastGood: { text: GOOD, result: good },
      }),
    );
    expect(view.kind).toBe("errors");
    const n = broken.errors.length;
    expect(n).toBeGreaterThanOrEqual(2);
    expect(previewStatus(view)).toBe(`No result — ${n} errors.`);
  });

  it("errors of a refused save replace the preview's list (and its count)", () => {
    if (broken.ok) throw new Error("expected errors");
    const view = previewView(
      input({ answer: { text: GOOD, result: good }, saveErrors: broken.errors.slice(0, 1) }),
    );
    expect(previewStatus(view)).toBe("No result — 1 error.");
  });

  it("a failed request for the text on screen shows its reason, not an older plot", () => {
    const view = previewView(
      input({
        text: `${GOOD}#x`,
        answer: { text: GOOD, result: good },
        lastGood: { text: GOOD, result: good },
        failure: "the preview failed (HTTP 503).",
      }),
    );
    expect(view).toEqual({ kind: "failed", message: "the preview failed (HTTP 503)." });
  });

  it("the first answer on its way is 'Solving…'", () => {
    expect(previewStatus(previewView(input({ pending: true })))).toBe("Solving…");
  });
});

describe("previewView: the sweep first, the studies after", () => {
  const MC = GOOD.replace("R1: resistor in out 1k", "R1: resistor in out 1k tol=1%").concat(
    "monte-carlo 20\n",
  );
  const sweep = {
    ...(solveNetlist(MC, { nominalOnly: "still solving" }) as SolveSuccess),
    pending: ["monte-carlo" as const],
  };
  const whole = solveNetlist(MC) as SolveSuccess;

  it("the sweep answer is shown fresh; the studies are the last complete ones marked stale, and the status says what is still solving", () => {
    const view = previewView(
      input({
        text: MC,
        answer: { text: MC, result: sweep },
        lastGood: { text: MC, result: sweep },
        lastComplete: { text: GOOD, result: good },
        pending: true,
      }),
    );
    expect(view).toMatchObject({ kind: "result", stale: false, pendingStudies: ["monte-carlo"] });
    if (view.kind !== "result") return;
    expect(view.result).toBe(sweep);
    expect(view.analyses).toEqual({ result: good, stale: true });
    expect(previewStatus(view)).toMatch(
      /^Solved 11 points, 2 nodes, in [\d.]+ ms; still solving the Monte Carlo samples…$/,
    );
  });

  it("the whole answer shows its studies fresh", () => {
    const view = previewView(
      input({
        text: MC,
        answer: { text: MC, result: whole },
        lastGood: { text: MC, result: whole },
        lastComplete: { text: MC, result: whole },
      }),
    );
    expect(view).toMatchObject({
      kind: "result",
      stale: false,
      pendingStudies: [],
      analyses: { result: whole, stale: false },
    });
    expect(previewStatus(view)).toMatch(/ ms\.$/);
  });

  it("when the studies' request fails, the sweep stays and the studies show nothing older", () => {
    const view = previewView(
      input({
        text: MC,
        answer: { text: MC, result: sweep },
        lastGood: { text: MC, result: sweep },
        lastComplete: { text: GOOD, result: good },
        failure: "Previews are busy right now.",
      }),
    );
    expect(view).toMatchObject({ kind: "result", stale: false, analyses: null, pendingStudies: [] });
    expect(previewStatus(view)).toMatch(
      /; the Monte Carlo samples could not be solved: Previews are busy right now\.$/,
    );
  });

  it("while typing, the plot and the studies are the last ones, both marked stale", () => {
    const view = previewView(
      input({
        text: `${MC}# edit`,
        answer: { text: MC, result: whole },
        lastGood: { text: MC, result: whole },
        lastComplete: { text: MC, result: whole },
        pending: true,
      }),
    );
    expect(view).toMatchObject({ kind: "result", stale: true, analyses: { result: whole, stale: true } });
  });
});
