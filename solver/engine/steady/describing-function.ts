/**
 * The describing-function estimate that starts harmonic balance (A. Gelb and W. E. Vander Velde,
 * *Multiple-Input Describing Functions and Nonlinear System Design*, 1968): each limiter is replaced
 * by its equivalent gain N(A) for a sine of amplitude A across it; the oscillation sits where the
 * loop through the first port, L(jω)·N(A), is 1 at zero phase.
 */
import { type Port, portLaw } from "./ports";
import type { Transfer } from "./transfer";

const DF_SAMPLES = 256;

/** Equivalent gain of a port's law for w = A·cos θ: the fundamental of u divided by A. */
export function describingGain(port: Port, amplitude: number, samples = DF_SAMPLES): number {
  let s = 0;
  for (let i = 0; i < samples; i++) {
    const c = Math.cos((2 * Math.PI * i) / samples);
    s += portLaw(port, amplitude * c).u * c;
  }
  return (2 * s) / samples / amplitude;
}

/** The port-0 loop L_00(jω). */
function loopAt(t: Transfer, omega: number): { re: number; im: number } | null {
  const l = t.at(omega);
  return l === null ? null : { re: l.re[0]!, im: l.im[0]! };
}

/**
 * The frequency near omega0 where L_00 is real and positive (a sign change of its imaginary part,
 * refined by bisection), searched over a decade each way; null if there is none.
 */
export function zeroPhaseNear(t: Transfer, omega0: number): { omega: number; gain: number } | null {
  const steps = 80;
  let best: { omega: number; gain: number } | null = null;
  let prev: { w: number; v: { re: number; im: number } } | null = null;
  for (let i = 0; i <= steps; i++) {
    const w = omega0 * 10 ** (-1 + (2 * i) / steps);
    const v = loopAt(t, w);
    if (v === null) {
      prev = null;
      continue;
    }
    if (prev && Math.sign(prev.v.im) !== Math.sign(v.im) && (prev.v.re > 0 || v.re > 0)) {
      let lo = prev.w;
      let hi = w;
      let flo = prev.v.im;
      for (let b = 0; b < 60 && hi / lo > 1 + 1e-12; b++) {
        const mid = Math.sqrt(lo * hi);
        const fm = loopAt(t, mid);
        if (fm === null) break;
        if (Math.sign(fm.im) === Math.sign(flo)) {
          lo = mid;
          flo = fm.im;
        } else hi = mid;
      }
      const omega = Math.sqrt(lo * hi);
      const g = loopAt(t, omega);
      if (
        g &&
        g.re > 0 &&
        (!best || Math.abs(Math.log(omega / omega0)) < Math.abs(Math.log(best.omega / omega0)))
      )
        best = { omega, gain: g.re };
    }
    prev = { w, v };
  }
  return best;
}

/** The amplitude A with N(A) = target, by bisection on log A over 1e-6…1e9; null if none. */
export function amplitudeFor(port: Port, target: number): number | null {
  const grid = Array.from({ length: 15 * 4 + 1 }, (_, i) => 10 ** (-6 + i / 4));
  let prevA = grid[0]!;
  let prevF = describingGain(port, prevA) - target;
  for (const a of grid.slice(1)) {
    const f = describingGain(port, a) - target;
    if (Math.sign(f) !== Math.sign(prevF) && f !== 0) {
      let lo = prevA;
      let hi = a;
      let flo = prevF;
      for (let b = 0; b < 60 && hi / lo > 1 + 1e-9; b++) {
        const mid = Math.sqrt(lo * hi);
        const fm = describingGain(port, mid) - target;
        if (Math.sign(fm) === Math.sign(flo)) {
          lo = mid;
          flo = fm;
        } else hi = mid;
      }
      return Math.sqrt(lo * hi);
    }
    if (f === 0) return a;
    prevA = a;
    prevF = f;
  }
  return null;
}

/** The estimate: ω and the amplitude of port 0's control variable, or the reason there is none. */
export function describingEstimate(
  t: Transfer,
  ports: Port[],
  omega0: number,
): { omega: number; amplitude: number } | { reason: string } {
  const z = zeroPhaseNear(t, omega0);
  if (z === null) return { reason: "the limiter's loop has no zero-phase frequency near the growing poles" };
  const a = amplitudeFor(ports[0]!, 1 / z.gain);
  if (a === null)
    return { reason: `no amplitude makes the limiter's equivalent gain ${(1 / z.gain).toPrecision(4)}` };
  return { omega: z.omega, amplitude: a };
}
