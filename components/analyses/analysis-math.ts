/**
 * Pure helpers of the analyses views (client-safe, no React): the oscillator verdict, ranked
 * sensitivities, histogram bars and pole rows. Unit-tested in tests/unit/analyses-math.test.ts.
 */
import type { PoleResult, SensitivityResult, SolveSuccess, TraceResult } from "@/solver/types";

export interface LoopAtZeroPhase {
  trace: string;
  /** Frequency where ∠T crosses 0°, interpolated on log f between sweep points (display only). */
  frequencyHz: number;
  /** |T| there (interpolated in dB). */
  magnitude: number;
}

/** First 0° crossing of a loop trace's phase (a ±180° wrap is not a crossing), interpolated. */
export function loopAtZeroPhase(frequencies: number[], trace: TraceResult): LoopAtZeroPhase | null {
  const ph = trace.phaseDeg;
  const db = trace.magnitudeDb;
  for (let k = 0; k + 1 < frequencies.length; k++) {
    const a = ph[k]!;
    const b = ph[k + 1]!;
    if (a === 0) return { trace: trace.name, frequencyHz: frequencies[k]!, magnitude: 10 ** (db[k]! / 20) };
    if (a * b < 0 && Math.abs(a - b) < 180) {
      const t = a / (a - b);
      const f0 = frequencies[k]!;
      const f1 = frequencies[k + 1]!;
      const f =
        f0 > 0 && f1 > 0 ? Math.exp(Math.log(f0) + t * (Math.log(f1) - Math.log(f0))) : f0 + t * (f1 - f0);
      const m = db[k]! + t * (db[k + 1]! - db[k]!);
      return { trace: trace.name, frequencyHz: f, magnitude: 10 ** (m / 20) };
    }
  }
  return null;
}

/** The pole that decides whether oscillations grow: the complex pole with the largest σ (ω > 0). */
export function dominantOscillatoryPole(poles: PoleResult[]): PoleResult | null {
  let best: PoleResult | null = null;
  for (const p of poles) {
    if (!(p.im > 0) || p.growthPerCycle === null) continue;
    if (!best || p.re > best.re) best = p;
  }
  return best;
}

export type VerdictKind = "grows" | "decays" | "sustained" | "unknown";

export interface OscillatorVerdict {
  kind: VerdictKind;
  /** "grows ×1.17 per cycle at 1.59 kHz" */
  headline: string;
  /** The loop-gain half of the argument, or null without a loop trace. */
  loop: LoopAtZeroPhase | null;
  pole: PoleResult | null;
  /** One sentence joining both views. */
  detail: string;
}

const fmt = (x: number, d = 3) => String(Number(x.toPrecision(d)));

/** "1.59 kHz" with 3 significant digits. */
export function shortHz(f: number): string {
  const a = Math.abs(f);
  if (a >= 1e9) return `${fmt(f / 1e9)} GHz`;
  if (a >= 1e6) return `${fmt(f / 1e6)} MHz`;
  if (a >= 1e3) return `${fmt(f / 1e3)} kHz`;
  return `${fmt(f)} Hz`;
}

/** Growth per cycle this close to 1 counts as a sustained (marginal) oscillation. */
const MARGINAL = 1e-3;

/**
 * The oscillator verdict: the loop gain where its phase is zero (the Barkhausen criterion,
 * |T| ≥ 1 at ∠T = 0°) next to the dominant complex pole's growth per cycle e^(2πσ/ω).
 * Null when the result has neither a loop trace nor complex poles.
 */
export function oscillatorVerdict(result: SolveSuccess): OscillatorVerdict | null {
  const loopTrace = result.traces.find((t) => t.kind === "loop");
  const loop = loopTrace ? loopAtZeroPhase(result.frequencies, loopTrace) : null;
  const pole = result.poles ? dominantOscillatoryPole(result.poles) : null;
  if (!pole && !loop) return null;
  let kind: VerdictKind = "unknown";
  let headline = "";
  if (pole && pole.growthPerCycle !== null) {
    const g = pole.growthPerCycle;
    const at = shortHz(pole.frequencyHz);
    if (Math.abs(g - 1) <= MARGINAL) {
      kind = "sustained";
      headline = `holds its amplitude (×${fmt(g, 4)} per cycle) at ${at} — on the edge`;
    } else if (g > 1) {
      kind = "grows";
      headline = `grows ×${fmt(g)} per cycle at ${at}`;
    } else {
      kind = "decays";
      headline = `decays ×${fmt(g)} per cycle at ${at} — will not start`;
    }
  } else if (loop) {
    kind = loop.magnitude > 1 + MARGINAL ? "grows" : loop.magnitude < 1 - MARGINAL ? "decays" : "sustained";
    headline =
      kind === "grows"
        ? `loop gain ${fmt(loop.magnitude)} > 1 at ${shortHz(loop.frequencyHz)} — should start`
        : kind === "decays"
          ? `loop gain ${fmt(loop.magnitude)} < 1 at ${shortHz(loop.frequencyHz)} — will not start`
          : `loop gain ≈ 1 at ${shortHz(loop.frequencyHz)} — on the edge`;
  }
  const parts: string[] = [];
  if (loop) {
    const met = loop.magnitude >= 1;
    parts.push(
      `|${loop.trace}| = ${fmt(loop.magnitude, 4)} where ∠${loop.trace} = 0° (${shortHz(loop.frequencyHz)}): ` +
        `the Barkhausen criterion is ${met ? "met" : "not met"}.`,
    );
  } else {
    parts.push("No loop trace: add a loop cut to see the loop gain at its zero-phase frequency.");
  }
  if (pole) {
    parts.push(
      `Dominant poles σ = ${fmt(pole.re, 4)} s⁻¹, ω = ±${fmt(pole.im, 6)} rad/s` +
        (pole.re > 0 ? " lie in the right half-plane." : " lie in the left half-plane."),
    );
  } else if (result.poles) {
    parts.push("No complex poles: the network has no natural oscillation.");
  } else {
    parts.push("Add `poles` to the netlist to see the growth per cycle.");
  }
  // The steady oscillation (harmonic balance) says how it ends: the same start decision, from the poles.
  if (result.steady) parts.push(`Steady state: ${result.steady.summary}.`);
  return { kind, headline, loop, pole, detail: parts.join(" ") };
}

/** Sensitivities of one measure, largest |value| first (nulls last). */
export function rankSensitivities(rows: SensitivityResult[], measure: string): SensitivityResult[] {
  return rows
    .filter((r) => r.measure === measure)
    .sort(
      (a, b) => (b.value === null ? -1 : Math.abs(b.value)) - (a.value === null ? -1 : Math.abs(a.value)),
    );
}

/** Histogram bars: bin centres, widths and counts from the solver's edges/counts. */
export function histogramBars(
  edges: number[],
  counts: number[],
): { x: number[]; width: number[]; y: number[] } {
  const x: number[] = [];
  const width: number[] = [];
  for (let i = 0; i < counts.length; i++) {
    const a = edges[i] ?? 0;
    const b = edges[i + 1] ?? a;
    x.push((a + b) / 2);
    width.push(b - a);
  }
  return { x, width, y: counts };
}

/** Poles sorted by frequency, conjugates kept together (positive ω first). */
export function sortedPoles(poles: PoleResult[]): PoleResult[] {
  return [...poles].sort((a, b) => a.frequencyHz - b.frequencyHz || b.im - a.im);
}

export type AnalysisSection =
  | "job"
  | "verdict"
  | "poles"
  | "noise"
  | "variants"
  | "monteCarlo"
  | "sensitivity";

/**
 * Which sections the analyses panel shows for a run, in order — one rule for the panel and for the
 * run page that decides whether to frame it (an amplifier's loop without an oscillation verdict and
 * without studies shows none, so the page shows no empty panel).
 */
export function analysisSections(result: SolveSuccess | null | undefined, status: string): AnalysisSection[] {
  const out: AnalysisSection[] = [];
  if (status === "queued" || status === "running") out.push("job");
  if (!result?.ok) return out;
  const hasLoop = result.traces.some((t) => t.kind === "loop");
  const growing = (result.poles ?? []).some((p) => p.re > 0);
  // The verdict is about oscillators: shown for a circuit with a loop or a growing pole.
  const verdict = hasLoop || growing ? oscillatorVerdict(result) : null;
  if (verdict && (verdict.pole || verdict.loop)) out.push("verdict");
  if ((result.poles && result.poles.length > 0) || (result.zeros && result.zeros.length > 0))
    out.push("poles");
  if (result.noise && result.noise.length > 0) out.push("noise");
  if (result.variants && result.variants.length > 0) out.push("variants");
  if (result.monteCarlo) out.push("monteCarlo");
  if (result.sensitivity && result.sensitivity.length > 0) out.push("sensitivity");
  return out;
}
