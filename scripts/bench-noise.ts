/**
 * Noise against the plain sweep (issue 10): a 100-section RC ladder × 1 000 points, the same
 * netlist with and without a `noise` statement, best of 40 each, alternating, in this thread. Goal: noise within
 * 1.5× the plain sweep (one transposed solve per point on the sweep's factors).
 */
import { analyze } from "../solver/engine";
import { compile } from "../solver/lang";
import type { BenchCase } from "./bench";

function ladderText(sections: number, noise: boolean): string {
  const lines = ["Vin: vsource n0 gnd 1"];
  for (let i = 1; i <= sections; i++) {
    lines.push(`R${i}: resistor n${i - 1} n${i} 1k`, `C${i}: capacitor n${i} gnd 10n`);
  }
  lines.push("sweep 10Hz to 10MHz linear 1000 points", `show H = volts(n${sections})`);
  if (noise) lines.push(`noise N = volts(n${sections}) input Vin`);
  return lines.join("\n");
}

function best(text: string, repeat: number): { ms: number; points: number; unknowns: number } {
  const c = compile(text);
  if (!c.ok) throw new Error(c.errors[0]?.message);
  let ms = Number.POSITIVE_INFINITY;
  let points = 0;
  let unknowns = 0;
  for (let r = 0; r < repeat; r++) {
    const t0 = performance.now();
    const res = analyze(c.circuit, []);
    ms = Math.min(ms, performance.now() - t0);
    if (!res.ok) throw new Error(res.errors[0]?.message);
    points = res.frequencies.length;
    unknowns = res.stats.unknowns;
  }
  return { ms, points, unknowns };
}

export function noiseCase(sections: number): BenchCase {
  return {
    name: `Noise, RC ladder ${sections} sections (× plain sweep)`,
    run() {
      // Warm both paths first (JIT), then time them alternately, best of 40 each, so changes in the
      // machine's load hit both (the shared development machine varies by 2× within seconds; with 16
      // rounds, ~0.3 s, one busy spell could cover every round of the noisy sweep and read 1.7×).
      best(ladderText(sections, false), 2);
      best(ladderText(sections, true), 2);
      let plain = best(ladderText(sections, false), 1);
      let noisy = best(ladderText(sections, true), 1);
      for (let r = 0; r < 39; r++) {
        const p = best(ladderText(sections, false), 1);
        const n = best(ladderText(sections, true), 1);
        if (p.ms < plain.ms) plain = p;
        if (n.ms < noisy.ms) noisy = n;
      }
      console.error(
        `noise bench: plain ${plain.ms.toFixed(1)} ms, with noise ${noisy.ms.toFixed(1)} ms, ${plain.points} points`,
      );
      return {
        name: this.name,
        unknowns: noisy.unknowns,
        points: noisy.points,
        msPerSweep: noisy.ms,
        unknownPointsPerSecond: (noisy.unknowns * noisy.points) / (noisy.ms / 1000),
        vsMathjs: null,
        vsLimit: { ratio: noisy.ms / plain.ms, goal: 1.5 },
      };
    },
  };
}
