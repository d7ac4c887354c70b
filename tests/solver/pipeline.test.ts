/**
 * The one solve pipeline (solver/pipeline.ts) with its Monte Carlo step plugged in: any strategy
 * that solves the drawn samples, in any split and order, gives the JSON of `solveNetlist`; a
 * strategy's fault fails the run at the monte-carlo statement; a strategy answering null leaves the
 * samples to this thread. (The reference is the same netlist solved in one thread.)
 */
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { SampleKernel, solveSampleRange } from "@/solver/engine/samples";
import { runPipelineAsync } from "@/solver/parallel";
import { runPipeline, SampleFault, type SampleJob, solvePipeline } from "@/solver/pipeline";
import type { SolveResult, SolveSuccess } from "@/solver/types";

const net = `
title Band-pass spread
V1: vsource   in  gnd 1
R1: resistor  in  mid 4.7k tol=5%
C1: capacitor mid out 22n tol=10%
R2: resistor  out gnd 10k tol=1%
C2: capacitor out gnd 1n
sweep 10Hz to 1MHz log 20 per decade
show H = volts(out) / volts(in)
measure fpk = peak(H)
measure gpk = mag(H) at fpk
measure bw = bandwidth(H)
check gpk >= 0.5
vary R2 over 4.7k, 10k, 22k
monte-carlo 137 seed=11 dist=normal
`;

function ok(r: SolveResult): SolveSuccess {
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}
const withoutTime = (r: SolveSuccess) => JSON.stringify({ ...r, stats: { ...r.stats, solveMs: 0 } });

/** A strategy that solves the samples in uneven chunks, last chunk first (as threads might finish). */
async function reversedChunks(job: SampleJob) {
  const kernel = new SampleKernel(job.circuit, job.freqs, job.draws.names);
  const bounds = [0, 7, 40, 41, 100, job.draws.samples];
  const batches = [];
  for (let i = bounds.length - 2; i >= 0; i--)
    batches.push(
      solveSampleRange(kernel, job.draws.values, job.draws.names.length, bounds[i]!, bounds[i + 1]!),
    );
  return batches;
}

describe("the solve pipeline with a plugged-in Monte Carlo step", () => {
  const reference = ok(solveNetlist(net));

  it("solves variants and samples (the reference has both)", () => {
    expect(reference.variants?.map((v) => v.value)).toEqual([4.7e3, 10e3, 22e3]);
    expect(reference.monteCarlo?.samples).toBe(137);
    expect(reference.monteCarlo?.measures.map((m) => m.name)).toEqual(["fpk", "gpk", "bw"]);
    for (const m of reference.monteCarlo?.measures ?? []) expect(m.std).toBeGreaterThan(0);
  });

  it("any split and order of the samples gives the same JSON as solveNetlist", async () => {
    const r = ok(await runPipelineAsync(solvePipeline(net, { samples: reversedChunks }), {}));
    expect(withoutTime(r)).toBe(withoutTime(reference));
  });

  it("a strategy answering null leaves the samples to this thread, with progress over variants + samples", async () => {
    const seen: [number, number][] = [];
    const r = ok(
      await runPipelineAsync(
        solvePipeline(net, { samples: async () => null, onProgress: (d, t) => seen.push([d, t]) }),
        {},
      ),
    );
    expect(withoutTime(r)).toBe(withoutTime(reference));
    expect(seen.slice(0, 3)).toEqual([
      [1, 140],
      [2, 140],
      [3, 140],
    ]);
    expect(seen.at(-1)).toEqual([140, 140]);
  });

  it("a strategy's SampleFault fails the run at the monte-carlo line with the reason", async () => {
    const failing = async () => {
      throw new SampleFault("samples 1–10 failed twice: out of memory");
    };
    const r = await runPipelineAsync(solvePipeline(net, { samples: failing }), {});
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({
      line: 15,
      message: "the Monte Carlo samples could not be solved",
      hint: "samples 1–10 failed twice: out of memory",
    });
  });

  it("the synchronous driver refuses an asynchronous step instead of dropping it", () => {
    expect(() => runPipeline(solvePipeline(net, { samples: reversedChunks }))).toThrow(/asynchronous/);
  });

  it("an abort rejects at the next pause with the signal's reason", async () => {
    const ac = new AbortController();
    ac.abort(new Error("stop here"));
    await expect(
      runPipelineAsync(solvePipeline(net, { signal: ac.signal }), { signal: ac.signal }),
    ).rejects.toThrow("stop here");
  });
});
