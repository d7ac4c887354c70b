/** Parser of part lines (and block instances) and of their `key=value` options. */
import type { PartKind } from "../types";
import type { Named, OptionNode, PartStatement, ValueNode } from "./ast";
import { type Cursor, spanBetween, spanOf } from "./cursor";
import { didYouMean } from "./hints";
import { isPartKind, KIND_NAMES, KINDS } from "./kinds";
import type { Place } from "./places";
import type { Token } from "./tokens";

/** Names known before the main pass, so a part may use a preset or block defined further down. */
export interface KindTable {
  presets: Map<string, PartKind | null>;
  blocks: Map<string, number>;
}

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
const KINDS_HINT = `kinds: ${KIND_NAMES.join(", ")}`;

export function parsePart(c: Cursor, kinds: KindTable): PartStatement | null {
  const name = c.expectName("a part name");
  if (name === null) return null;
  c.next(); // the colon
  const kindTok = c.peek();
  const kind = c.expectName("a part kind", false, KINDS_HINT);
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
  // Made at its size and filled by index; a line with fewer terminals fails below. No closures in
  // this function: it runs once per part line, mostly cold (see the note in tokens.ts above `lex`).
  const terminals: Named[] = new Array(count);
  let found = 0;
  let value: PartStatement["value"] = null;
  const options: OptionNode[] = [];
  while (!c.atEnd()) {
    const t = c.peek()!;
    if (t.kind === "word" && c.isOp("=", 1)) {
      const option = parseOption(c, info ? info.options : null);
      if (option === null) return null;
      options.push(option);
    } else if (found < count) {
      const node = c.node() ?? c.expectNode(`a node name (${kind.name} connects ${count} nodes)`);
      if (node === null) return null;
      terminals[found++] = node;
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
  if (found < count) {
    const names = info ? ` (${info.terminals.join(" ")})` : "";
    return c.fail(
      undefined,
      `${kind.name} connects ${count} nodes${names}, found ${found}`,
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

/**
 * `key=value`, with no blanks around `=`. `places` gives each allowed key's place; null allows any
 * key, its value in place "any".
 */
export function parseOption(c: Cursor, places: Partial<Record<string, Place>> | null): OptionNode | null {
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
  const place = places === null ? "any" : places[keyTok.text];
  if (place === undefined) {
    const allowed = places === null ? [] : Object.keys(places);
    const hint =
      allowed.length === 0
        ? "this kind takes no options"
        : (didYouMean(keyTok.text, allowed) ?? `options here: ${allowed.join(", ")}`);
    return c.fail(spanOf(keyTok), `unknown option \`${keyTok.text}\``, hint);
  }
  const value = c.value(place, `a value for ${keyTok.text}`);
  return value === null ? null : { key: keyTok.text, keySpan: spanOf(keyTok), value };
}
