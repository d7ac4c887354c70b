/** Parsers of the definition lines: parts (and block instances), `let`, `block` headers, `preset`. */
import type { PartKind } from "../types";
import type {
  BlockStatement,
  LetStatement,
  Named,
  OptionNode,
  PartStatement,
  Statement,
  ValueNode,
} from "./ast";
import { type Cursor, spanBetween, spanOf } from "./cursor";
import { didYouMean } from "./hints";
import { isPartKind, KIND_NAMES, KINDS } from "./kinds";
import type { Place } from "./numbers";
import type { Token } from "./tokens";

/** Names known before the main pass, so a part may use a preset or block defined further down. */
export interface KindTable {
  presets: Map<string, PartKind | null>;
  blocks: Map<string, number>;
}

const RESERVED = new Set([
  "gnd",
  "pi",
  "e",
  "snap",
  "sqrt",
  "exp",
  "log",
  "log10",
  "volts",
  "amps",
  "v",
  "i",
]);
const UNIT_WORDS = new Set([
  "Hz",
  "F",
  "H",
  "V",
  "A",
  "S",
  "ohm",
  "ohms",
  "dB",
  "deg",
  "kHz",
  "MHz",
  "Ω",
  "k",
  "M",
]);

/** `NAME: KIND TERMINALS… [VALUE] [key=value…]` */
export function parsePart(c: Cursor, kinds: KindTable): PartStatement | null {
  const name = c.expectName("a part name");
  if (name === null) return null;
  c.next(); // the colon
  const kindTok = c.peek();
  const kind = c.expectName("a part kind", false, `kinds: ${KIND_NAMES.join(", ")}`);
  if (kind === null || kindTok === undefined) return null;
  const block = kinds.blocks.get(kind.name);
  const base: PartKind | null = isPartKind(kind.name) ? kind.name : (kinds.presets.get(kind.name) ?? null);
  if (block === undefined && base === null) {
    const known = [...KIND_NAMES, ...kinds.presets.keys(), ...kinds.blocks.keys()];
    return c.fail(
      kind.span,
      `unknown part kind \`${kind.name}\``,
      didYouMean(kind.name, known) ?? `kinds: ${KIND_NAMES.join(", ")}`,
    );
  }
  const info = base ? KINDS[base] : null;
  const count = block ?? info!.terminals.length;
  const terminals: Named[] = [];
  let value: PartStatement["value"] = null;
  const options: OptionNode[] = [];
  while (!c.atEnd()) {
    const t = c.peek()!;
    if (t.kind === "word" && c.isOp("=", 1)) {
      const option = parseOption(
        c,
        (key) => (info ? info.options[key] : "any"),
        info ? Object.keys(info.options) : [],
      );
      if (option === null) return null;
      options.push(option);
    } else if (terminals.length < count) {
      const node = c.expectNode(`a node name (${kind.name} connects ${count} nodes)`);
      if (node === null) return null;
      terminals.push(node);
    } else if (value === null && info !== null && info.value !== "none") {
      value = c.value(base!, "a value");
      if (value === null) return null;
    } else if (value !== null && t.kind === "op" && EXPRESSION_OPS.has(t.text)) {
      return unparenthesized(c, value, t);
    } else {
      const unitHint = UNIT_WORDS.has(t.text)
        ? "write the unit right after the number, e.g. 10kΩ or 1kHz"
        : undefined;
      const what =
        block !== undefined
          ? "a block instance takes terminals and key=value parameters only"
          : info?.value === "none"
            ? "an opamp takes no value; use gain=, gbw=, rout=, pole2=, en=, in=, fc="
            : `too many entries for a ${base}`;
      return c.fail(
        spanOf(t),
        `unexpected \`${t.text}\`: ${what}`,
        unitHint ?? (info ? `e.g. \`${info.usage}\`` : undefined),
      );
    }
  }
  if (terminals.length < count) {
    const names = info ? ` (${info.terminals.join(" ")})` : "";
    return c.fail(
      undefined,
      `${kind.name} connects ${count} nodes${names}, found ${terminals.length}`,
      info ? `e.g. \`${info.usage}\`` : undefined,
    );
  }
  if (value === null && info?.value === "required") {
    return c.fail(undefined, `a ${base} needs a value`, `e.g. \`${info.usage}\``);
  }
  return { type: "part", name, kind, terminals, value, options, span: c.span };
}

const EXPRESSION_OPS = new Set(["*", "/", "+", "-", "^"]);

/**
 * `R2: resistor a b 2*R`: an expression value written without its parentheses. The fix wraps the
 * value and the rest of the expression (up to the first `key=` option) on that line.
 */
function unparenthesized(c: Cursor, value: ValueNode, op: Token): null {
  let last: Token = op;
  while (!c.atEnd() && !(c.isWord() && c.isOp("=", 1)) && c.peek()!.line === value.span.line)
    last = c.next()!;
  const line = c.logical.segments.find((s) => s.line === value.span.line)?.text ?? "";
  const written = line.slice(value.span.column - 1, last.endColumn - 1);
  const wrapped = `(${written})`;
  return c.fail(spanOf(op), "an expression as a value needs parentheses", `write \`${wrapped}\``, {
    line: value.span.line,
    column: value.span.column,
    endColumn: last.endColumn,
    text: wrapped,
    label: `Write ${wrapped}`,
  });
}

/** `key=value`, with no blanks around `=`. */
function parseOption(
  c: Cursor,
  placeOf: (key: string) => Place | undefined,
  allowed: string[],
): OptionNode | null {
  const keyTok = c.next()!;
  const eq = c.next()!;
  const after = c.peek();
  if (eq.spaceBefore || after?.spaceBefore) {
    return c.fail(
      spanBetween(spanOf(keyTok), spanOf(eq)),
      "an option is written key=value with no blanks around `=`",
      `write \`${keyTok.text}=…\``,
    );
  }
  const place = placeOf(keyTok.text);
  if (place === undefined) {
    const hint =
      allowed.length === 0
        ? "this kind takes no options"
        : (didYouMean(keyTok.text, allowed) ?? `options here: ${allowed.join(", ")}`);
    return c.fail(spanOf(keyTok), `unknown option \`${keyTok.text}\``, hint);
  }
  const value = c.value(place, `a value for ${keyTok.text}`);
  return value === null ? null : { key: keyTok.text, keySpan: spanOf(keyTok), value };
}

/** `let NAME = EXPR` */
export function parseLet(c: Cursor): LetStatement | null {
  c.next();
  const name = c.expectName("a name after `let`", false, "let R = 10k");
  if (name === null) return null;
  if (RESERVED.has(name.name))
    return c.fail(name.span, `\`${name.name}\` is a built-in name`, "choose another name");
  if (c.expectOp("=", "expected `=` after the name", `let ${name.name} = 10k`) === null) return null;
  const rest = c.tokens.slice(c.i);
  const first = rest[0];
  if (first === undefined) return c.fail(undefined, `let \`${name.name}\` has no value`);
  const last = rest[rest.length - 1]!;
  const single = rest.length === 1 || (rest.length === 2 && first.text === "-" && rest[1]?.kind === "number");
  const expr = single
    ? c.value("any", "a value")
    : { kind: "expr" as const, tokens: rest, span: spanBetween(spanOf(first), spanOf(last)) };
  if (expr === null) return null;
  return { type: "let", name, expr, span: c.span };
}

/** `block NAME(T1, T2, …) [key=default…]` */
export function parseBlockHeader(c: Cursor): BlockStatement | null {
  c.next();
  const name = c.expectName("a block name", false, "block stage(in, out) gain=2");
  if (name === null) return null;
  if (isPartKind(name.name))
    return c.fail(name.span, `\`${name.name}\` is a part kind`, "choose another block name");
  if (c.expectOp("(", "expected `(` and the block's terminals", `block ${name.name}(in, out)`) === null)
    return null;
  const terminals: Named[] = [];
  while (!c.isOp(")")) {
    const t = c.expectName("a terminal name", false, `block ${name.name}(in, out)`);
    if (t === null) return null;
    if (t.name === "gnd") return c.fail(t.span, "`gnd` is global and can't be a block terminal");
    terminals.push(t);
    if (c.isOp(",")) c.next();
    else if (!c.isOp(")")) return c.fail(c.peek(), "expected `,` or `)` in the terminal list");
  }
  c.next();
  if (terminals.length === 0) return c.fail(name.span, `block \`${name.name}\` needs at least one terminal`);
  const params: OptionNode[] = [];
  while (!c.atEnd()) {
    if (!(c.isWord() && c.isOp("=", 1))) {
      return c.fail(
        c.peek(),
        "expected a parameter with its default, key=value",
        `block ${name.name}(in, out) gain=2`,
      );
    }
    const p = parseOption(c, () => "any", []);
    if (p === null) return null;
    params.push(p);
  }
  return { type: "block", name, terminals, params, body: [], span: c.span };
}

/** `preset NAME = KIND key=value…` */
export function parsePreset(c: Cursor): Statement | null {
  c.next();
  const name = c.expectName("a preset name", false, "preset precise = resistor tol=0.1%");
  if (name === null) return null;
  if (isPartKind(name.name))
    return c.fail(name.span, `\`${name.name}\` is already a part kind`, "choose another preset name");
  if (c.expectOp("=", "expected `=` after the preset name", `preset ${name.name} = opamp gbw=1M`) === null)
    return null;
  const kind = c.expectName("a part kind");
  if (kind === null) return null;
  if (!isPartKind(kind.name)) {
    return c.fail(
      kind.span,
      `a preset is built on a part kind, not \`${kind.name}\``,
      didYouMean(kind.name, KIND_NAMES) ?? `kinds: ${KIND_NAMES.join(", ")}`,
    );
  }
  const info = KINDS[kind.name];
  const options: OptionNode[] = [];
  while (!c.atEnd()) {
    if (!(c.isWord() && c.isOp("=", 1)))
      return c.fail(
        c.peek(),
        "a preset holds options only, written key=value",
        `e.g. \`preset ${name.name} = ${kind.name} ${Object.keys(info.options)[0] ?? ""}=…\``,
      );
    const o = parseOption(c, (key) => info.options[key], Object.keys(info.options));
    if (o === null) return null;
    options.push(o);
  }
  if (options.length === 0)
    return c.fail(
      undefined,
      "a preset needs at least one option",
      `options of a ${kind.name}: ${Object.keys(info.options).join(", ") || "none"}`,
    );
  return { type: "preset", name, kind: { ...kind, base: kind.name }, options, span: c.span };
}
