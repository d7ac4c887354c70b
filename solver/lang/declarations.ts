/** Parsers of the declaration lines: `let`, `block` headers and `preset`. */
import type { BlockStatement, LetStatement, Named, OptionNode, Statement } from "./ast";
import { type Cursor, spanBetween, spanOf } from "./cursor";
import { parseOption } from "./definitions";
import { didYouMean } from "./hints";
import { isPartKind, KIND_NAMES, KINDS } from "./kinds";

/** Names a `let` may not take (built-in constants, functions and probe words). */
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
    const p = parseOption(c, null);
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
    const o = parseOption(c, info.options);
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
