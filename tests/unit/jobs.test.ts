/** When a run goes to the job queue (lib/jobs.ts) — pure, no database. */
import { describe, expect, it } from "vitest";
import { previewPlan, shouldQueue, solveWork, steadyWork } from "@/lib/jobs";
import { MAX_INLINE_WORK, MAX_MC_INLINE_SAMPLES, NOISE_BAND_WORK } from "@/lib/limits";
import { compile, solveNetlist } from "@/solver";

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
  it("a noise density rides on the sweep (not priced); each integrated noise measure adds NOISE_BAND_WORK per variant", () => {
    const noise =
      "noise N = volts(out)\nmeasure a = noise(N) at 1kHz\nmeasure b = noise(N) from 10Hz to 20kHz";
    expect(solveWork(circuit(net(noise)))).toBe(400 + NOISE_BAND_WORK);
    expect(solveWork(circuit(net(`${noise}\nvary R1 over 1k, 2k`)))).toBe(400 * 3 + NOISE_BAND_WORK * 3);
  });
  it("each Monte Carlo sample integrates its own noise band, so the band is priced per sample too", () => {
    const noise = "noise N = volts(out)\nmeasure b = noise(N) from 10Hz to 20kHz\nmonte-carlo 20 seed=1";
    expect(solveWork(circuit(net(noise)))).toBe(400 * 21 + NOISE_BAND_WORK * 21);
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

describe("the steady oscillation is priced in the same work (lib/limits.ts)", () => {
  const osc = (extra: string) =>
    circuit(`R1: resistor out mid 10k tol=1%
C1: capacitor mid pos 10n
R2: resistor pos gnd 10k
C2: capacitor pos gnd 10n
U1: opamp pos neg out swing=12V
Rf: resistor neg out 24k
Rg: resistor neg gnd 10k
sweep 100Hz to 20kHz linear 400 points
loop T cut out before R1
${extra}`);
  it("15 harmonics stay inline, 255 go to the queue", () => {
    expect(steadyWork(15)).toBe(20_000 + 30_000 + Math.round(31 ** 3 / 100));
    expect(solveWork(osc("steady T"))).toBe(400 + steadyWork(15));
    expect(shouldQueue(osc("steady T harmonics=63"))).toBe(false);
    expect(shouldQueue(osc("steady T harmonics=255"))).toBe(true);
  });
  it("a preview leaves a steady solve over the budget out, with the reason, and solves a small one", () => {
    const text = (n: number) =>
      `R1: resistor out mid 10k\nC1: capacitor mid pos 10n\nR2: resistor pos gnd 10k\nC2: capacitor pos gnd 10n\nU1: opamp pos neg out swing=12V\nRf: resistor neg out 24k\nRg: resistor neg gnd 10k\nloop T cut out before R1\nsteady T harmonics=${n}\nmeasure a = amplitude(volts(out))`;
    expect(previewPlan(text(15), 1000).options).toEqual({ maxPoints: 1000 });
    const big = previewPlan(text(255), 1000).options;
    expect(big.deferSteady).toMatch(/too large for a preview/);
    const r = solveNetlist(text(255), big);
    if (!r.ok) throw new Error(r.errors[0]!.message);
    expect(r.steady!.reason).toBe(big.deferSteady);
    expect(r.measures[0]).toMatchObject({ value: null, reason: big.deferSteady });
  });
  it("a sampled steady measure pays the steady solve once per sample", () => {
    const c = osc("steady T\nmeasure a = amplitude(volts(out))\nmonte-carlo 20");
    expect(solveWork(c)).toBe(400 * 21 + steadyWork(15) * 21);
    expect(shouldQueue(c)).toBe(true);
  });
});
