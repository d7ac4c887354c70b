/** The steady measures (`frequency`, `amplitude`, `thd`, `startup`) read from a steady result. */
import type { MeasureDef, SteadyResult } from "../../types";
import type { Outcome } from "../refine";
import { probeText } from "./readings";

const STEADY = new Set(["frequency", "amplitude", "thd", "startup"]);

/** The outcome of a steady measure, or null when `def` is not one. */
export function steadyMeasure(def: MeasureDef, steady: SteadyResult | undefined): Outcome | null {
  if (!STEADY.has(def.fn)) return null;
  if (!steady) return { reason: `${def.fn} needs a \`steady\` statement` };
  if (steady.reason !== null) return { reason: steady.reason };
  switch (def.fn) {
    case "frequency":
      return steady.frequencyHz === null ? { reason: "no steady frequency" } : { value: steady.frequencyHz };
    case "startup":
      return steady.startup?.seconds == null
        ? { reason: "the steady amplitude is below the start level" }
        : { value: steady.startup.seconds };
    default: {
      const text = def.probe ? probeText(def.probe) : def.target;
      const p = steady.probes.find((q) => q.probe === text);
      if (!p) return { reason: `${text} was not read in the steady state` };
      return def.fn === "amplitude" ? { value: p.amplitudes[0] ?? 0 } : { value: p.thdPercent };
    }
  }
}
