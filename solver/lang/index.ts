/**
 * The netlist language: text → parse tree → flat `Circuit` (solver/types.ts), with every error of
 * the netlist at once (line, column, endColumn, message, hint) and warnings about the structure.
 */

import { DEFAULT_KELVIN } from "../physics";
import type { Circuit, NetlistError, Warning } from "../types";
import type {
  BlockStatement,
  LetStatement,
  ParseTree,
  PartStatement,
  PresetStatement,
  Statement,
} from "./ast";
import { resolveLoops, resolveShows, resolveSweep } from "./directives";
import { addFixes } from "./fixes";
import { didYouMean } from "./hints";
import { resolveChecks, resolveMeasures, resolveMonteCarlo, resolveVary } from "./measures";
import { resolveNoise, resolveZeros } from "./noise-zeros";
import { parseNetlist } from "./parser";
import { flatten } from "./parts";
import type { DirectiveContext } from "./resolve";
import { LetScope } from "./scope";
import { resolveSteady } from "./steady";
import { checkTopology } from "./topology";

export type { ParseTree, Statement } from "./ast";
export { E_SERIES, type SeriesName, seriesValues, snap } from "./eseries";
export { BUILTIN_NAMES } from "./expr";
export { KEYWORDS, KIND_NAMES, KINDS, MEASURE_FUNCTIONS, measureUnit } from "./kinds";
export { applyFixes, rewriteLegacyNetlist } from "./rewrite";
export { type LogicalLine, lex, type Token } from "./tokens";

export interface CompileOverrides {
  /** Replace a top-level `let`'s value by name. */
  lets?: Record<string, number>;
  /** Replace a part's value by its full name ("Rf", "X1.R1"), in SI base units. */
  parts?: Record<string, number>;
}

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
    return sorted.length > 0 || circuit === null
      ? { ok: false, errors: sorted, warnings }
      : { ok: true, circuit, warnings };
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

type Of<T extends Statement["type"]> = Extract<Statement, { type: T }>;

function byType<T extends Statement["type"]>(statements: Statement[], type: T): Of<T>[] {
  return statements.filter((s): s is Of<T> => s.type === type);
}

/** Register names once; a repeat is an error pointing at the earlier line. */
function unique<T extends { name: { name: string; span: { line: number } } }>(
  list: T[],
  what: string,
  errors: NetlistError[],
): Map<string, T> {
  const map = new Map<string, T>();
  for (const item of list) {
    const earlier = map.get(item.name.name);
    if (earlier) {
      errors.push({
        ...(item.name.span as NetlistError),
        message: `${what} \`${item.name.name}\` is already defined on line ${earlier.name.span.line}`,
      });
    } else {
      map.set(item.name.name, item);
    }
  }
  return map;
}

function once<T extends { span: { line: number } }>(
  list: T[],
  what: string,
  errors: NetlistError[],
): T | undefined {
  for (const extra of list.slice(1)) {
    errors.push({
      ...(extra.span as NetlistError),
      message: `only one ${what} statement is allowed (the first is on line ${list[0]!.span.line})`,
    });
  }
  return list[0];
}

function elaborate(
  tree: ParseTree,
  overrides: CompileOverrides,
  errors: NetlistError[],
  warnings: Warning[],
): Circuit | null {
  const st = tree.statements;
  const title = once(byType(st, "title"), "title", errors);
  const lets = unique<LetStatement>(byType(st, "let"), "let", errors);
  const blocks = unique<BlockStatement>(byType(st, "block"), "block", errors);
  const presets = unique<PresetStatement>(byType(st, "preset"), "preset", errors);
  for (const [name, p] of presets) {
    if (blocks.has(name))
      errors.push({ ...p.name.span, message: `\`${name}\` names both a preset and a block` });
  }
  const fixed = new Map<string, number>();
  for (const [name, value] of Object.entries(overrides.lets ?? {})) {
    if (!lets.has(name))
      errors.push({ line: 1, column: 1, endColumn: 2, message: `no let named \`${name}\` to replace` });
    else if (Number.isFinite(value)) fixed.set(name, value);
  }
  const global = new LetScope([...lets.values()], fixed, null, errors);
  global.evaluateAll();
  const aliases = new Map<string, string>();
  const temperature = once(byType(st, "temperature"), "temperature", errors);
  const kelvin = temperature?.kelvin ?? DEFAULT_KELVIN;
  const parts = flatten(byType(st, "part") as PartStatement[], {
    blocks,
    presets,
    global,
    partOverrides: overrides.parts ?? {},
    errors,
    warnings,
    aliases,
    kelvin,
  });
  for (const name of Object.keys(overrides.parts ?? {})) {
    if (!parts.some((p) => p.name === name))
      errors.push({ line: 1, column: 1, endColumn: 2, message: `no part named \`${name}\` to replace` });
  }
  const nodeSet = new Set<string>();
  for (const p of parts) for (const n of p.nodes) if (n !== "gnd") nodeSet.add(n);
  const nodes = [...nodeSet]; // first-seen order
  // Structure checks only make sense on a complete, error-free part list.
  if (errors.length === 0) checkTopology(parts, errors, warnings);

  const ctx: DirectiveContext = {
    parts,
    nodes: nodeSet,
    aliases,
    global,
    lets: new Set(lets.keys()),
    errors,
    warnings,
  };
  const sweepStatement = once(byType(st, "sweep"), "sweep", errors);
  const { sweep, defaultSweep } = resolveSweep(sweepStatement, ctx);
  const traces = new Map<string, { line: number; column: number; endColumn: number }>();
  const shows = resolveShows(byType(st, "show"), ctx, traces);
  const loops = resolveLoops(byType(st, "loop"), ctx, traces);
  const measureStatements = byType(st, "measure");
  const noise = resolveNoise(byType(st, "noise"), ctx, traces);
  const zeros = resolveZeros(byType(st, "zeros"), ctx);
  const steady = resolveSteady(once(byType(st, "steady"), "steady", errors), ctx, loops);
  const measures = resolveMeasures(measureStatements, ctx, traces, steady, new Set(noise.map((n) => n.name)));
  const checks = resolveChecks(byType(st, "check"), ctx, measureStatements);
  const varyStatement = once(byType(st, "vary"), "vary", errors);
  const vary = varyStatement ? resolveVary(varyStatement, ctx) : null;
  const mcStatement = once(byType(st, "monte-carlo"), "monte-carlo", errors);
  const monteCarlo = mcStatement ? resolveMonteCarlo(mcStatement, ctx) : null;
  const sensitivity = byType(st, "sensitivity").flatMap((s) => {
    if (measureStatements.some((m) => m.name.name === s.measure.name))
      return [{ measure: s.measure.name, span: s.span }];
    errors.push({
      ...s.measure.span,
      message: `no measure named \`${s.measure.name}\``,
      hint: didYouMeanMeasure(s.measure.name, measureStatements),
    });
    return [];
  });
  return {
    title: title?.text ?? null,
    parts,
    nodes,
    sweep,
    defaultSweep,
    ...(sweepStatement ? { sweepSpan: sweepStatement.span } : {}),
    shows,
    loops,
    measures,
    checks,
    vary,
    monteCarlo,
    poles: byType(st, "poles").length > 0,
    sensitivity,
    ...(noise.length > 0 ? { noise } : {}),
    ...(zeros.length > 0 ? { zeros } : {}),
    temperature: kelvin,
    steady,
  };
}

function didYouMeanMeasure(name: string, measures: Of<"measure">[]): string {
  return (
    didYouMean(
      name,
      measures.map((m) => m.name.name),
    ) ?? "name a measure with `measure NAME = …` first"
  );
}
