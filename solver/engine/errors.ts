import type { NetlistError, SourceSpan } from "../types";

/** A netlist error at a statement's span (line 1 when there is none). */
export const spanError = (span: SourceSpan | undefined, message: string, hint?: string): NetlistError => ({
  line: span?.line ?? 1,
  column: span?.column ?? 1,
  endColumn: span?.endColumn ?? 2,
  message,
  ...(hint ? { hint } : {}),
});

/** An unexpected fault as a netlist error at line 1 (the solver never throws on user input). */
export function internalError(error: unknown): NetlistError {
  const detail = error instanceof Error ? error.message : String(error);
  return spanError(undefined, "the circuit could not be solved (an internal fault)", detail);
}
