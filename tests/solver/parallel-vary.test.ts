/**
 * `vary` on the queued-run path (solver/parallel.ts): variants solved one at a time, progress over
 * variants + Monte Carlo samples, cancel between variants, and the same JSON as `solveNetlist`.
 *
 * The circuit is the Wien bridge's RC network of engine-studies.test.ts; a variant's zero-phase
 * frequency is f0 = 1/(2π√(R1R2C1C2)) (OAFE Eq. 15-9).
 */
import { afterAll, describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { solveNetlistParallel, stopSampleWorkers, workersUnavailableReason } from "@/solver/parallel";
import type { SolveResult, SolveSuccess } from "@/solver/types";
import { expectClose } from "./engine-tolerance";

/** Rp is the `let R`, so `vary R` re-compiles; 0 and −1k are refused by the compiler (warnings). */
const wienNet = (tail: string) => `
let R = 10k
V1: vsource   in  gnd 1
Rs: resistor  in  mid 10k tol=1%
Cs: capacitor mid pos 10n tol=1%
Rp: resistor  pos gnd R   tol=1%
Cp: capacitor pos gnd 10n tol=1%
sweep 100Hz to 10kHz log 50 per decade
show beta = volts(pos) / volts(in)
measure f0 = zero-phase(beta)
measure b0 = mag(beta) at f0
check f0 between 1.58kHz and 1.60kHz
${tail}
`;

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}

/** The JSON without the timing stats (they differ from run to run). */
const json = (r: SolveResult) => JSON.stringify({ ...r, stats: null });

afterAll(async () => {
  await stopSampleWorkers();
});

describe("vary on the parallel path", () => {
  it("gives the same JSON as solveNetlist: variants, skipped values' warnings, order", async () => {
    for (const tail of [
      "vary R over 5k, 0, -1k, 20k",
      "vary Rp over 5k, 0, 20k",
      "vary Cs over 1n, 10n\npoles\nsensitivity f0",
    ]) {
      const text = wienNet(tail);
      const base = solve(text);
      expect(base.variants!.length).toBeGreaterThan(1);
      const r = await solveNetlistParallel(text, { threads: 0 });
      expect(json(r)).toBe(json(base));
    }
    // The skipped values are reported, the others kept in order (R = 0 and −1k fail to compile).
    const r = solve(wienNet("vary R over 5k, 0, -1k, 20k"));
    expect(r.variants!.map((v) => v.value)).toEqual([5e3, 20e3]);
    expect(r.warnings.map((w) => w.message.slice(0, 10))).toEqual(["vary R = 0", "vary R = -"]);
  });

  it("reports one progress step per variant, done growing to the value count", async () => {
    const calls: [number, number][] = [];
    const r = await solveNetlistParallel(wienNet("vary R over 5k, 10k, 20k, 40k"), {
      threads: 0,
      onProgress: (done, total) => calls.push([done, total]),
    });
    expect(calls).toEqual([
      [1, 4],
      [2, 4],
      [3, 4],
      [4, 4],
    ]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // OAFE Eq. 15-9: f0 = 1/(2π√(R1R2C1C2)) with R1 = 10k, R2 = 5k, C1 = C2 = 10n → 2250.7908 Hz.
    expectClose(
      r.variants![0]!.measures[0]!.value,
      1 / (2 * Math.PI * Math.sqrt(10e3 * 5e3 * 10e-9 * 10e-9)),
      1e-9,
    );
  });

  it("counts variants and samples together, on worker threads too, with the same JSON", async () => {
    // 300 samples × 101 points is above PARALLEL_MIN_WORK, so threads: 2 uses the workers.
    const text = wienNet("vary R over 5k, 20k, 0\nmonte-carlo 300 seed=11 dist=normal");
    const base = solve(text);
    for (const threads of [0, 2]) {
      const calls: [number, number][] = [];
      const r = await solveNetlistParallel(text, {
        threads,
        onProgress: (done, total) => calls.push([done, total]),
      });
      if (threads > 0) expect(workersUnavailableReason()).toBeNull();
      expect(json(r)).toBe(json(base));
      const done = calls.map(([d]) => d);
      expect(new Set(calls.map(([, t]) => t))).toEqual(new Set([3 + 300]));
      expect(done.slice(0, 3)).toEqual([1, 2, 3]);
      expect(done.length).toBeGreaterThan(3);
      expect([...done].sort((a, b) => a - b)).toEqual(done);
      expect(done.at(-1)).toBe(303);
    }
  }, 60_000);

  it("rejects when aborted between variants, and solves no further variant", async () => {
    const ac = new AbortController();
    const seen: number[] = [];
    const solving = solveNetlistParallel(wienNet("vary R over 5k, 10k, 20k, 40k"), {
      threads: 0,
      signal: ac.signal,
      onProgress: (done) => {
        seen.push(done);
        if (done === 2) ac.abort(new Error("stop at 2"));
      },
    });
    await expect(solving).rejects.toThrow("stop at 2");
    expect(seen).toEqual([1, 2]);
  });

  it("a netlist without vary or Monte Carlo still reports 1 of 1", async () => {
    const calls: [number, number][] = [];
    await solveNetlistParallel(wienNet(""), { threads: 0, onProgress: (d, t) => calls.push([d, t]) });
    expect(calls).toEqual([[1, 1]]);
  });
});
