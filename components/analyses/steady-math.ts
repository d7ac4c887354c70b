/** Pure helpers of the steady-oscillation view (client-safe, no React). */
import type { SteadyProbe } from "@/solver/types";

/** Harmonics 2…N in dB below the fundamental (dBc); harmonics under −160 dBc are left out. */
export function spectrumDbc(probe: SteadyProbe): { harmonic: number[]; dbc: number[] } {
  const a1 = probe.amplitudes[0] ?? 0;
  const harmonic: number[] = [];
  const dbc: number[] = [];
  if (!(a1 > 0)) return { harmonic, dbc };
  probe.amplitudes.forEach((a, i) => {
    if (i === 0) return;
    const db = 20 * Math.log10(a / a1);
    if (Number.isFinite(db) && db > -160) {
      harmonic.push(i + 1);
      dbc.push(db);
    }
  });
  return { harmonic, dbc };
}

/** The waveform's time axis in a readable unit: µs below 1 ms, else ms. */
export function timeAxis(t: number[]): { values: number[]; unit: "µs" | "ms" } {
  const end = t[t.length - 1] ?? 0;
  const scale = end < 1e-3 ? 1e6 : 1e3;
  return { values: t.map((x) => x * scale), unit: scale === 1e6 ? "µs" : "ms" };
}
