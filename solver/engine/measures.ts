import type { MeasureDef, MeasureResult } from "../types";
import { formatHz } from "./ac";
import { type NoiseSampler, noiseMeasure } from "./noise-measures";
import {
  at,
  bandwidth,
  deg,
  extremum,
  flatReason,
  isFlat,
  mag,
  magnitudeCrossing,
  type Outcome,
  phaseCrossing,
  range,
  SolveFailed,
  type TraceSampler,
  wrapDeg,
} from "./refine";
import { groupDelayOf } from "./trace";

const UNITS: Record<MeasureDef["fn"], string> = {
  "zero-phase": "Hz",
  crossing: "Hz",
  peak: "Hz",
  dip: "Hz",
  bandwidth: "Hz",
  q: "",
  unity: "Hz",
  "phase-margin": "deg",
  "gain-margin": "dB",
  mag: "",
  db: "dB",
  phase: "deg",
  "group-delay": "s",
  noise: "V/√Hz",
  "input-noise": "V/√Hz",
  frequency: "Hz",
  amplitude: "V",
  thd: "%",
  startup: "s",
};

/** The unit of one measure's value (a noise over a band is volts rms, at a frequency V/√Hz). */
const unitOf = (def: MeasureDef) => (def.band ? "V" : UNITS[def.fn]);

/** A crossing's outcome: the frequency, or why there is none (rounding named as such). */
function crossed(c: { f: number | null; rounding: boolean }, none: string): Outcome {
  if (c.f !== null) return { value: c.f };
  if (c.rounding) return { reason: `${none}: it meets the level only within rounding (about 1e-10)` };
  return { reason: none };
}

/** The function of one measure (no `at` resolution); F is the resolved frequency if any. */
function evaluate(def: MeasureDef, tr: TraceSampler, atHz: number | null): Outcome {
  switch (def.fn) {
    case "zero-phase":
      return crossed(phaseCrossing(tr, 0), `∠${tr.name} does not cross 0° ${range(tr)}`);
    case "crossing": {
      const lv = def.level;
      if (!lv) return { reason: "crossing needs a level" };
      if (lv.kind === "deg") {
        return crossed(phaseCrossing(tr, lv.value), `∠${tr.name} does not cross ${lv.value}° ${range(tr)}`);
      }
      const target = lv.kind === "db" ? 10 ** (lv.value / 20) : lv.kind === "mag" ? lv.value : Math.SQRT1_2;
      if (!(target > 0)) return { reason: "a magnitude level must be positive" };
      const text = lv.kind === "db" ? `${lv.value} dB` : lv.kind === "mag" ? `${lv.value}` : "half power";
      return crossed(magnitudeCrossing(tr, target), `|${tr.name}| does not cross ${text} ${range(tr)}`);
    }
    case "peak":
      return isFlat(tr) ? { reason: flatReason(tr, "no peak") } : { value: extremum(tr, 1).f };
    case "dip":
      return isFlat(tr) ? { reason: flatReason(tr, "no dip") } : { value: extremum(tr, -1).f };
    case "bandwidth":
      return bandwidth(tr, def.level);
    case "q": {
      const bw = bandwidth(tr, def.level);
      if ("reason" in bw) return bw;
      return { value: extremum(tr, 1).f / bw.value };
    }
    case "unity":
      return crossed(magnitudeCrossing(tr, 1), `|${tr.name}| does not cross 1 ${range(tr)}`);
    case "phase-margin": {
      const c = crossed(magnitudeCrossing(tr, 1), `|${tr.name}| does not cross 1 ${range(tr)}`);
      if ("reason" in c) return { reason: `${c.reason}, so there is no phase margin` };
      const f = c.value;
      const x = at(tr, f);
      return { value: Math.abs(wrapDeg(deg(x.re, x.im))) };
    }
    case "gain-margin": {
      const c = crossed(phaseCrossing(tr, 0), `∠${tr.name} does not cross 0° ${range(tr)}`);
      if ("reason" in c) return { reason: `${c.reason}, so there is no gain margin` };
      const f = c.value;
      const x = at(tr, f);
      return { value: -20 * Math.log10(mag(x.re, x.im)) };
    }
    case "group-delay": {
      if (atHz === null) return { reason: `group-delay(${tr.name}) needs "at" and a frequency` };
      if (!(atHz > 0) || !Number.isFinite(atHz))
        return { reason: `${formatHz(atHz)} is not a positive frequency` };
      const tau = groupDelayOf(at(tr, atHz, true));
      return tau === null
        ? { reason: `${tr.name} is zero at ${formatHz(atHz)}: its phase has no slope` }
        : { value: tau };
    }
    case "noise":
    case "input-noise":
      return { reason: `${def.target} is not a noise` };
    case "mag":
    case "db":
    case "phase": {
      if (atHz === null) return { reason: `${def.fn}(${tr.name}) needs "at" and a frequency` };
      if (!(atHz > 0) || !Number.isFinite(atHz))
        return { reason: `${formatHz(atHz)} is not a positive frequency` };
      const x = at(tr, atHz);
      if (def.fn === "mag") return { value: mag(x.re, x.im) };
      if (def.fn === "db") return { value: 20 * Math.log10(mag(x.re, x.im)) };
      return { value: deg(x.re, x.im) };
    }
    default:
      // frequency, amplitude, thd, startup: read from the steady oscillation (engine/steady).
      return { reason: `${def.fn} is read from the steady oscillation: add \`steady LOOP\`` };
  }
}

/**
 * Every measure in order (a measure may name an earlier one as its frequency). Never throws:
 * a measure without an answer gets value null and a reason.
 */
export function computeMeasures(
  defs: MeasureDef[],
  traces: Map<string, TraceSampler>,
  /** The steady measures' outcomes (engine/steady/measures.ts); null for every other measure. */
  steady: (def: MeasureDef) => Outcome | null = () => null,
  noises: Map<string, NoiseSampler> = new Map(),
): MeasureResult[] {
  const out: MeasureResult[] = [];
  const byName = new Map<string, MeasureResult>();
  const hzOf = (ref: { hz: number } | { measure: string }): number | string => {
    if ("hz" in ref) return ref.hz;
    const m = byName.get(ref.measure);
    if (!m) return `no earlier measure named ${ref.measure}`;
    if (m.value === null) return `${m.name} has no value (${m.reason})`;
    return m.value;
  };
  for (const def of defs) {
    const unit = unitOf(def);
    let res: MeasureResult;
    const tr = traces.get(def.target);
    const ns = noises.get(def.target);
    const fromSteady = steady(def);
    if (fromSteady !== null) {
      res =
        "value" in fromSteady && Number.isFinite(fromSteady.value)
          ? { name: def.name, value: fromSteady.value, unit, reason: null }
          : {
              name: def.name,
              value: null,
              unit,
              reason: "reason" in fromSteady ? fromSteady.reason : "no finite value",
            };
    } else if (!tr && !ns) {
      res = { name: def.name, value: null, unit, reason: `no trace or loop named ${def.target}` };
    } else {
      const atRef = def.at ? hzOf(def.at) : null;
      const from = def.band ? hzOf(def.band.from) : null;
      const to = def.band ? hzOf(def.band.to) : null;
      const reason = [atRef, from, to].find((x): x is string => typeof x === "string") ?? null;
      const atHz = typeof atRef === "number" ? atRef : null;
      if (reason !== null) res = { name: def.name, value: null, unit, reason };
      else {
        let o: Outcome;
        try {
          if (ns) {
            const band = typeof from === "number" && typeof to === "number" ? { from, to } : null;
            o = noiseMeasure(ns, def.fn === "input-noise", atHz, band);
          } else o = evaluate(def, tr!, atHz);
        } catch (e) {
          if (!(e instanceof SolveFailed)) throw e;
          o = { reason: e.message };
        }
        res =
          "value" in o && Number.isFinite(o.value)
            ? { name: def.name, value: o.value, unit, reason: null }
            : { name: def.name, value: null, unit, reason: "reason" in o ? o.reason : "no finite value" };
      }
    }
    out.push(res);
    byName.set(def.name, res);
  }
  return out;
}
