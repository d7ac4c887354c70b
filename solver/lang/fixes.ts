/**
 * Machine-readable fixes (`NetlistError.fix`) for errors whose hint is a known rewrite, added in one
 * pass over the finished error list so every did-you-mean site gets one without carrying it:
 *  - "did you mean `x`?" on an error whose place holds exactly one word → replace the word by x;
 *  - a number with `meg` → the same number with `M`.
 * Errors that know their fix where they arise (earlier probe words, ground `0`, an expression value
 * without parentheses) set it themselves; those are left as they are.
 */
import type { NetlistError } from "../types";
import { parseNumberText } from "./numbers";

const DID_YOU_MEAN = /^did you mean `([^`]+)`\?$/;
const MEG = /^`([^`]+)`: "meg" is not a prefix here$/;
const ONE_WORD = /^[A-Za-z_µ0-9][\w.-]*$/;

export function addFixes(text: string, errors: NetlistError[]): void {
  // The text is split into lines only when an error may need a fix.
  let lines: string[] | null = null;
  for (const e of errors) {
    if (e.fix !== undefined) continue;
    lines ??= text.replace(/^\uFEFF/, "").split(/\r\n|\n|\r/);
    const written = lines[e.line - 1]?.slice(e.column - 1, e.endColumn - 1) ?? "";
    if (!ONE_WORD.test(written)) continue;
    const suggestion = e.hint === undefined ? undefined : DID_YOU_MEAN.exec(e.hint)?.[1];
    const number = MEG.exec(e.message)?.[1];
    let replacement: string | undefined;
    if (suggestion !== undefined && suggestion !== written) replacement = suggestion;
    else if (number === written) {
      const parsed = parseNumberText(number);
      if (!parsed.ok) replacement = parsed.replacement;
    }
    if (replacement === undefined) continue;
    const span = { line: e.line, column: e.column, endColumn: e.endColumn };
    e.fix = { ...span, text: replacement, label: `Write ${replacement}` };
  }
}
