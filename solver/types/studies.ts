/**
 * Result JSON of the studies beyond the sweep (NETLIST.md): noise, zeros, poles, sensitivity and
 * steady oscillation. Field names are the API contract: change them only with the spec.
 */

export interface NoiseContribution {
  part: string;
  /** Which noise of the part: a resistor's thermal noise, an op-amp's `en` or `in`. */
  source: "thermal" | "en" | "in";
  /** This source's share of the output density, V/√Hz (shares add in power); null where infinite. */
  density: (number | null)[];
}

export interface NoiseResult {
  name: string;
  probe: string;
  /** Output noise density, V/√Hz, at each frequency of the sweep (null where infinite: 1/f at 0 Hz). */
  density: (number | null)[];
  /** Input-referred density (output ÷ |gain from the input source|), or null without `input`. */
  inputDensity: (number | null)[] | null;
  input: string | null;
  contributions: NoiseContribution[];
  /** Kelvin the resistors' noise was computed at. */
  temperature: number;
}

export interface ZeroResult {
  probe: string;
  re: number;
  im: number;
  frequencyHz: number;
  q: number | null;
}

export interface PoleResult {
  re: number;
  im: number;
  frequencyHz: number;
  q: number | null;
  growthPerCycle: number | null;
}

export interface SensitivityResult {
  measure: string;
  part: string;
  value: number | null;
}

/** One probe of the steady oscillation (NETLIST.md "Steady oscillation"). */
export interface SteadyProbe {
  probe: string;
  /** Peak amplitude of harmonics 1…N (one-sided: a sine of peak A has amplitudes[0] = A). */
  amplitudes: number[];
  /** Phase of harmonics 1…N in degrees, cosine reference, the cut node's fundamental at 0°. */
  phasesDeg: number[];
  /** The mean (harmonic 0). */
  dc: number;
  thdPercent: number;
  /** One period, uniformly sampled (t from 0 to T exclusive). */
  waveform: { t: number[]; value: number[] };
}

/** The steady oscillation of a loop; null figures come with their reason. */
export interface SteadyResult {
  loop: string;
  /** null when there is no steady oscillation (reason says why). */
  frequencyHz: number | null;
  harmonics: number;
  startup: { sigma: number; seconds: number | null; cycles: number | null; from: number } | null;
  probes: SteadyProbe[];
  /** Newton's final residual (largest harmonic mismatch relative to the largest harmonic), and steps. */
  residual: number | null;
  iterations: number;
  /** Why there is no result (it does not start, nothing limits it, Newton did not converge), else null. */
  reason: string | null;
  /** The verdict in one sentence. */
  summary: string;
  /** The describing-function estimate the solve started from (fundamental only), when found. */
  estimate: { frequencyHz: number; amplitude: number; node: string } | null;
  /** Envelope growth at the cut node: time (s) and peak level (V), from the start level to the steady amplitude. */
  envelope: { t: number[]; level: number[] } | null;
  notes: string[];
}
