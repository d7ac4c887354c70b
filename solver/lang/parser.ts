/**
 * Parser: logical lines → statements. One statement per logical line; block bodies are gathered
 * between `block …` and `end`. Each line stops at its first error, and every line is tried, so a
 * netlist reports all its errors at once.
 */
import type { NetlistError, PartKind } from "../types";
import type { BlockStatement, ParseTree, Statement } from "./ast";
import { Cursor, spanOf } from "./cursor";
import { parseBlockHeader, parseLet, parsePreset } from "./declarations";
import { type KindTable, parsePart } from "./definitions";
import { didYouMean } from "./hints";
import { isPartKind, KEYWORDS, KINDS } from "./kinds";
import { parseAnalysis } from "./statements";
import {
  LineReader,
  type LogicalLine,
  MAX_NESTING,
  MAX_OPERATORS,
  type Token,
  titleText,
  tooDeep,
} from "./tokens";

/** Lex and parse `text`. Never throws. */
export function parseNetlist(text: string): { tree: ParseTree; errors: NetlistError[] } {
  const reader = new LineReader(text);
  // The kinds that presets and blocks add are read from all lines before the first part, so the
  // lines are read in full first when the text may hold such a line. When it can't, each line is
  // parsed as it is read and let go: in a fresh process (the command) every young-generation GC
  // copies what is still held, and all of a long netlist's tokens would be.
  const whole = text.includes("block") || text.includes("preset");
  const lines: LogicalLine[] = [];
  if (whole) for (let line = reader.next(); line !== null; line = reader.next()) lines.push(line);
  const kinds = whole ? prescan(lines) : { presets: new Map(), blocks: new Map() };
  // The parse errors; the lexer's come before them (as when the text was lexed first).
  const errors: NetlistError[] = [];
  const statements: Statement[] = [];
  let open: BlockStatement | null = null;
  const topNames = new Map<string, number>();
  let blockNames = new Map<string, number>();
  // Index loops here: they run once per line, mostly cold (see the note in tokens.ts above `lex`).
  for (let li = 0; ; li++) {
    const logical = whole ? lines[li] : reader.next();
    if (logical === undefined || logical === null) break;
    const deep = tooDeep(logical.tokens);
    if (deep !== null) {
      errors.push({
        ...spanOf(deep.token),
        message: deep.parens
          ? `parentheses are nested more than ${MAX_NESTING} deep`
          : `the expression is nested more than ${MAX_NESTING} deep or has more than ${MAX_OPERATORS} operators`,
        hint: "split the expression with lets",
      });
      continue;
    }
    const c = new Cursor(logical, errors);
    const head = c.peek()!;
    if (head.kind === "word" && head.text === "end") {
      if (open === null) c.fail(spanOf(head), "`end` without a `block` to close");
      else if (c.next() && c.expectEnd("`end` stands alone on its line")) {
        statements.push(open);
        open = null;
      }
      continue;
    }
    if (head.kind === "word" && head.text === "block") {
      if (open !== null) {
        c.fail(
          spanOf(head),
          `block \`${open.name.name}\` is still open`,
          "close it with `end` first; blocks are defined one after another and may use each other",
        );
        continue;
      }
      open = parseBlockHeader(c);
      blockNames = new Map();
      continue;
    }
    const isPart = c.isOp(":", 1);
    if (isPart && head.kind === "word") duplicateName(head, open ? blockNames : topNames, errors);
    if (open !== null) {
      if (isPart) {
        const part = parsePart(c, kinds);
        if (part) open.body.push(part);
      } else if (head.kind === "word" && head.text === "let") {
        const l = parseLet(c);
        if (l) open.body.push(l);
      } else {
        c.fail(
          spanOf(head),
          "only parts and lets go inside a block",
          `close block \`${open.name.name}\` with \`end\` first`,
        );
      }
      continue;
    }
    const statement = isPart ? parsePart(c, kinds) : parseTopLevel(c, kinds);
    if (statement) statements.push(statement);
  }
  if (open !== null) {
    errors.push({
      ...open.name.span,
      message: `block \`${open.name.name}\` has no \`end\``,
      hint: "add a line `end` after its last part",
    });
    statements.push(open);
  }
  return { tree: { statements }, errors: reader.errors.length === 0 ? errors : reader.errors.concat(errors) };
}

/**
 * A part name used twice in one scope (the top level or one block's body). Checked on every
 * `NAME:` line, also one that fails to parse further, so it is reported with the other errors.
 */
function duplicateName(head: Token, seen: Map<string, number>, errors: NetlistError[]): void {
  const earlier = seen.get(head.text);
  if (earlier === undefined) {
    seen.set(head.text, head.line);
    return;
  }
  errors.push({
    ...spanOf(head),
    message: `a part named \`${head.text}\` already exists (line ${earlier})`,
    hint: "give each part its own name",
  });
}

function prescan(lines: LogicalLine[]): KindTable {
  const presets = new Map<string, PartKind | null>();
  const blocks = new Map<string, number>();
  for (let li = 0; li < lines.length; li++) {
    // Indexing, not destructuring: this runs once per line, mostly before the JIT has warmed up.
    const tokens = lines[li]!.tokens;
    const a = tokens[0];
    const b = tokens[1];
    const c = tokens[2];
    const d = tokens[3];
    if (a?.text === "block" && b?.kind === "word" && c?.text === "(") {
      const close = tokens.findIndex((t) => t.text === ")");
      const inside = tokens.slice(3, close < 0 ? tokens.length : close);
      blocks.set(b.text, inside.filter((t) => t.kind !== "op").length);
    }
    if (a?.text === "preset" && b?.kind === "word" && c?.text === "=" && d?.kind === "word") {
      presets.set(b.text, isPartKind(d.text) ? d.text : null);
    }
  }
  return { presets, blocks };
}

function parseTopLevel(c: Cursor, kinds: KindTable): Statement | null {
  const head = c.peek()!;
  if (head.kind === "word") {
    switch (head.text) {
      case "let":
        return parseLet(c);
      case "preset":
        return parsePreset(c);
      case "title": {
        const text = c.logical.verbatim ? titleText(c.logical) : "";
        if (text === "") return c.fail(undefined, "the title is missing", "title Bench sweep source, 1 kHz");
        return { type: "title", text, span: c.span };
      }
    }
    if (KEYWORDS.includes(head.text)) return parseAnalysis(c);
    const second = c.peek(1);
    const kindLike = (w: string) => isPartKind(w) || kinds.presets.has(w) || kinds.blocks.has(w);
    if (second?.kind === "word" && kindLike(second.text)) {
      return c.fail(
        spanOf(head),
        `a part name needs a colon after it`,
        `write \`${head.text}: ${second.text} …\``,
      );
    }
    if (isPartKind(head.text)) {
      return c.fail(
        spanOf(head),
        "a part line starts with the part's name",
        `e.g. \`${KINDS[head.text].usage}\``,
      );
    }
    return c.fail(
      spanOf(head),
      `unknown statement \`${head.text}\``,
      didYouMean(head.text, KEYWORDS) ??
        "a line starts with a keyword (title, let, sweep, show, …) or a part name and `:`",
    );
  }
  return c.fail(
    spanOf(head),
    `a line can't start with \`${head.text}\``,
    "a line starts with a keyword or a part name and `:`",
  );
}
