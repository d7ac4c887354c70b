/** When a run goes to the job queue (lib/jobs.ts) — pure, no database. */
import { describe, expect, it } from "vitest";
import { shouldQueue, solveWork } from "@/lib/jobs";
import { MAX_INLINE_WORK, MAX_MC_INLINE_SAMPLES } from "@/lib/limits";
import { compile } from "@/solver";

const net = (extra: string, sweep = "sweep 100Hz to 20kHz linear 400 points") => `
V1: vsource   in  gnd 1
R1: resistor  in  out 10k tol=1%
C1: capacitor out gnd 10n
${sweep}
show H = volts(out) / volts(in)
measure fc = crossing(H, half-power)
${extra}
`;

function circuit(text: string) {
  const c = compile(text);
  if (!c.ok) throw new Error(JSON.stringify(c.errors));
  return c.circuit;
}

describe("solveWork = points × (1 + samples + variants)", () => {
  it("one sweep of 400 points is 400", () => {
    expect(solveWork(circuit(net("")))).toBe(400);
  });
  it("1 000 samples × 400 points is 400 400 and goes to the queue", () => {
    const c = circuit(net("monte-carlo 1000 seed=2"));
    expect(solveWork(c)).toBe(400 * 1001);
    expect(solveWork(c)).toBeGreaterThan(MAX_INLINE_WORK);
    expect(shouldQueue(c)).toBe(true);
  });
  it("vary values count like samples; a log sweep's length is its points (10 Hz…100 kHz, 50/decade = 201)", () => {
    const c = circuit(net("vary R1 over 1k, 2k, 3k", "sweep 10Hz to 100kHz log 50 per decade"));
    expect(solveWork(c)).toBe(201 * 4);
    expect(shouldQueue(c)).toBe(false);
  });
  it(`more than ${MAX_MC_INLINE_SAMPLES} samples queue even on a short sweep`, () => {
    const c = circuit(net(`monte-carlo ${MAX_MC_INLINE_SAMPLES + 1}`, "sweep at 1kHz, 2kHz"));
    expect(solveWork(c)).toBeLessThan(MAX_INLINE_WORK);
    expect(shouldQueue(c)).toBe(true);
    expect(shouldQueue(circuit(net(`monte-carlo ${MAX_MC_INLINE_SAMPLES}`, "sweep at 1kHz, 2kHz")))).toBe(
      false,
    );
  });
});
