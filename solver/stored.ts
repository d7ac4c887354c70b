/**
 * The storage form of a result: traces keep only their complex samples (re, im); the derived
 * magnitude (dB) and phase (degrees) columns are rebuilt on load by the same function the engine
 * uses, so a stored run reads back exactly as it was solved at about half the bytes.
 */
import { makeTrace } from "./engine/trace";
import type { SolveSuccess, TraceResult, VariantResult } from "./types";

export type StoredTrace = Pick<TraceResult, "name" | "kind" | "re" | "im" | "groupDelay">;

export type StoredResult = Omit<SolveSuccess, "traces" | "variants"> & {
  /** Marks the compact form (results saved before it existed hold full traces). */
  storage: "re-im";
  traces: StoredTrace[];
  variants?: (Omit<VariantResult, "traces"> & { traces: StoredTrace[] })[];
};

/** The group delay is kept: it comes from dX/ds, which re/im alone cannot give back. */
const strip = (t: TraceResult): StoredTrace => ({
  name: t.name,
  kind: t.kind,
  re: t.re,
  im: t.im,
  ...(t.groupDelay ? { groupDelay: t.groupDelay } : {}),
});

const rebuild = (t: StoredTrace | TraceResult): TraceResult =>
  "magnitudeDb" in t && t.magnitudeDb ? t : makeTrace(t.name, t.kind, t.re, t.im, t.groupDelay);

/** The result without its derived trace columns. */
export function compactResult(result: SolveSuccess): StoredResult {
  const { variants, traces, ...rest } = result;
  return {
    ...rest,
    storage: "re-im",
    traces: traces.map(strip),
    ...(variants ? { variants: variants.map((v) => ({ ...v, traces: v.traces.map(strip) })) } : {}),
  };
}

/** The full result JSON of a stored result (either form). */
export function expandResult(stored: StoredResult | SolveSuccess): SolveSuccess {
  const { variants, traces, ...rest } = stored as StoredResult;
  const { storage: _storage, ...plain } = rest as typeof rest & { storage?: string };
  return {
    ...plain,
    traces: traces.map(rebuild),
    ...(variants ? { variants: variants.map((v) => ({ ...v, traces: v.traces.map(rebuild) })) } : {}),
  };
}
