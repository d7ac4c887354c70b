/**
 * Flattening: part statements (with presets and block instances) → flat `Part`s with full dotted
 * names, global node names and evaluated values.
 */
import type { NetlistError, Part, PartKind, SourceSpan, Warning } from "../types";
import type { BlockStatement, LetStatement, OptionNode, PartStatement, PresetStatement } from "./ast";
import { evaluate, type Scope } from "./expr";
import { didYouMean } from "./hints";
import { isPartKind, KINDS, MAX_BLOCK_DEPTH } from "./kinds";
import { applyOption } from "./part-options";
import { LetScope } from "./scope";
import { own } from "./table";

interface FlattenContext {
  blocks: Map<string, BlockStatement>;
  presets: Map<string, PresetStatement>;
  global: Scope;
  partOverrides: Record<string, number>;
  errors: NetlistError[];
  warnings: Warning[];
  /** Filled in: a block terminal's dotted name ("X1.out") → the node it is connected to. */
  aliases: Map<string, string>;
  /** The netlist's temperature in kelvin (given to every diode). */
  kelvin: number;
}

/** Diode defaults (NETLIST.md "Parts that limit an oscillation"). */
const DIODE_IS = 1e-14;
const DIODE_N = 1;

/** A ccvs/cccs whose sensing part is resolved once every part exists. */
interface PendingSense {
  part: Part;
  written: string;
  prefix: string;
  span: SourceSpan;
}

interface Instance {
  prefix: string;
  nodeMap: Map<string, string>;
  scope: Scope;
  stack: string[];
}

const SENSED = new Set<PartKind>(["ccvs", "cccs"]);
const POSITIVE = new Set<PartKind>(["resistor", "capacitor", "inductor"]);

/** Flatten `statements`; returns the parts in order (duplicates and parts of unknown kind left out). */
export function flatten(statements: PartStatement[], ctx: FlattenContext): Part[] {
  const parts: Part[] = [];
  const seen = new Map<string, SourceSpan>();
  const pending: PendingSense[] = [];
  const used = new Set<string>();
  const top: Instance = { prefix: "", nodeMap: new Map(), scope: ctx.global, stack: [] };
  const visit = (list: PartStatement[], inst: Instance) => {
    // Index loops in this file: they run once per part, mostly cold (see the note in tokens.ts above `lex`).
    for (let k = 0; k < list.length; k++) {
      const st = list[k]!;
      const fullName = inst.prefix + st.name.name;
      // A repeated name was reported by the parser (parser.ts, duplicateName); keep the first.
      if (seen.has(fullName)) continue;
      seen.set(fullName, st.name.span);
      const block = ctx.blocks.get(st.kind.name);
      if (block !== undefined) {
        used.add(block.name.name);
        const child = enterBlock(st, block, inst, ctx);
        if (child !== null)
          visit(
            block.body.filter((s): s is PartStatement => s.type === "part"),
            child,
          );
        continue;
      }
      const part = primitive(st, fullName, inst, ctx);
      if (part === null) continue;
      parts.push(part);
      if (SENSED.has(part.kind))
        pending.push({
          part,
          written: st.terminals[2]!.name,
          prefix: inst.prefix,
          span: st.terminals[2]!.span,
        });
    }
  };
  visit(statements, top);
  resolveSenses(parts, pending, ctx.errors);
  for (const [name, block] of ctx.blocks) {
    if (!used.has(name))
      ctx.warnings.push({ line: block.span.line, message: `block \`${name}\` is defined but never used` });
  }
  return parts;
}

function resolveNode(name: string, inst: Instance): string {
  if (name === "gnd") return "gnd";
  return inst.nodeMap.get(name) ?? inst.prefix + name;
}

/** The global names of the first `count` terminals (an array literal for two: made at its size). */
function resolveNodes(terminals: PartStatement["terminals"], count: number, inst: Instance): string[] {
  const n = Math.min(count, terminals.length);
  if (n === 2) return [resolveNode(terminals[0]!.name, inst), resolveNode(terminals[1]!.name, inst)];
  const nodes: string[] = [];
  for (let i = 0; i < n; i++) nodes.push(resolveNode(terminals[i]!.name, inst));
  return nodes;
}

function enterBlock(
  st: PartStatement,
  block: BlockStatement,
  inst: Instance,
  ctx: FlattenContext,
): Instance | null {
  const name = block.name.name;
  if (inst.stack.includes(name)) {
    const cycle = [...inst.stack.slice(inst.stack.indexOf(name)), name].join(" → ");
    ctx.errors.push({ ...st.kind.span, message: `block \`${name}\` uses itself`, hint: cycle });
    return null;
  }
  if (inst.stack.length >= MAX_BLOCK_DEPTH) {
    ctx.errors.push({
      ...st.kind.span,
      message: `blocks are nested more than ${MAX_BLOCK_DEPTH} deep here`,
      hint: inst.stack.join(" → "),
    });
    return null;
  }
  if (st.terminals.length !== block.terminals.length) {
    ctx.errors.push({
      ...st.span,
      message: `block \`${name}\` has ${block.terminals.length} terminals, found ${st.terminals.length}`,
    });
    return null;
  }
  const nodeMap = new Map<string, string>();
  block.terminals.forEach((t, i) => {
    const outer = resolveNode(st.terminals[i]!.name, inst);
    nodeMap.set(t.name, outer);
    ctx.aliases.set(`${inst.prefix}${st.name.name}.${t.name}`, outer);
  });
  const values = new Map<string, number>();
  for (const p of block.params) {
    const v = evaluate(p.value, ctx.global, ctx.errors);
    if (v !== null) values.set(p.key, v);
  }
  const known = block.params.map((p) => p.key);
  for (const o of st.options) {
    if (!known.includes(o.key)) {
      ctx.errors.push({
        ...o.keySpan,
        message: `block \`${name}\` has no parameter \`${o.key}\``,
        hint:
          didYouMean(o.key, known) ??
          (known.length ? `parameters: ${known.join(", ")}` : "this block takes no parameters"),
      });
      continue;
    }
    const v = evaluate(o.value, inst.scope, ctx.errors);
    if (v !== null) values.set(o.key, v);
  }
  const lets = block.body.filter((s): s is LetStatement => s.type === "let");
  const scope = new LetScope(lets, values, ctx.global, ctx.errors);
  scope.evaluateAll();
  return { prefix: `${inst.prefix}${st.name.name}.`, nodeMap, scope, stack: [...inst.stack, name] };
}

function primitive(st: PartStatement, fullName: string, inst: Instance, ctx: FlattenContext): Part | null {
  const builtIn = isPartKind(st.kind.name);
  const preset = builtIn ? undefined : ctx.presets.get(st.kind.name);
  const kind: PartKind | null = builtIn ? (st.kind.name as PartKind) : (preset?.kind.base ?? null);
  if (kind === null) {
    ctx.errors.push({ ...st.kind.span, message: `unknown part kind \`${st.kind.name}\`` });
    return null;
  }
  const info = KINDS[kind];
  const nodeCount = SENSED.has(kind) ? 2 : info.terminals.length;
  const nodes = resolveNodes(st.terminals, nodeCount, inst);
  const written = st.value === null ? info.defaultValue : evaluate(st.value, inst.scope, ctx.errors);
  const value = own(ctx.partOverrides, fullName) ?? written ?? Number.NaN;
  if (POSITIVE.has(kind) && written !== null && !(value > 0)) {
    ctx.errors.push({
      ...(st.value?.span ?? st.span),
      message: `a ${kind}'s value must be above zero, got ${value}`,
    });
  }
  const part: Part = { name: fullName, kind, nodes, value, span: st.span };
  if (kind === "diode") part.diode = { is: DIODE_IS, n: DIODE_N, kelvin: ctx.kelvin };
  // Preset options first, the line's own options override them.
  if (preset !== undefined)
    for (let i = 0; i < preset.options.length; i++)
      optionOf(part, preset.options[i]!, ctx.global, ctx.errors);
  for (let i = 0; i < st.options.length; i++) optionOf(part, st.options[i]!, inst.scope, ctx.errors);
  // A part whose value or options failed still takes part in the structure checks; its errors fail the compile.
  return part;
}

function optionOf(part: Part, o: OptionNode, scope: Scope, errors: NetlistError[]): void {
  const v = evaluate(o.value, scope, errors);
  if (v !== null) applyOption(part, o.key, v, o.value, errors);
}

function resolveSenses(parts: Part[], pending: PendingSense[], errors: NetlistError[]): void {
  if (pending.length === 0) return;
  const byName = new Map(parts.map((p) => [p.name, p]));
  for (const p of pending) {
    const target = byName.get(p.prefix + p.written) ?? byName.get(p.written);
    if (target === undefined) {
      errors.push({
        ...p.span,
        message: `no part named \`${p.written}\` to sense`,
        hint:
          didYouMean(p.written, [...byName.keys()]) ??
          `a ${p.part.kind} senses the current of a vsource or an inductor`,
      });
      continue;
    }
    if (target.kind !== "vsource" && target.kind !== "inductor") {
      errors.push({
        ...p.span,
        message: `a ${p.part.kind} senses the current of a vsource or an inductor; \`${target.name}\` is a ${target.kind}`,
        hint: "add a 0 V vsource in series with the branch and sense that",
      });
      continue;
    }
    p.part.sense = target.name;
  }
}
