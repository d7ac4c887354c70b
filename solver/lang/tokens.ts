/**
 * Lexer: netlist text → logical lines of tokens. Comments (`#`) are dropped, a trailing `\` joins the
 * next physical line, LF/CRLF/CR all end a line. Every token keeps its own physical line and columns
 * (1-based, endColumn exclusive), so errors point into continued lines correctly.
 */
import type { NetlistError, SourceSpan } from "../types";
import { table } from "./table";

type TokenKind = "word" | "number" | "op";

export interface Token extends SourceSpan {
  kind: TokenKind;
  text: string;
  /** True when blank space (or a line join) separates this token from the previous one. */
  spaceBefore: boolean;
}

/** One statement's worth of text: a physical line plus any lines joined to it with `\`. */
export interface LogicalLine {
  /** Physical line where the statement starts. */
  line: number;
  tokens: Token[];
  /** The raw text pieces (comment removed), for statements that keep text as written. */
  segments: { line: number; column: number; text: string }[];
  /** A `title` line: only the keyword is a token; the text is in `segments` as written. */
  verbatim?: boolean;
}

/** Hyphenated keywords are single words; the lexer joins `head-tail` when head is one of these. */
const HYPHEN_HEADS = new Set(["zero", "phase", "gain", "half", "monte", "group", "input"]);
/** Operators: <= >= < > = : , ( ) + - * / ^ (read by `operatorLength`). */
const isLetterCode = (k: number) => (k >= 65 && k <= 90) || (k >= 97 && k <= 122) || k === 95;
const isDigitCode = (k: number) => k >= 48 && k <= 57;

/*
 * The rest of a word and a whole number are read by sticky regexes (matched from `lastIndex`, which
 * they move to the end of the match; they always match, maybe empty): the regex engine runs them as
 * machine code from the first lines on, where a loop per character would still be interpreted.
 */
/** After a word's first letter: letters, digits, `_`, and `.` where one of those follows it. */
const WORD_REST = /(?:[A-Za-z0-9_]|\.(?=[A-Za-z0-9_]))*/y;
/**
 * A number from its first digit or `.`: digits, `.digits`, an exponent `e[+-]digits`, then any prefix
 * and unit letters (word characters, the micro, ohm and degree signs, `%`).
 */
const NUMBER = /[0-9]*(?:\.[0-9]+)?(?:[eE][+-]?[0-9]+)?[A-Za-z0-9_\u00B5\u03BC\u03A9\u2126\u00B0%]*/y;

/** A `title` line: its text is read as written, not as tokens (NETLIST.md, "Statements"). */
const TITLE_LINE = /^[ \t]*title(?=[ \t#\\]|$)/;
/** `#` starts a comment unless written `\#` (only a title has a use for a literal `#`). */
const TITLE_COMMENT = /(?<!\\)#/;

/*
 * The lexer runs once per netlist in a fresh process (the `phasewright` command), so mostly before
 * the JIT has warmed up: there every call per character and every object made per line and thrown
 * away costs many times what it costs warm, and what is kept is copied by each young-generation GC.
 * Hence a scan of the whole text instead of a split into lines, words and numbers read by sticky
 * regexes, the rest by char code in plain loops, and arrays made at their final size.
 */

/** Split `text` into logical lines and tokens. Never throws; bad characters become errors. */
export function lex(text: string): { lines: LogicalLine[]; errors: NetlistError[] } {
  const reader = new LineReader(text);
  const lines: LogicalLine[] = [];
  for (let line = reader.next(); line !== null; line = reader.next()) lines.push(line);
  return { lines, errors: reader.errors };
}

/**
 * Reads a text's logical lines one at a time, as `lex` returns them, so a caller can let each line
 * go once it is done with it. Bad characters are added to `errors` as their lines are read.
 */
export class LineReader {
  readonly errors: NetlistError[] = [];
  private readonly source: string;
  /** Where the next physical line starts, and its number less one. */
  private start = 0;
  private lineNo = 0;
  private done = false;
  // Line breaks are LF, CRLF or CR. The next `\r` and `#` at or after `start` are looked up once and
  // reused until passed (a search per line from its start would be quadratic on a text without any).
  private nextCR: number;
  private nextHash: number;
  /**
   * The tokens of the line being read, written from index 0 and copied out at their number when the
   * line ends; this array keeps its size from line to line.
   */
  private readonly scratch: Token[] = [];

  constructor(text: string) {
    this.source = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
    this.nextCR = this.source.indexOf("\r");
    this.nextHash = this.source.indexOf("#");
  }

  /** The next logical line with at least one token, or null at the end of the text. */
  next(): LogicalLine | null {
    const source = this.source;
    const length = source.length;
    const scratch = this.scratch;
    let count = 0;
    let current: LogicalLine | null = null;
    while (!this.done) {
      const start = this.start;
      const lineNo = ++this.lineNo;
      if (this.nextCR >= 0 && this.nextCR < start) this.nextCR = source.indexOf("\r", start);
      let end = source.indexOf("\n", start);
      if (end < 0) end = length;
      if (this.nextCR >= 0 && this.nextCR < end) end = this.nextCR;
      if (end >= length) this.done = true;
      else {
        const crlf = source.charCodeAt(end) === 13 && end + 1 < length && source.charCodeAt(end + 1) === 10;
        this.start = end + (crlf ? 2 : 1);
      }
      const starting = current === null;
      if (current === null) current = { line: lineNo, tokens: NO_TOKENS, segments: NO_SEGMENTS };
      if (starting && isTitleLine(source, start, end)) current.verbatim = true;
      let body: string;
      if (current.verbatim) {
        const raw = source.slice(start, end);
        const hash = raw.search(TITLE_COMMENT);
        body = trimBlanksEnd(hash >= 0 ? raw.slice(0, hash) : raw);
      } else {
        if (this.nextHash >= 0 && this.nextHash < start) this.nextHash = source.indexOf("#", start);
        let stop = this.nextHash >= 0 && this.nextHash < end ? this.nextHash : end;
        while (stop > start) {
          const k = source.charCodeAt(stop - 1);
          if (k !== 32 && k !== 9) break;
          stop--;
        }
        body = source.slice(start, stop);
      }
      const continues = body.length > 0 && body.charCodeAt(body.length - 1) === 92; /* \ */
      if (continues) body = body.slice(0, -1);
      const segment = { line: lineNo, column: 1, text: body };
      if (current.segments === NO_SEGMENTS) current.segments = [segment];
      else current.segments.push(segment);
      if (!current.verbatim) count = lexSegment(body, lineNo, scratch, count, this.errors);
      else if (starting) {
        const keyword = body.slice(0, (TITLE_LINE.exec(body)?.[0] ?? "").length);
        count = lexSegment(keyword, lineNo, scratch, count, this.errors);
      }
      if (!continues) {
        if (count > 0) {
          current.tokens = scratch.slice(0, count);
          return current;
        }
        current = null;
      }
    }
    // The text ended on a line joined to the next.
    if (current !== null && count > 0) {
      current.tokens = scratch.slice(0, count);
      return current;
    }
    return null;
  }
}

/** Placeholders until a line has its own arrays (never filled: a line's arrays are made at their size). */
const NO_TOKENS: Token[] = [];
const NO_SEGMENTS: LogicalLine["segments"] = [];

/** `TITLE_LINE` tested on `source` from `start` to `end` (one physical line) without cutting it out. */
function isTitleLine(source: string, start: number, end: number): boolean {
  let i = start;
  while (i < end) {
    const k = source.charCodeAt(i);
    if (k !== 32 && k !== 9) break;
    i++;
  }
  if (end - i < 5 || source.charCodeAt(i) !== 116 /* t */ || !source.startsWith("title", i)) return false;
  if (i + 5 === end) return true;
  const k = source.charCodeAt(i + 5);
  return k === 32 || k === 9 || k === 35 /* # */ || k === 92; /* \ */
}

/**
 * The text without trailing blanks (spaces, tabs). A loop from the end: the regex `/[ \t]+$/` it
 * replaces is quadratic on a long run of blanks followed by anything else (120 kB took 21 s).
 */
export function trimBlanksEnd(text: string): string {
  let end = text.length;
  while (end > 0) {
    const k = text.charCodeAt(end - 1);
    if (k !== 32 && k !== 9) break;
    end--;
  }
  return end === text.length ? text : text.slice(0, end);
}

/** Parentheses deeper than this on one statement are refused with line and column (no stack overflow). */
export const MAX_NESTING = 100;
/** More arithmetic operators than this on one statement are refused too (the trees are walked recursively). */
export const MAX_OPERATORS = 2000;

/**
 * Where a logical line nests deeper than MAX_NESTING, or null. Each parser level is a recursion: an
 * open parenthesis, each sign in a run (`- - - x`) and each `^` (right-associative) count; so does
 * the length of a chain of operators (MAX_OPERATORS).
 */
export function tooDeep(tokens: Token[]): { token: Token; parens: boolean } | null {
  // Each limit takes more than MAX_NESTING tokens to pass (MAX_OPERATORS is larger).
  if (tokens.length <= MAX_NESTING) return null;
  let depth = 0;
  let signs = 0;
  let powers = 0;
  let operators = 0;
  // An index loop: it runs once per line, mostly cold, where `for…of` allocates per step.
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i]!;
    if (t.kind !== "op") {
      signs = 0;
      continue;
    }
    const op = t.text;
    const sign = op === "+" || op === "-";
    if ((sign || op === "*" || op === "/" || op === "^") && ++operators > MAX_OPERATORS)
      return { token: t, parens: false };
    if (sign) {
      if (depth + ++signs > MAX_NESTING) return { token: t, parens: false };
      continue;
    }
    signs = 0;
    if (op === "(" && ++depth > MAX_NESTING) return { token: t, parens: true };
    if (op === ")") depth = Math.max(0, depth - 1);
    if (op === "^" && ++powers > MAX_NESTING) return { token: t, parens: false };
  }
  return null;
}

/** A title line's text after the keyword: continued lines joined by a space, `\#` read as `#`. */
export function titleText(logical: LogicalLine): string {
  const keyword = logical.tokens[0]!;
  return logical.segments
    .map((seg, i) => (i === 0 ? seg.text.slice(keyword.endColumn - 1) : seg.text).trim())
    .filter((piece) => piece !== "")
    .join(" ")
    .replace(/\\#/g, "#");
}

/**
 * Lex one line's text, writing its tokens to `out` from index `count`; returns the new count. No
 * read goes past the end of `body` (in optimized code one would bail out to the interpreter).
 */
function lexSegment(body: string, line: number, out: Token[], count: number, errors: NetlistError[]): number {
  // One pass by char code, the character classes written out in the loops (see the note above
  // `lex`): letters are A-Z a-z _, digits 0-9.
  let i = 0;
  let spaceBefore = true;
  const n = body.length;
  while (i < n) {
    const k = body.charCodeAt(i);
    if (k === 32 || k === 9 || k === 0xa0 || k === 0x202f || k === 0x2009) {
      // Non-breaking and thin spaces pasted from documents count as blanks.
      spaceBefore = true;
      i++;
      continue;
    }
    const start = i;
    let kind: TokenKind;
    if ((k >= 97 && k <= 122) || (k >= 65 && k <= 90) || k === 95) {
      WORD_REST.lastIndex = i + 1;
      WORD_REST.test(body);
      i = WORD_REST.lastIndex;
      // `half-power`, `zero-phase`…: a hyphenated keyword is one word.
      if (
        i + 1 < n &&
        body.charCodeAt(i) === 45 /* - */ &&
        isLetterCode(body.charCodeAt(i + 1)) &&
        HYPHEN_HEADS.has(body.slice(start, i))
      ) {
        i += 1;
        while (i < n && isLetterCode(body.charCodeAt(i))) i++;
      }
      kind = "word";
    } else if (
      (k >= 48 && k <= 57) ||
      (k === 46 /* . */ && i + 1 < n && isDigitCode(body.charCodeAt(i + 1)))
    ) {
      NUMBER.lastIndex = i;
      NUMBER.test(body);
      i = NUMBER.lastIndex;
      kind = "number";
    } else {
      const length = operatorLength(body, i, k);
      if (length === 0) {
        errors.push(strayCharacter(body, i, line));
        spaceBefore = true;
        i++;
        continue;
      }
      i += length;
      kind = "op";
    }
    const token = {
      kind,
      text: body.slice(start, i),
      line,
      column: start + 1,
      endColumn: i + 1,
      spaceBefore,
    };
    // A store past the array's end (it grows) has a site of its own: optimized code made for
    // in-place stores would bail out at the first line longer than all before it.
    if (count < out.length) out[count] = token;
    else out.push(token);
    count++;
    spaceBefore = false;
  }
  return count;
}

/** Length of the operator starting at `i`, whose char code is `k`; 0 when there is none. */
function operatorLength(body: string, i: number, k: number): number {
  switch (k) {
    case 60: // <
    case 62: // >
      return i + 1 < body.length && body.charCodeAt(i + 1) === 61 /* = */ ? 2 : 1;
    case 61: // =
    case 58: // :
    case 44: // ,
    case 40: // (
    case 41: // )
    case 43: // +
    case 45: // -
    case 42: // *
    case 47: // /
    case 94: // ^
      return 1;
    default:
      return 0;
  }
}

/** Characters that arrive by copy and paste, and what to type instead. */
const LOOKALIKES = table<string>({
  "\u2212": "write the minus sign as -",
  "\u2013": "write the minus sign as -",
  "\u00D7": "write multiplication as *",
  "\u00B7": "write multiplication as *",
  "\u00F7": "write division as /",
  "\u2264": "write <=",
  "\u2265": "write >=",
  "\u201C": "quotes are not used in a netlist",
  "\u201D": "quotes are not used in a netlist",
  '"': "quotes are not used in a netlist",
  ";": "one statement per line; start a comment with #",
});

function strayCharacter(body: string, i: number, line: number): NetlistError {
  const c = body[i] ?? "";
  const base = { line, column: i + 1, endColumn: i + 2 };
  if (c === "\\") {
    return { ...base, message: "a `\\` joins lines only at the very end of a line", hint: "remove it" };
  }
  if (/[\u00B5\u03BC\u03A9\u2126\u00B0%]/.test(c)) {
    return {
      ...base,
      message: `\`${c}\` must follow its number directly`,
      hint: "write the number and its unit together, e.g. 10kΩ or 5%",
    };
  }
  if (c === ".") {
    return { ...base, message: "unexpected `.`", hint: "statements start with a keyword or a part name" };
  }
  const lookalike = LOOKALIKES[c];
  if (lookalike !== undefined) return { ...base, message: `unexpected character \`${c}\``, hint: lookalike };
  const code = c.codePointAt(0) ?? 0;
  if (code < 32 || (code >= 0x200b && code <= 0x200f) || code === 0xfeff) {
    const hex = code.toString(16).toUpperCase().padStart(4, "0");
    return {
      ...base,
      message: `unexpected invisible character U+${hex}`,
      hint: "delete it and type the text again",
    };
  }
  return { ...base, message: `unexpected character \`${c}\`` };
}
