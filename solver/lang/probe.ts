/**
 * Probe expressions: `+ - * /`, parentheses, numbers, `volts(NODE)`, `volts(NODE1, NODE2)` and
 * `amps(PART)`. Recursive descent, usual precedence, left-associative. The earlier words `v(…)` and
 * `i(…)` are read the same way but recorded as errors with their rewrite (legacy.ts).
 */
import type { Named, ProbeNode } from "./ast";
import { type Cursor, spanBetween, spanOf } from "./cursor";
import { legacyProbe, PROBE_RENAMES } from "./legacy";

const PROBE_HINT =
  "a probe reads volts(NODE), volts(NODE1, NODE2) or amps(PART), combined with + - * / and numbers";
const PROBE_WORDS = new Set(["volts", "amps", ...Object.keys(PROBE_RENAMES)]);

/** Parse a whole probe; null (with an error recorded) when it is malformed. */
export function parseProbe(c: Cursor, stopWord?: string): ProbeNode | null {
  const probe = sum(c);
  if (probe === null) return null;
  if (!c.atEnd() && !(stopWord !== undefined && c.isWord(stopWord)))
    return c.fail(c.peek(), `unexpected \`${c.peek()!.text}\` in the probe`, PROBE_HINT);
  return probe;
}

function sum(c: Cursor): ProbeNode | null {
  let left = product(c);
  while (left !== null && (c.isOp("+") || c.isOp("-"))) {
    const op = c.next()!.text as "+" | "-";
    const right = product(c);
    if (right === null) return null;
    left = { op, left, right, span: spanBetween(left.span, right.span) };
  }
  return left;
}

function product(c: Cursor): ProbeNode | null {
  let left = unary(c);
  while (left !== null && (c.isOp("*") || c.isOp("/"))) {
    const op = c.next()!.text as "*" | "/";
    const right = unary(c);
    if (right === null) return null;
    left = { op, left, right, span: spanBetween(left.span, right.span) };
  }
  return left;
}

function unary(c: Cursor): ProbeNode | null {
  if (c.isOp("-")) {
    const minus = c.next()!;
    const arg = unary(c);
    return arg === null ? null : { op: "neg", arg, span: spanBetween(spanOf(minus), arg.span) };
  }
  return primary(c);
}

function primary(c: Cursor): ProbeNode | null {
  const t = c.peek();
  if (t === undefined) return c.fail(undefined, "the probe ends too early", PROBE_HINT);
  if (t.kind === "number") {
    const n = c.value("any", "a number");
    return n === null || n.kind !== "number" ? null : { op: "num", value: n.value, span: n.span };
  }
  if (t.kind === "op" && t.text === "(") {
    c.next();
    const inner = sum(c);
    if (inner === null) return null;
    if (c.expectOp(")", "expected `)` to close the parenthesis") === null) return null;
    return inner;
  }
  if (t.kind === "word" && PROBE_WORDS.has(t.text) && c.isOp("(", 1)) return reading(c);
  return c.fail(t, `\`${t.text}\` can't be read in a probe`, PROBE_HINT);
}

/** One reading only: `volts(NODE)`, `volts(A, B)` or `amps(PART)` (the steady measures' argument). */
export function parseReading(c: Cursor, usage: string): ProbeNode | null {
  const t = c.peek();
  if (t?.kind === "word" && PROBE_WORDS.has(t.text) && c.isOp("(", 1)) return reading(c);
  return c.fail(t, t ? `expected volts(…) or amps(…), found \`${t.text}\`` : "the probe is missing", usage);
}

/** `volts(…)` or `amps(…)` at the cursor (or an earlier word for them, recorded with its fix). */
function reading(c: Cursor): ProbeNode | null {
  const t = c.next()!;
  c.next();
  const word = PROBE_RENAMES[t.text] ?? t.text;
  if (word === "amps") {
    const part = c.expectName("a part name", true, "amps(PART) reads the current through a part");
    if (part === null) return null;
    const close = c.expectOp(")", "expected `)` after the part name", "amps(PART) takes one part");
    if (close === null) return null;
    if (word !== t.text) c.errors.push(legacyProbe(t, [part.name]));
    return { op: "i", part, span: spanBetween(spanOf(t), spanOf(close)) };
  }
  const node = c.expectNode("a node name");
  if (node === null) return null;
  let ref: Named | undefined;
  if (c.isOp(",")) {
    c.next();
    const second = c.expectNode("a second node name");
    if (second === null) return null;
    ref = second;
  }
  const close = c.expectOp(")", "expected `)` after the node name", "volts(NODE) or volts(NODE1, NODE2)");
  if (close === null) return null;
  if (word !== t.text) c.errors.push(legacyProbe(t, ref === undefined ? [node.name] : [node.name, ref.name]));
  const span = spanBetween(spanOf(t), spanOf(close));
  return ref === undefined ? { op: "v", node, span } : { op: "v", node, ref, span };
}
