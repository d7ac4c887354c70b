/** Shared pieces of the analysis-statement resolution: the context and value helpers. */
import type { NetlistError, Part, SourceSpan, Warning } from "../types";
import type { Named, Statement, ValueNode } from "./ast";
import { evaluate, type Scope } from "./expr";
import { type Place, unitMismatch } from "./places";

export type Of<T extends Statement["type"]> = Extract<Statement, { type: T }>;

export interface DirectiveContext {
  parts: Part[];
  nodes: Set<string>;
  /** Block terminals by dotted name ("X1.out") → the node they connect to. */
  aliases: Map<string, string>;
  global: Scope;
  lets: Set<string>;
  errors: NetlistError[];
  warnings: Warning[];
}

export function err(ctx: DirectiveContext, span: SourceSpan, message: string, hint?: string): null {
  ctx.errors.push(hint === undefined ? { ...span, message } : { ...span, message, hint });
  return null;
}

export function num(ctx: DirectiveContext, v: ValueNode, place: Place): number | null {
  if (v.kind === "number") {
    const mismatch = unitMismatch(v.unit, place);
    if (mismatch) return err(ctx, v.span, mismatch.message, mismatch.hint);
  }
  return evaluate(v, ctx.global, ctx.errors);
}

export function count(
  ctx: DirectiveContext,
  v: ValueNode,
  what: string,
  min: number,
  max: number,
): number | null {
  const n = num(ctx, v, "count");
  if (n === null) return null;
  if (!Number.isInteger(n) || n < min || n > max) {
    return err(ctx, v.span, `${what} must be a whole number from ${min} to ${max}, got ${n}`);
  }
  return n;
}

export function frequency(ctx: DirectiveContext, v: ValueNode): number | null {
  const f = num(ctx, v, "frequency");
  if (f === null) return null;
  if (!(f > 0))
    return err(
      ctx,
      v.span,
      `a frequency must be above 0 Hz, got ${f}`,
      "start a little above zero, e.g. 1Hz",
    );
  return f;
}

export function claim(
  ctx: DirectiveContext,
  names: Map<string, SourceSpan>,
  n: Named,
  what: string,
): boolean {
  const earlier = names.get(n.name);
  if (earlier) {
    err(
      ctx,
      n.span,
      `a ${what} named \`${n.name}\` already exists (line ${earlier.line})`,
      `give each ${what} its own name`,
    );
    return false;
  }
  names.set(n.name, n.span);
  return true;
}
