/**
 * Steady-oscillation benchmark rows for scripts/bench.ts: harmonic balance of the diode-limited
 * bridge oscillator (solver/examples/wien-bridge-diodes.pwn) with 15 and 63 harmonics, the whole
 * solve (poles, describing-function start, Newton) without the sweep. Goals: < 200 ms and < 2 s.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { compile } from "../solver";
import { solveSteady } from "../solver/engine/steady";
import type { BenchCase } from "./bench";

export function steadyCase(harmonics: number, goalMs: number): BenchCase {
  return {
    name: `steady oscillation, diode-limited bridge, ${harmonics} harmonics (goal < ${goalMs} ms)`,
    run() {
      const text = readFileSync(
        path.join(__dirname, "..", "solver", "examples", "wien-bridge-diodes.pwn"),
        "utf8",
      );
      const compiled = compile(text.replace(/^steady .*$/m, `steady T harmonics=${harmonics}`));
      if (!compiled.ok) throw new Error(compiled.errors[0]?.message);
      const c = compiled.circuit;
      let best = Number.POSITIVE_INFINITY;
      let iterations = 0;
      for (let r = 0; r < 5; r++) {
        const t0 = performance.now();
        const s = solveSteady(c, c.steady!, undefined, 1591.5);
        best = Math.min(best, performance.now() - t0);
        if (s.reason !== null) throw new Error(s.reason);
        iterations = s.iterations;
      }
      return {
        name: `${this.name}: ${iterations} Newton steps`,
        unknowns: c.nodes.length,
        points: harmonics + 1,
        msPerSweep: best,
        unknownPointsPerSecond: (c.nodes.length * (harmonics + 1)) / (best / 1000),
        vsMathjs: null,
      };
    },
  };
}
