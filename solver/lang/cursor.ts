/** A cursor over one logical line's tokens, collecting errors with line and column. */
import type { NetlistError, NetlistFix, SourceSpan } from "../types";
import type { Named, ValueNode } from "./ast";
import { didYouMean } from "./hints";
import { legacyGround } from "./legacy";
import { parseNumberText } from "./numbers";
import { type Place, unitMismatch } from "./places";
import type { LogicalLine, Token } from "./tokens";

export function spanOf(token: Token): SourceSpan {
  return { line: token.line, column: token.column, endColumn: token.endColumn };
}

/** From `a` to `b`; when they sit on different physical lines the span stays on `a`'s line. */
export function spanBetween(a: SourceSpan, b: SourceSpan): SourceSpan {
  return { line: a.line, column: a.column, endColumn: a.line === b.line ? b.endColumn : a.endColumn };
}

export class Cursor {
  i = 0;
  readonly tokens: Token[];

  constructor(
    readonly logical: LogicalLine,
    readonly errors: NetlistError[],
  ) {
    this.tokens = logical.tokens;
  }

  // No read past the end of `tokens`: in optimized code one would bail out to the interpreter, and
  // the parser runs mostly cold (see the note in tokens.ts above `lex`).
  peek(k = 0): Token | undefined {
    const j = this.i + k;
    return j < this.tokens.length ? this.tokens[j] : undefined;
  }

  next(): Token | undefined {
    if (this.i >= this.tokens.length) return undefined;
    return this.tokens[this.i++];
  }

  atEnd(): boolean {
    return this.i >= this.tokens.length;
  }

  // The token is read here, not through `peek`: these two run for nearly every token, mostly cold,
  // where a call costs. A token past the end is tested for before its kind is compared (`undefined`
  // compared with a string made optimized code bail out).
  isOp(text: string, k = 0): boolean {
    const j = this.i + k;
    if (j >= this.tokens.length) return false;
    const t = this.tokens[j]!;
    return t.kind === "op" && t.text === text;
  }

  isWord(text?: string, k = 0): boolean {
    const j = this.i + k;
    if (j >= this.tokens.length) return false;
    const t = this.tokens[j]!;
    return t.kind === "word" && (text === undefined || t.text === text);
  }

  /** Span of the whole statement on its first line. */
  get span(): SourceSpan {
    const first = this.tokens[0]!;
    const last = this.tokens[this.tokens.length - 1] ?? first;
    return {
      line: first.line,
      column: first.column,
      endColumn: first.line === last.line ? last.endColumn : first.endColumn,
    };
  }

  /** Where "something is missing" errors point: just past the last token. */
  endSpan(): SourceSpan {
    const last = this.tokens[this.tokens.length - 1]!;
    return { line: last.line, column: last.endColumn, endColumn: last.endColumn + 1 };
  }

  /**
   * Record an error at `at` (a token or span) or at the end of the line, with an optional hint and
   * quick fix; returns null for chaining.
   */
  fail(at: SourceSpan | undefined, message: string, hint?: string, fix?: NetlistFix): null {
    this.errors.push(this.error(at, message, hint, fix));
    return null;
  }

  /** The error `fail` records, for callers that go on reading after it. */
  error(at: SourceSpan | undefined, message: string, hint?: string, fix?: NetlistFix): NetlistError {
    const span =
      at === undefined ? this.endSpan() : { line: at.line, column: at.column, endColumn: at.endColumn };
    return {
      ...span,
      message,
      ...(hint === undefined ? {} : { hint }),
      ...(fix === undefined ? {} : { fix }),
    };
  }

  expectOp(text: string, message: string, hint?: string): Token | null {
    if (this.isOp(text)) return this.next()!;
    return this.fail(this.peek(), message, hint);
  }

  /**
   * A name token (letters, digits, `_`; dots only when `dotted`). `what` may be a function, so a
   * message built from parts is only built when it is shown.
   */
  expectName(what: string | (() => string), dotted = false, hint?: string): Named | null {
    const t = this.peek();
    if (t !== undefined && t.kind === "word" && (dotted || !t.text.includes("."))) {
      this.i++;
      return { name: t.text, span: spanOf(t) };
    }
    const said = typeof what === "string" ? what : what();
    if (t === undefined) return this.fail(undefined, `${said} is missing`, hint);
    return this.fail(t, `expected ${said}, found \`${t.text}\``, hint);
  }

  /**
   * A node name: a word (dots allowed) or digits only. `0`, once an alias of ground, is an error with
   * the fix `gnd`; reading goes on as if `gnd` were written, so the line's other errors show too.
   */
  expectNode(what: string | (() => string), hint?: string): Named | null {
    return this.node() ?? this.expectName(what, true, hint);
  }

  /**
   * The node name at the cursor as `expectNode` reads it, or null (with no error) when the token is
   * not one; a caller with a message built from parts builds it only then.
   */
  node(): Named | null {
    const t = this.peek();
    if (t === undefined) return null;
    if (t.kind === "number") {
      if (t.text === "0") {
        this.i++;
        this.errors.push(legacyGround(t));
        return { name: "gnd", span: spanOf(t) };
      }
      if (!/^[0-9]+$/.test(t.text)) return null;
    } else if (t.kind !== "word") return null;
    this.i++;
    return { name: t.text, span: spanOf(t) };
  }

  expectEnd(hint?: string): boolean {
    const t = this.peek();
    if (t === undefined) return true;
    this.fail(t, `unexpected \`${t.text}\` at the end of the statement`, hint);
    return false;
  }

  /**
   * A value: `[-]number`, a name, or `(expr)`. Numbers are checked against `place` here; names and
   * expressions are checked when they are evaluated.
   */
  value(place: Place, what: string): ValueNode | null {
    const t = this.peek();
    if (t === undefined) return this.fail(undefined, `${what} is missing`);
    if (t.kind === "op" && (t.text === "-" || t.text === "+") && this.peek(1)?.kind === "number") {
      this.i++;
      const n = this.value(place, what);
      if (n === null || n.kind !== "number") return n;
      return { ...n, value: t.text === "-" ? -n.value : n.value, span: spanBetween(spanOf(t), n.span) };
    }
    if (t.kind === "number") {
      this.i++;
      const parsed = parseNumberText(t.text);
      if (!parsed.ok) {
        const fix = parsed.replacement
          ? { ...spanOf(t), text: parsed.replacement, label: `Write ${parsed.replacement}` }
          : undefined;
        return this.fail(t, parsed.message, parsed.hint, fix);
      }
      const mismatch = unitMismatch(parsed.unit, place);
      if (mismatch) return this.fail(t, mismatch.message, mismatch.hint);
      return { kind: "number", value: parsed.value, unit: parsed.unit, span: spanOf(t) };
    }
    if (t.kind === "word") {
      this.i++;
      if (t.text.includes("."))
        return this.fail(t, `\`${t.text}\` is not a value`, "values are numbers, lets or (expressions)");
      return { kind: "name", name: t.text, span: spanOf(t) };
    }
    if (t.kind === "op" && t.text === "(") {
      const open = this.next()!;
      const inner: Token[] = [];
      let depth = 1;
      while (!this.atEnd()) {
        const u = this.next()!;
        if (u.kind === "op" && u.text === "(") depth++;
        if (u.kind === "op" && u.text === ")" && --depth === 0) {
          if (inner.length === 0) return this.fail(spanBetween(spanOf(open), spanOf(u)), "empty parentheses");
          return { kind: "expr", tokens: inner, span: spanBetween(spanOf(open), spanOf(u)) };
        }
        inner.push(u);
      }
      return this.fail(spanOf(open), "this `(` is never closed", "add the matching `)`");
    }
    return this.fail(t, `expected ${what}, found \`${t.text}\``);
  }

  /** The text as written from token `from` to the end of the logical line, blanks collapsed. */
  rawFrom(from: Token): string {
    const parts: string[] = [];
    for (const seg of this.logical.segments) {
      if (seg.line < from.line) continue;
      parts.push(seg.line === from.line ? seg.text.slice(from.column - 1) : seg.text);
    }
    return parts
      .join(" ")
      .replace(/[ \t]+/g, " ")
      .trim();
  }
}

/** Expect the keywords `expected` in order; on a mismatch record an error (with did-you-mean) and return false. */
export function words(c: Cursor, expected: string[], hint: string): boolean {
  for (const w of expected) {
    if (!c.isWord(w)) {
      const t = c.peek();
      c.fail(
        t,
        t ? `expected \`${w}\`, found \`${t.text}\`` : `expected \`${w}\``,
        t?.kind === "word" ? (didYouMean(t.text, [w]) ?? hint) : hint,
      );
      return false;
    }
    c.next();
  }
  return true;
}

/** `V1, V2, …` — values separated by commas. */
export function list(c: Cursor, place: "frequency" | "any", what: string): ValueNode[] | null {
  const values: ValueNode[] = [];
  for (;;) {
    const v = c.value(place, what);
    if (v === null) return null;
    values.push(v);
    if (!c.isOp(",")) return values;
    c.next();
  }
}
