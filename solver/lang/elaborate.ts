/**
 * Elaboration: a parse tree → a flat `Circuit` (solver/types.ts). Declarations first (lets, blocks,
 * presets, temperature), then the parts flattened and checked, then the directives.
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
import { didYouMean } from "./hints";
import { resolveChecks, resolveMeasures, resolveMonteCarlo, resolveVary } from "./measures";
import { resolveNoise, resolveZeros } from "./noise-zeros";
import { flatten } from "./parts";
import type { DirectiveContext } from "./resolve";
import { LetScope } from "./scope";
import { resolveSteady } from "./steady";
import { checkTopology } from "./topology";

export interface CompileOverrides {
  /** Replace a top-level `let`'s value by name. */
  lets?: Record<string, number>;
  /** Replace a part's value by its full name ("Rf", "X1.R1"), in SI base units. */
  parts?: Record<string, number>;
}

type Of<T extends Statement["type"]> = Extract<Statement, { type: T }>;

/**
 * The statements of each type, in order, gathered in one pass (the netlist's statements are read
 * once here, not once per type: this runs mostly cold, see the note in tokens.ts above `lex`).
 */
class ByType {
  private readonly groups = new Map<Statement["type"], Statement[]>();

  constructor(statements: Statement[]) {
    for (let i = 0; i < statements.length; i++) {
      const s = statements[i]!;
      const group = this.groups.get(s.type);
      if (group === undefined) this.groups.set(s.type, [s]);
      else group.push(s);
    }
  }

  /** The statements of `type`, a new array each time. */
  of<T extends Statement["type"]>(type: T): Of<T>[] {
    const group = this.groups.get(type);
    return group === undefined ? [] : (group.slice() as Of<T>[]);
  }
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

/**
 * Elaborate a parse tree into a flat `Circuit`: the declarations and parts (blocks flattened, lets
 * evaluated, overrides applied), then the directives read against them. Errors and warnings are
 * appended to the lists given (the circuit is only used when there are no errors).
 */
export function elaborate(
  tree: ParseTree,
  overrides: CompileOverrides,
  errors: NetlistError[],
  warnings: Warning[],
): Circuit {
  const st = new ByType(tree.statements);
  const title = once(st.of("title"), "title", errors);
  const network = elaborateNetwork(st, overrides, errors, warnings);
  const { parts, nodes, temperature } = network.circuit;
  const { steady, ...directives } = resolveDirectives(st, network.ctx);
  return { title: title?.text ?? null, parts, nodes, ...directives, temperature, steady };
}

/** The circuit's parts and nodes, and the context its directives are read in. */
function elaborateNetwork(
  st: ByType,
  overrides: CompileOverrides,
  errors: NetlistError[],
  warnings: Warning[],
): { circuit: Pick<Circuit, "parts" | "nodes" | "temperature">; ctx: DirectiveContext } {
  const lets = unique<LetStatement>(st.of("let"), "let", errors);
  const blocks = unique<BlockStatement>(st.of("block"), "block", errors);
  const presets = unique<PresetStatement>(st.of("preset"), "preset", errors);
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
  const temperature = once(st.of("temperature"), "temperature", errors);
  const kelvin = temperature?.kelvin ?? DEFAULT_KELVIN;
  const parts = flatten(st.of("part") as PartStatement[], {
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
  for (let k = 0; k < parts.length; k++) {
    const nodes = parts[k]!.nodes;
    for (let i = 0; i < nodes.length; i++) if (nodes[i] !== "gnd") nodeSet.add(nodes[i]!);
  }
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
  return { circuit: { parts, nodes, temperature: kelvin }, ctx };
}

/** The directives (sweep, shows, loops, measures, checks, studies) read against the network. */
function resolveDirectives(st: ByType, ctx: DirectiveContext) {
  const errors = ctx.errors;
  const sweepStatement = once(st.of("sweep"), "sweep", errors);
  const { sweep, defaultSweep } = resolveSweep(sweepStatement, ctx);
  const traces = new Map<string, { line: number; column: number; endColumn: number }>();
  const shows = resolveShows(st.of("show"), ctx, traces);
  const loops = resolveLoops(st.of("loop"), ctx, traces);
  const measureStatements = st.of("measure");
  const noise = resolveNoise(st.of("noise"), ctx, traces);
  const zeros = resolveZeros(st.of("zeros"), ctx);
  const steady = resolveSteady(once(st.of("steady"), "steady", errors), ctx, loops);
  const measures = resolveMeasures(measureStatements, ctx, traces, steady, new Set(noise.map((n) => n.name)));
  const checks = resolveChecks(st.of("check"), ctx, measureStatements);
  const varyStatement = once(st.of("vary"), "vary", errors);
  const vary = varyStatement ? resolveVary(varyStatement, ctx) : null;
  const mcStatement = once(st.of("monte-carlo"), "monte-carlo", errors);
  const monteCarlo = mcStatement ? resolveMonteCarlo(mcStatement, ctx) : null;
  const sensitivity = st.of("sensitivity").flatMap((s) => {
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
    sweep,
    defaultSweep,
    ...(sweepStatement ? { sweepSpan: sweepStatement.span } : {}),
    shows,
    loops,
    measures,
    checks,
    vary,
    monteCarlo,
    poles: st.of("poles").length > 0,
    sensitivity,
    ...(noise.length > 0 ? { noise } : {}),
    ...(zeros.length > 0 ? { zeros } : {}),
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
