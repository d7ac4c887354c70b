/**
 * Where the time of a large sweep goes (not a test, not part of `npm run bench`):
 *   npx tsx scripts/profile-ladder.ts [sections=1000]
 * Times each stage of solving the RC ladder of scripts/bench.ts (1 000 log points) as a netlist:
 * compile, MNA build, then per frequency assemble / numeric refactor / solve / probes, then
 * dB and degrees, measures, the JSON text and the command's summary.
 */
import { solveNetlist } from "../solver";
import { toSummary } from "../solver/cli";
import { AcSolver } from "../solver/engine/ac";
import { assemble, buildMna } from "../solver/engine/mna";
import { readTrace } from "../solver/engine/probes";
import { sweepFrequencies } from "../solver/engine/sweep";
import { makeTrace } from "../solver/engine/trace";
import { compile } from "../solver/lang";
import { ladderNetlist } from "./bench-ladder";

const sections = Number(process.argv[2] ?? 1000);
const text = ladderNetlist(sections);
const time = <T>(label: string, rows: [string, number][], f: () => T): T => {
  const t0 = performance.now();
  const out = f();
  rows.push([label, performance.now() - t0]);
  return out;
};

function once(): [string, number][] {
  const rows: [string, number][] = [];
  const c = time("compile (parse, elaborate)", rows, () => compile(text));
  if (!c.ok) throw new Error(c.errors[0]?.message);
  const built = time("MNA build", rows, () => buildMna(c.circuit.parts, []));
  if (!built.ok) throw new Error(built.errors[0]?.message);
  const sys = built.system;
  const freqs = sweepFrequencies(c.circuit.sweep) as number[];
  const ac = new AcSolver(sys);
  ac.solveAt(freqs[0]!); // ordering analysed once, as in a sweep
  // biome-ignore lint/suspicious/noExplicitAny: the LU is private; timed here step by step
  const lu = (ac as any).lu;
  const show = c.circuit.shows[0]!;
  const re: number[] = [];
  const im: number[] = [];
  let tAsm = 0;
  let tRef = 0;
  let tSol = 0;
  let tPro = 0;
  for (const f of freqs) {
    const t0 = performance.now();
    assemble(sys, f);
    const t1 = performance.now();
    lu.refactor(sys.matrix.re, sys.matrix.im);
    const t2 = performance.now();
    lu.solve(sys.bRe, sys.bIm, ac.xRe, ac.xIm);
    const t3 = performance.now();
    const v = readTrace(show.probe, ac);
    re.push(v.re);
    im.push(v.im);
    tPro += performance.now() - t3;
    tAsm += t1 - t0;
    tRef += t2 - t1;
    tSol += t3 - t2;
  }
  rows.push(
    ["assemble G + jωC", tAsm],
    ["numeric refactor (LU)", tRef],
    ["forward/back solve", tSol],
    ["probes", tPro],
  );
  time("dB and degrees (makeTrace)", rows, () => makeTrace("H", "probe", re, im));
  const full = time("whole solveNetlist (incl. measures)", rows, () => solveNetlist(text));
  if (!full.ok) throw new Error(full.errors[0]?.message);
  time("JSON text of the result", rows, () => JSON.stringify(full, null, 2));
  time("summary text", rows, () => toSummary(full));
  return rows;
}

once(); // warm the JIT
const rows = once();
for (const [label, ms] of rows) console.log(`${label.padEnd(38)} ${ms.toFixed(1).padStart(8)} ms`);
