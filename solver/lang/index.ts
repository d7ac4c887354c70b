/**
 * The netlist language: text → parse tree → flat `Circuit` (solver/types.ts), with every error of
 * the netlist at once (line, column, endColumn, message, hint) and warnings about the structure.
 */

import type { Circuit, NetlistError, Warning } from "../types";
import type { ParseTree } from "./ast";
import { type CompileOverrides, elaborate } from "./elaborate";
import { addFixes } from "./fixes";
import { parseNetlist } from "./parser";

export type { ParseTree, Statement } from "./ast";
export type { CompileOverrides } from "./elaborate";
export { E_SERIES, type SeriesName, seriesValues, snap } from "./eseries";
export { BUILTIN_NAMES } from "./expr";
export { KEYWORDS, KIND_NAMES, KINDS, MEASURE_FUNCTIONS, measureUnit } from "./kinds";
export { applyFixes, rewriteLegacyNetlist } from "./rewrite";
export { type LogicalLine, lex, type Token } from "./tokens";

export type CompileResult =
  | { ok: true; circuit: Circuit; warnings: Warning[] }
  | { ok: false; errors: NetlistError[]; warnings: Warning[] };

/** Parse only (for editor completion and hover). Never throws. */
export function parse(text: string): { tree: ParseTree; errors: NetlistError[] } {
  try {
    const source = typeof text === "string" ? text : "";
    const { tree, errors } = parseNetlist(source);
    addFixes(source, errors);
    return { tree, errors: tidy(errors) };
  } catch (error) {
    return { tree: { statements: [] }, errors: [internal(error)] };
  }
}

/**
 * Compile netlist text into a `Circuit`. All errors are returned together, sorted by place; the
 * result is ok only when there are none. Never throws: a surprise becomes an error at line 1.
 */
export function compile(text: string, overrides: CompileOverrides = {}): CompileResult {
  const warnings: Warning[] = [];
  try {
    const source = typeof text === "string" ? text : "";
    const { tree, errors } = parseCached(source);
    const circuit = elaborate(tree, overrides, errors, warnings);
    addFixes(source, errors);
    const sorted = tidy(errors);
    return sorted.length > 0 ? { ok: false, errors: sorted, warnings } : { ok: true, circuit, warnings };
  } catch (error) {
    return { ok: false, errors: [internal(error)], warnings };
  }
}

/**
 * The last text's parse, reused when the same text is compiled again with other overrides (vary,
 * studies). Elaboration never mutates the tree; the error list is copied because it grows.
 */
let lastParse: { text: string; tree: ParseTree; errors: NetlistError[] } | null = null;

function parseCached(text: string): { tree: ParseTree; errors: NetlistError[] } {
  if (lastParse?.text !== text) lastParse = { text, ...parseNetlist(text) };
  return { tree: lastParse.tree, errors: [...lastParse.errors] };
}

function internal(error: unknown): NetlistError {
  const detail = error instanceof Error ? error.message : String(error);
  return {
    line: 1,
    column: 1,
    endColumn: 2,
    message: "the netlist could not be read (an internal fault)",
    hint: detail,
  };
}

/** Drop repeats (a block's errors come once per instance) and sort by place. */
function tidy(errors: NetlistError[]): NetlistError[] {
  const seen = new Set<string>();
  return errors
    .filter((e) => {
      const key = `${e.line}:${e.column}:${e.message}`;
      if (seen.has(key)) return false;
      seen.add(key);
      return true;
    })
    .sort((a, b) => a.line - b.line || a.column - b.column);
}
