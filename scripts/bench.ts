/**
 * Solver benchmarks (`npm run bench`; not a test). Prints one table row per case.
 * RC ladders of 10…10 000 sections swept over 1 000 log points through the engine's sparse LU,
 * and the same systems through mathjs's dense `lusolve` where that is feasible, as a speed ratio.
 * Add a case by pushing to BENCH_CASES.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { complex, lusolve, matrix } from "mathjs";
import { solveNetlist } from "../solver";
import { AcSolver } from "../solver/engine/ac";
import { assemble, buildMna, type MnaSystem } from "../solver/engine/mna";
import { sweepFrequencies } from "../solver/engine/sweep";
import { solveNetlistParallel, stopSampleWorkers, workersUnavailableReason } from "../solver/parallel";
import type { Part } from "../solver/types";

export interface BenchRow {
  name: string;
  unknowns: number;
  points: number;
  msPerSweep: number;
  unknownPointsPerSecond: number;
  /** mathjs dense time per point over ours, when measured. */
  vsMathjs: number | null;
}

export interface BenchCase {
  name: string;
  run(): BenchRow | Promise<BenchRow>;
}

const span = { line: 1, column: 1, endColumn: 2 };

/** An RC ladder: a 1 V source, then `sections` × (series 1 kΩ, shunt 10 nF). */
export function rcLadder(sections: number): MnaSystem {
  const parts: Part[] = [{ name: "Vin", kind: "vsource", nodes: ["n0", "gnd"], value: 1, span }];
  for (let i = 1; i <= sections; i++) {
    parts.push({ name: `R${i}`, kind: "resistor", nodes: [`n${i - 1}`, `n${i}`], value: 1e3, span });
    parts.push({ name: `C${i}`, kind: "capacitor", nodes: [`n${i}`, "gnd"], value: 10e-9, span });
  }
  const built = buildMna(parts, []);
  if (!built.ok) throw new Error(built.errors[0]?.message);
  return built.system;
}

const logPoints = (points: number) => {
  const f = sweepFrequencies({ kind: "log", start: 10, stop: 10e6, perDecade: (points - 1) / 6 });
  if (typeof f === "string") throw new Error(f);
  return f;
};

/** Time the engine over a sweep: ms for all points (best of `repeat`). */
function timeEngine(sys: MnaSystem, freqs: number[], repeat: number): number {
  let best = Number.POSITIVE_INFINITY;
  for (let r = 0; r < repeat; r++) {
    const solver = new AcSolver(sys);
    const t0 = performance.now();
    for (const f of freqs) {
      const err = solver.solveAt(f);
      if (err) throw new Error(err);
    }
    best = Math.min(best, performance.now() - t0);
  }
  return best;
}

/** Time mathjs dense complex lusolve on the same matrices: ms per point. */
function timeMathjs(sys: MnaSystem, freqs: number[]): number {
  const n = sys.n;
  const t0 = performance.now();
  for (const f of freqs) {
    assemble(sys, f);
    const rows = Array.from({ length: n }, () => Array.from({ length: n }, () => complex(0, 0)));
    const { rowPtr, colIdx, re, im } = sys.matrix;
    for (let i = 0; i < n; i++) {
      for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) rows[i]![colIdx[p]!] = complex(re[p]!, im[p]!);
    }
    const b = Array.from(sys.bRe, (x, i) => [complex(x, sys.bIm[i]!)]);
    lusolve(matrix(rows), matrix(b));
  }
  return (performance.now() - t0) / freqs.length;
}

function ladderCase(sections: number, mathjsPoints: number): BenchCase {
  return {
    name: `RC ladder ${sections} sections`,
    run() {
      const sys = rcLadder(sections);
      const freqs = logPoints(1001).slice(0, 1000);
      const ms = timeEngine(sys, freqs, sections >= 10_000 ? 1 : 5);
      const ours = ms / freqs.length;
      const dense = mathjsPoints > 0 ? timeMathjs(sys, logPoints(mathjsPoints)) : null;
      return {
        name: this.name,
        unknowns: sys.n,
        points: freqs.length,
        msPerSweep: ms,
        unknownPointsPerSecond: (sys.n * freqs.length) / (ms / 1000),
        vsMathjs: dense === null ? null : dense / ours,
      };
    },
  };
}

export const BENCH_CASES: BenchCase[] = [
  ladderCase(10, 200),
  ladderCase(100, 10),
  ladderCase(1000, 0),
  ladderCase(10_000, 0),
];

/**
 * Monte Carlo of the demo oscillator (solver/examples/wien-bridge.pwn) with its sweep set to 400
 * points and 1 000 samples: whole-study time in this thread, and on worker threads (the first
 * parallel run includes starting the workers; the second reuses them). Goal: < 2 s (issue 5).
 */
function monteCarloCase(label: string, threads: number): BenchCase {
  return {
    name: `Monte Carlo 1000 × 400, bridge oscillator, ${label}`,
    async run() {
      const source = readFileSync(
        path.join(__dirname, "..", "solver", "examples", "wien-bridge.pwn"),
        "utf8",
      );
      const text = source
        .replace(/^sweep .*$/m, "sweep 100Hz to 20kHz linear 400 points")
        .replace(/^monte-carlo .*$/m, "monte-carlo 1000 seed=11");
      const t0 = performance.now();
      const r = threads > 0 ? await solveNetlistParallel(text, { threads }) : solveNetlist(text);
      const ms = performance.now() - t0;
      if (!r.ok) throw new Error(r.errors[0]?.message);
      if (threads > 0 && workersUnavailableReason()) throw new Error(workersUnavailableReason()!);
      const points = r.frequencies.length * (r.monteCarlo?.samples ?? 0);
      return {
        name: this.name,
        unknowns: r.stats.unknowns,
        points,
        msPerSweep: ms,
        unknownPointsPerSecond: (r.stats.unknowns * points) / (ms / 1000),
        vsMathjs: null,
      };
    },
  };
}

BENCH_CASES.push(
  monteCarloCase("in-thread", 0),
  monteCarloCase("2 worker threads, cold (incl. start)", 2),
  monteCarloCase("2 worker threads, warm", 2),
);

async function main(): Promise<void> {
  // Warm the JIT so the first row is not a cold-start figure.
  timeEngine(rcLadder(50), logPoints(1001), 3);
  const header = ["case", "unknowns", "points", "ms/sweep", "unknown·points/s", "× mathjs dense"];
  console.log(header.join(" | "));
  console.log(header.map(() => "---").join(" | "));
  for (const c of BENCH_CASES) {
    const r = await c.run();
    console.log(
      [
        r.name,
        r.unknowns,
        r.points,
        r.msPerSweep.toFixed(1),
        r.unknownPointsPerSecond.toExponential(2),
        r.vsMathjs === null ? "—" : `${r.vsMathjs.toFixed(0)}×`,
      ].join(" | "),
    );
  }
}

if (require.main === module) {
  main()
    .then(() => stopSampleWorkers())
    .catch((error) => {
      console.error(error);
      process.exit(1);
    });
}
