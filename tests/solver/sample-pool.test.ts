/**
 * The Monte Carlo thread pool cannot hang a job: a thread that dies mid-job fails only its chunk,
 * which is retried once on a fresh thread; a chunk that fails twice fails the run with the reason;
 * an abort settles at once; and the pool serves the next job afterwards.
 * (Robustness, not numerics: the reference is the same netlist solved in one thread.)
 */
import { existsSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, afterEach, describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { sampleWorkerThreads, solveNetlistParallel, stopSampleWorkers } from "@/solver/parallel";
import type { SolveSuccess } from "@/solver/types";

const net = (samples: number) => `
title RC corner spread
V1: vsource   in  gnd 1
R1: resistor  in  out 10k tol=10%
C1: capacitor out gnd 10n tol=5%
sweep 10Hz to 100kHz log 50 per decade
show H = volts(out) / volts(in)
measure fc = crossing(H, half-power)
check fc between 1.5kHz and 1.7kHz
monte-carlo ${samples} seed=7
`;

const fixture = path.join(import.meta.dirname, "fixtures", "crashing-sample-worker.mjs");
const dir = mkdtempSync(path.join(tmpdir(), "pw-pool-"));
const TEST_VARS = ["PHASEWRIGHT_SAMPLE_WORKER", "PW_CRASH", "PW_CRASH_MARKER"];
const clearEnv = () => {
  for (const k of TEST_VARS) delete process.env[k];
};

function ok(r: ReturnType<typeof solveNetlist>): SolveSuccess {
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}

const reference = ok(solveNetlist(net(600))).monteCarlo;

afterEach(async () => {
  await stopSampleWorkers();
  clearEnv();
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("a worker thread that dies mid-job", { timeout: 60_000 }, () => {
  it("is replaced: its chunk is solved again on a fresh thread and the result is unchanged", async () => {
    let killed = 0;
    const r = ok(
      await solveNetlistParallel(net(600), {
        threads: 2,
        onProgress: (done) => {
          // After the first chunk, end every live thread: those busy with a chunk fail it.
          if (killed === 0 && done > 0)
            for (const t of sampleWorkerThreads()) void t.terminate().then(() => killed++);
        },
      }),
    );
    expect(killed).toBeGreaterThan(0);
    expect(r.monteCarlo).toEqual(reference);
  });

  it("that crashes once (first task of the job) costs nothing but a retry", async () => {
    process.env.PHASEWRIGHT_SAMPLE_WORKER = fixture;
    process.env.PW_CRASH = "once";
    process.env.PW_CRASH_MARKER = path.join(dir, "once");
    const r = ok(await solveNetlistParallel(net(600), { threads: 2 }));
    expect(existsSync(path.join(dir, "once"))).toBe(true); // a thread did crash
    expect(r.monteCarlo).toEqual(reference);
  });

  it("that crashes on every try fails the run with the reason, and the pool serves the next job", async () => {
    process.env.PHASEWRIGHT_SAMPLE_WORKER = fixture;
    process.env.PW_CRASH = "always";
    const r = await solveNetlistParallel(net(600), { threads: 2 });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors[0]!.message).toBe("the Monte Carlo samples could not be solved");
    expect(r.errors[0]!.hint).toMatch(/failed twice: the worker thread exited \(code 7\)/);
    expect(r.errors[0]!.line).toBe(10); // the monte-carlo line

    await stopSampleWorkers();
    clearEnv();
    const again = ok(await solveNetlistParallel(net(600), { threads: 2 }));
    expect(again.monteCarlo).toEqual(reference);
  });
});

describe("an abort", { timeout: 60_000 }, () => {
  it("settles the job at once and releases its threads", async () => {
    const controller = new AbortController();
    const started = performance.now();
    const p = solveNetlistParallel(net(4000), {
      threads: 2,
      signal: controller.signal,
      onProgress: (done) => done > 0 && controller.abort(new Error("stop")),
    });
    await expect(p).rejects.toThrow("stop");
    expect(performance.now() - started).toBeLessThan(30_000);
    // The next job on the same pool completes.
    const r = ok(await solveNetlistParallel(net(600), { threads: 2 }));
    expect(r.monteCarlo).toEqual(reference);
  });
});
