/**
 * Lexer: netlist text → logical lines of tokens. Comments (`#`) are dropped, a trailing `\` joins the
 * next physical line, LF/CRLF/CR all end a line. Every token keeps its own physical line and columns
 * (1-based, endColumn exclusive), so errors point into continued lines correctly.
 */
import type { NetlistError, SourceSpan } from "../types";

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
// Character classes by code point: the lexer runs once per keystroke in the editor.
const isLetterCode = (k: number) => (k >= 65 && k <= 90) || (k >= 97 && k <= 122) || k === 95;
const isDigitCode = (k: number) => k >= 48 && k <= 57;
const isLetter = (c: string | undefined) => c !== undefined && isLetterCode(c.charCodeAt(0));
const isDigit = (c: string | undefined) => c !== undefined && isDigitCode(c.charCodeAt(0));
const isWordChar = (c: string | undefined) =>
  c !== undefined && (isLetterCode(c.charCodeAt(0)) || isDigit(c));
/** Characters that may follow a number: prefixes, units (micro, ohm and degree signs, %), IEC codes. */
const SUFFIX_EXTRA = new Set(["\u00B5", "\u03BC", "\u03A9", "\u2126", "\u00B0", "%"]);
const isSuffixChar = (c: string | undefined) => c !== undefined && (isWordChar(c) || SUFFIX_EXTRA.has(c));

/** A `title` line: its text is read as written, not as tokens (NETLIST.md, "Statements"). */
const TITLE_LINE = /^[ \t]*title(?=[ \t#\\]|$)/;
/** `#` starts a comment unless written `\#` (only a title has a use for a literal `#`). */
const TITLE_COMMENT = /(?<!\\)#/;

/** Split `text` into logical lines and tokens. Never throws; bad characters become errors. */
export function lex(text: string): { lines: LogicalLine[]; errors: NetlistError[] } {
  const errors: NetlistError[] = [];
  const lines: LogicalLine[] = [];
  const physical = text.replace(/^\uFEFF/, "").split(/\r\n|\n|\r/);
  let current: LogicalLine | null = null;
  for (let index = 0; index < physical.length; index++) {
    const raw = physical[index]!;
    const lineNo = index + 1;
    const starting = current === null;
    if (current === null) current = { line: lineNo, tokens: [], segments: [] };
    if (starting && TITLE_LINE.test(raw)) current.verbatim = true;
    const hash = current.verbatim ? raw.search(TITLE_COMMENT) : raw.indexOf("#");
    let body = trimBlanksEnd(hash >= 0 ? raw.slice(0, hash) : raw);
    const continues = body.endsWith("\\");
    if (continues) body = body.slice(0, -1);
    current.segments.push({ line: lineNo, column: 1, text: body });
    if (!current.verbatim) lexSegment(body, lineNo, current.tokens, errors);
    else if (starting)
      lexSegment(body.slice(0, (TITLE_LINE.exec(body)?.[0] ?? "").length), lineNo, current.tokens, errors);
    if (!continues) {
      if (current.tokens.length > 0) lines.push(current);
      current = null;
    }
  }
  const last = current as LogicalLine | null;
  if (last !== null && last.tokens.length > 0) lines.push(last);
  return { lines, errors };
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
  let depth = 0;
  let signs = 0;
  let powers = 0;
  let operators = 0;
  for (const t of tokens) {
    if (t.kind !== "op") {
      signs = 0;
      continue;
    }
    if ("+-*/^".includes(t.text) && ++operators > MAX_OPERATORS) return { token: t, parens: false };
    if (t.text === "+" || t.text === "-") {
      if (depth + ++signs > MAX_NESTING) return { token: t, parens: false };
      continue;
    }
    signs = 0;
    if (t.text === "(" && ++depth > MAX_NESTING) return { token: t, parens: true };
    if (t.text === ")") depth = Math.max(0, depth - 1);
    if (t.text === "^" && ++powers > MAX_NESTING) return { token: t, parens: false };
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

function lexSegment(body: string, line: number, out: Token[], errors: NetlistError[]): void {
  // One pass by char code, tokens pushed inline: this runs for every line of a netlist, mostly
  // before the JIT has warmed up, so it avoids a closure per line and a search per operator.
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
    if (isLetterCode(k)) {
      i = scanWord(body, i);
      if (
        body.charCodeAt(i) === 45 /* - */ &&
        isLetter(body[i + 1]) &&
        HYPHEN_HEADS.has(body.slice(start, i))
      ) {
        i += 1;
        while (isLetter(body[i])) i++;
      }
      kind = "word";
    } else if (isDigitCode(k) || (k === 46 /* . */ && isDigit(body[i + 1]))) {
      i = scanNumber(body, i);
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
    out.push({ kind, text: body.slice(start, i), line, column: start + 1, endColumn: i + 1, spaceBefore });
    spaceBefore = false;
  }
}

/** Length of the operator starting at `i`, whose char code is `k`; 0 when there is none. */
function operatorLength(body: string, i: number, k: number): number {
  switch (k) {
    case 60: // <
    case 62: // >
      return body.charCodeAt(i + 1) === 61 /* = */ ? 2 : 1;
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

const isWordCode = (k: number) => isLetterCode(k) || isDigitCode(k);

function scanWord(body: string, start: number): number {
  let i = start;
  for (;;) {
    const k = body.charCodeAt(i);
    if (isWordCode(k) || (k === 46 /* . */ && isWordCode(body.charCodeAt(i + 1)))) i++;
    else return i;
  }
}

function scanNumber(body: string, start: number): number {
  let i = start;
  while (isDigit(body[i])) i++;
  if (body[i] === "." && isDigit(body[i + 1])) {
    i++;
    while (isDigit(body[i])) i++;
  }
  const sign = body[i + 1] === "+" || body[i + 1] === "-";
  if ((body[i] === "e" || body[i] === "E") && isDigit(body[i + (sign ? 2 : 1)])) {
    i += sign ? 2 : 1;
    while (isDigit(body[i])) i++;
  }
  while (isSuffixChar(body[i])) i++;
  return i;
}

/** Characters that arrive by copy and paste, and what to type instead. */
const LOOKALIKES: Record<string, string> = {
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
};

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
