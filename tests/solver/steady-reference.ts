/**
 * An independent time-domain reference for the steady-oscillation tests (not part of solver/): the
 * diode-limited bridge oscillator integrated with classical fourth-order Runge–Kutta at a fixed step,
 * run until its amplitude no longer changes, then one period read off by zero crossings and its
 * Fourier coefficients by the trapezoid rule.
 *
 * Circuit: series Rs–Cs from out to pos, Rp ∥ Cp from pos to gnd, an ideal op-amp (v− = v+),
 * Rg from neg to gnd, Rf1 from neg to x, Rf2 from x to out with two diodes in antiparallel across it.
 */
const K_BOLTZMANN = 1.380649e-23; // exact, SI Brochure 9th ed. (2019)
const Q_ELECTRON = 1.602176634e-19; // exact, SI Brochure 9th ed. (2019)

export interface BridgeValues {
  R: number;
  C: number;
  Rg: number;
  Rf1: number;
  Rf2: number;
  is: number;
  n: number;
  kelvin: number;
}

export interface TimeDomainResult {
  frequencyHz: number;
  /** Peak amplitude of the fundamental of v(out) and its THD in percent (harmonics 2…15). */
  amplitude: number;
  thdPercent: number;
}

/** Voltage across the Rf2 ∥ diodes element that carries current i (monotone: bisection then Newton). */
function limiterVoltage(i: number, v: BridgeValues, nvt: number, guess: number): number {
  const f = (x: number) => x / v.Rf2 + v.is * (Math.exp(x / nvt) - Math.exp(-x / nvt)) - i;
  const df = (x: number) => 1 / v.Rf2 + (v.is / nvt) * (Math.exp(x / nvt) + Math.exp(-x / nvt));
  let x = Math.max(-1, Math.min(1, guess));
  for (let k = 0; k < 50; k++) {
    const step = f(x) / df(x);
    x -= Math.max(-0.05, Math.min(0.05, step));
    if (Math.abs(step) < 1e-15) break;
  }
  return x;
}

export function integrateBridge(v: BridgeValues, stepsPerPeriod = 1000, periods = 150): TimeDomainResult {
  const nvt = (v.n * K_BOLTZMANN * v.kelvin) / Q_ELECTRON;
  const T0 = 2 * Math.PI * v.R * v.C;
  const h = T0 / stepsPerPeriod;
  let vd = 0;
  const out = (s: [number, number]): number => {
    const vp = s[1];
    const i = vp / v.Rg; // current through Rg = through Rf1 and the limiter (ideal op-amp inputs)
    vd = limiterVoltage(i, v, nvt, vd);
    return vp + v.Rf1 * i + vd;
  };
  // State: [voltage across Cs (mid − pos), voltage of pos].
  const deriv = (s: [number, number]): [number, number] => {
    const iS = (out(s) - (s[1] + s[0])) / v.R;
    return [iS / v.C, (iS - s[1] / v.R) / v.C];
  };
  let s: [number, number] = [0, 1];
  const total = stepsPerPeriod * periods;
  const keep = stepsPerPeriod * 3;
  const tail: number[] = [];
  for (let k = 0; k < total; k++) {
    const k1 = deriv(s);
    const k2 = deriv([s[0] + (h / 2) * k1[0], s[1] + (h / 2) * k1[1]]);
    const k3 = deriv([s[0] + (h / 2) * k2[0], s[1] + (h / 2) * k2[1]]);
    const k4 = deriv([s[0] + h * k3[0], s[1] + h * k3[1]]);
    s = [
      s[0] + (h / 6) * (k1[0] + 2 * k2[0] + 2 * k3[0] + k4[0]),
      s[1] + (h / 6) * (k1[1] + 2 * k2[1] + 2 * k3[1] + k4[1]),
    ];
    if (k >= total - keep) tail.push(out(s));
  }
  // Rising zero crossings, linearly interpolated (in steps).
  const rising: number[] = [];
  for (let k = 1; k < tail.length; k++)
    if (tail[k - 1]! < 0 && tail[k]! >= 0) rising.push(k - 1 + tail[k - 1]! / (tail[k - 1]! - tail[k]!));
  const a = rising[rising.length - 2]!;
  const b = rising[rising.length - 1]!;
  const period = (b - a) * h;
  // Fourier coefficients over [a, b] by the trapezoid rule on the samples (ends interpolated away).
  const coef = (m: number) => {
    let re = 0;
    let im = 0;
    const start = Math.ceil(a);
    const end = Math.floor(b);
    for (let k = start; k <= end; k++) {
      const th = (2 * Math.PI * m * (k - a)) / (b - a);
      const w = k === start || k === end ? 0.5 : 1;
      re += w * tail[k]! * Math.cos(th);
      im += w * tail[k]! * Math.sin(th);
    }
    const scale = 2 / (end - start);
    return Math.hypot(re, im) * scale;
  };
  const a1 = coef(1);
  let d = 0;
  for (let m = 2; m <= 15; m++) d += coef(m) ** 2;
  return { frequencyHz: 1 / period, amplitude: a1, thdPercent: (100 * Math.sqrt(d)) / a1 };
}
