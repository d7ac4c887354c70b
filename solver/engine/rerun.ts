import type { Circuit } from "../types";
import { sweepCircuit } from "./circuit-sweep";

/** The circuit with some part values replaced (no re-compilation: values are already evaluated). */
export function withValues(circuit: Circuit, values: Map<string, number>): Circuit {
  return {
    ...circuit,
    parts: circuit.parts.map((p) => (values.has(p.name) ? { ...p, value: values.get(p.name)! } : p)),
  };
}

/** Measures and checks of a circuit variant, or the first error's message. */
export function rerun(circuit: Circuit, freqs: number[]) {
  const r = sweepCircuit(circuit, freqs, []);
  return r.ok ? r.outcome : (r.errors[0]?.message ?? "the variant could not be solved");
}
