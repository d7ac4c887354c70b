/**
 * Values and `let` expressions. Expressions are parsed by mathjs after numbers with SI prefixes are
 * rewritten to plain numbers; the tree is then evaluated here over real numbers with a fixed set of
 * functions, so no name outside the netlist's lets, block parameters, `pi`, `e` and the functions
 * below can be reached.
 */
// mathjs's number-only build: its parser is the same, and a bundle of it (the `phasewright` command)
// leaves out the big-number, fraction and matrix types the full build creates at start-up.
import { create, type MathNode, parseDependencies } from "mathjs/number";
import type { NetlistError, SourceSpan } from "../types";
import type { ValueNode } from "./ast";
import { spanOf } from "./cursor";
import { isSeriesName, snap } from "./eseries";
import { didYouMean } from "./hints";
import { parseNumberText } from "./numbers";
import { table } from "./table";
import type { Token } from "./tokens";

/** Resolves names during evaluation. `lookup` returns "error" when the name's own definition failed. */
export interface Scope {
  lookup(name: string, at: SourceSpan): number | "error" | undefined;
  names(): Iterable<string>;
}

type Fn = { arity: [number, number]; apply: (args: number[]) => number };
const one = (f: (x: number) => number): Fn => ({ arity: [1, 1], apply: (a) => f(a[0]!) });

const FUNCTIONS = table<Fn>({
  sqrt: one(Math.sqrt),
  exp: one(Math.exp),
  log: {
    arity: [1, 2],
    apply: (a) => (a.length === 2 ? Math.log(a[0]!) / Math.log(a[1]!) : Math.log(a[0]!)),
  },
  log10: one(Math.log10),
  log2: one(Math.log2),
  sin: one(Math.sin),
  cos: one(Math.cos),
  tan: one(Math.tan),
  asin: one(Math.asin),
  acos: one(Math.acos),
  atan: one(Math.atan),
  atan2: { arity: [2, 2], apply: (a) => Math.atan2(a[0]!, a[1]!) },
  abs: one(Math.abs),
  floor: one(Math.floor),
  ceil: one(Math.ceil),
  round: { arity: [1, 2], apply: (a) => Number(a[0]!.toFixed(Math.max(0, Math.min(15, a[1] ?? 0)))) },
  pow: { arity: [2, 2], apply: (a) => a[0]! ** a[1]! },
  min: { arity: [1, 64], apply: (a) => Math.min(...a) },
  max: { arity: [1, 64], apply: (a) => Math.max(...a) },
});
const CONSTANTS = table<number>({ pi: Math.PI, e: Math.E });

/** The names an expression may use besides lets and parameters (for completion and hints). */
export const BUILTIN_NAMES = [...Object.keys(FUNCTIONS), "snap", ...Object.keys(CONSTANTS)];

class ExprError extends Error {
  constructor(
    message: string,
    readonly hint?: string,
    readonly span?: SourceSpan,
  ) {
    super(message);
  }
}

/** mathjs's parser, created on the first expression (a netlist without one never pays for it). */
let mathParser: ((expr: string) => MathNode) | null = null;
function mathParse(expr: string): MathNode {
  mathParser ??= create({ parseDependencies: parseDependencies! }).parse;
  return mathParser(expr);
}

const parsedCache = new WeakMap<Token[], MathNode>();

/**
 * Evaluate a value node in `scope`. Returns null after recording an error (unknown or circular
 * names, malformed expression, no finite result). Never throws.
 */
export function evaluate(node: ValueNode, scope: Scope, errors: NetlistError[]): number | null {
  if (node.kind === "number") return node.value;
  if (node.kind === "name") {
    const found = scope.lookup(node.name, node.span);
    if (found === "error") return null;
    if (found !== undefined) return found;
    // IEC 60062 R-codes (R47) when no let or parameter has that name.
    if (/^R[0-9]+$/.test(node.name)) {
      const iec = parseNumberText(node.name);
      if (iec.ok) return iec.value;
    }
    errors.push({ ...node.span, ...unknownName(node.name, scope) });
    return null;
  }
  try {
    let tree = parsedCache.get(node.tokens);
    if (tree === undefined) {
      tree = mathParse(rewrite(node.tokens));
      parsedCache.set(node.tokens, tree);
    }
    const value = walk(tree, node.tokens, scope);
    if (!Number.isFinite(value)) {
      throw new ExprError(
        "the expression has no finite value",
        "look for a division by zero or the root or log of a negative number",
      );
    }
    return value;
  } catch (error) {
    if (error instanceof ExprError) {
      if (error.message !== "")
        errors.push(withHint({ ...(error.span ?? node.span), message: error.message }, error.hint));
    } else {
      errors.push({
        ...node.span,
        message: "this expression can't be read",
        hint: "check for a missing operand, operator or parenthesis",
      });
    }
    return null;
  }
}

function withHint(e: NetlistError, hint: string | undefined): NetlistError {
  return hint === undefined ? e : { ...e, hint };
}

function unknownName(name: string, scope: Scope): { message: string; hint?: string } {
  const hint = didYouMean(name, [...scope.names(), ...Object.keys(CONSTANTS)]);
  return hint === undefined
    ? { message: `unknown name \`${name}\`` }
    : { message: `unknown name \`${name}\``, hint };
}

/** Tokens → text for mathjs, numbers rewritten to plain decimal form. */
function rewrite(tokens: Token[]): string {
  return tokens
    .map((t) => {
      if (t.kind === "number") {
        const n = parseNumberText(t.text);
        if (!n.ok) throw new ExprError(n.message, n.hint, spanOf(t));
        if (n.unit === "dB")
          throw new ExprError(
            "decibels can't be used inside an expression",
            "write the plain ratio",
            spanOf(t),
          );
        return `(${n.value})`;
      }
      if (t.kind === "word" && t.text.includes("."))
        throw new ExprError(`\`${t.text}\` can't be used in an expression`, undefined, spanOf(t));
      if (t.kind === "op" && !["+", "-", "*", "/", "^", "(", ")", ","].includes(t.text)) {
        throw new ExprError(
          `\`${t.text}\` can't be used in an expression`,
          "operators are + - * / ^",
          spanOf(t),
        );
      }
      return t.text;
    })
    .join(" ");
}

function tokenSpan(tokens: Token[], text: string): SourceSpan | undefined {
  const t = tokens.find((u) => u.text === text);
  return t === undefined ? undefined : spanOf(t);
}

function walk(node: MathNode, tokens: Token[], scope: Scope): number {
  switch (node.type) {
    case "ConstantNode": {
      const v = (node as MathNode & { value: unknown }).value;
      if (typeof v !== "number") throw new ExprError("only numbers can be used in an expression");
      return v;
    }
    case "ParenthesisNode":
      return walk((node as MathNode & { content: MathNode }).content, tokens, scope);
    case "SymbolNode": {
      const name = (node as MathNode & { name: string }).name;
      const span = tokenSpan(tokens, name);
      const found = scope.lookup(name, span ?? spanOf(tokens[0]!));
      if (found === "error") throw new ExprError("");
      if (found !== undefined) return found;
      const constant = CONSTANTS[name];
      if (constant !== undefined) return constant;
      if (isSeriesName(name))
        throw new ExprError(
          `\`${name}\` names a series; it is only used inside snap(${name}, x)`,
          undefined,
          span,
        );
      const u = unknownName(name, scope);
      throw new ExprError(u.message, u.hint, span);
    }
    case "OperatorNode": {
      const op = node as MathNode & { fn: string; args: MathNode[]; implicit: boolean };
      if (op.implicit) throw new ExprError("two values stand side by side", "write `*` between them");
      const args = op.args.map((a) => walk(a, tokens, scope));
      const [a = Number.NaN, b = Number.NaN] = args;
      switch (op.fn) {
        case "add":
          return a + b;
        case "subtract":
          return a - b;
        case "multiply":
          return a * b;
        case "divide":
          return a / b;
        case "pow":
          return a ** b;
        case "unaryMinus":
          return -a;
        case "unaryPlus":
          return a;
      }
      throw new ExprError("this operator can't be used in an expression", "operators are + - * / ^");
    }
    case "FunctionNode": {
      const f = node as MathNode & { fn: MathNode & { name?: string }; args: MathNode[] };
      const name = f.fn.name ?? "";
      const span = tokenSpan(tokens, name);
      if (name === "snap") return snapCall(f.args, tokens, scope, span);
      const fn = FUNCTIONS[name];
      if (fn === undefined) {
        throw new ExprError(
          `unknown function \`${name}\``,
          didYouMean(name, [...Object.keys(FUNCTIONS), "snap"]),
          span,
        );
      }
      if (f.args.length < fn.arity[0] || f.args.length > fn.arity[1]) {
        throw new ExprError(
          `${name} takes ${fn.arity[0] === fn.arity[1] ? fn.arity[0] : `${fn.arity[0]} to ${fn.arity[1]}`} argument(s)`,
          undefined,
          span,
        );
      }
      return fn.apply(f.args.map((a) => walk(a, tokens, scope)));
    }
  }
  throw new ExprError(
    "this expression can't be read",
    "use numbers, names, + - * / ^ and functions such as sqrt(x)",
  );
}

function snapCall(args: MathNode[], tokens: Token[], scope: Scope, span: SourceSpan | undefined): number {
  const [series, x] = args;
  const seriesName = series?.type === "SymbolNode" ? (series as MathNode & { name: string }).name : "";
  if (args.length !== 2 || !isSeriesName(seriesName)) {
    throw new ExprError(
      "snap takes a series and a value",
      "e.g. snap(E24, 1/(2*pi*1k*10n)); series E6, E12, E24, E48, E96, E192",
      span,
    );
  }
  const value = walk(x!, tokens, scope);
  if (!(value > 0) || !Number.isFinite(value))
    throw new ExprError("snap needs a value above zero", undefined, span);
  return snap(seriesName, value);
}
