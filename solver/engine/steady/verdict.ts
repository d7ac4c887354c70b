/** The steady oscillation in words, the start-up time from the growing poles, and the envelope. */
import type { SteadyResult } from "../../types";

const sig = (x: number, d = 3) => String(Number(x.toPrecision(d)));

/** "1.553 kHz" (4 significant digits). */
export function hz(f: number): string {
  if (f >= 1e6) return `${sig(f / 1e6, 4)} MHz`;
  if (f >= 1e3) return `${sig(f / 1e3, 4)} kHz`;
  return `${sig(f, 4)} Hz`;
}

/** "14 ms", "2.3 s", "850 µs". */
export function seconds(t: number): string {
  if (t >= 1) return `${sig(t, 2)} s`;
  if (t >= 1e-3) return `${sig(t * 1e3, 2)} ms`;
  return `${sig(t * 1e6, 2)} µs`;
}

/**
 * Start-up (NETLIST.md `startup`): the small-signal envelope grows as e^(σt) from LEVEL to the steady
 * amplitude A at the cut node: t = ln(A/LEVEL)/σ; cycles = t·f. Null seconds when A ≤ LEVEL.
 */
export function startup(sigma: number, amplitude: number, from: number, frequencyHz: number) {
  const secs = amplitude > from ? Math.log(amplitude / from) / sigma : null;
  return { sigma, seconds: secs, cycles: secs === null ? null : secs * frequencyHz, from };
}

/** The envelope from LEVEL to A (log-linear growth, then flat), 64 points over 1.25× the start-up time. */
export function envelope(sigma: number, amplitude: number, from: number): SteadyResult["envelope"] {
  if (!(sigma > 0) || !(amplitude > from)) return null;
  const tEnd = (1.25 * Math.log(amplitude / from)) / sigma;
  const t: number[] = [];
  const level: number[] = [];
  for (let i = 0; i <= 64; i++) {
    const ti = (tEnd * i) / 64;
    t.push(ti);
    level.push(Math.min(amplitude, from * Math.exp(sigma * ti)));
  }
  return { t, level };
}

/** "settles at 2.9 V peak, 1.553 kHz, 0.8 % distortion; reaches that in about 14 ms (22 cycles)". */
export function summary(
  amplitude: number,
  node: string,
  frequencyHz: number,
  thdPercent: number,
  start: { seconds: number | null; cycles: number | null } | null,
): string {
  const head = `settles at ${amplitude.toPrecision(2)} V peak at ${node}, ${hz(frequencyHz)}, ${sig(thdPercent, 2)} % distortion`;
  if (!start || start.seconds === null) return head;
  return `${head}; reaches that in about ${seconds(start.seconds)} (${Math.round(start.cycles ?? 0)} cycles)`;
}
