/**
 * What the run page draws of a result (client-safe: types and one pure function). A saved trace
 * keeps its complex values (re/im) for export and comparison, but no chart on the page reads them:
 * the page hands its client components this form, which leaves them out of the page's payload
 * (for a 10 000-point, 8-trace run that is about a third of the data the page would ship).
 */
import type { SolveSuccess, TraceResult, VariantResult } from "@/solver/types";

export type DrawnTrace = Omit<TraceResult, "re" | "im">;
export type DrawnVariant = Omit<VariantResult, "traces"> & { traces: DrawnTrace[] };
export type DrawnResult = Omit<SolveSuccess, "traces" | "variants"> & {
  traces: DrawnTrace[];
  variants?: DrawnVariant[];
};

function drawnTrace({ re: _re, im: _im, ...drawn }: TraceResult): DrawnTrace {
  return drawn;
}

/** The result without the traces' complex values (the variants' traces too). */
export function drawnResult(result: SolveSuccess): DrawnResult {
  const { traces, variants, ...rest } = result;
  return {
    ...rest,
    traces: traces.map(drawnTrace),
    ...(variants ? { variants: variants.map((v) => ({ ...v, traces: v.traces.map(drawnTrace) })) } : {}),
  };
}
