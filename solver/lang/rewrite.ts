/**
 * `rewriteLegacyNetlist`: a netlist in the earlier spellings (`v(…)`, `i(…)`, ground `0`) → the
 * same netlist in today's (`volts(…)`, `amps(…)`, `gnd`). Only those words change; every other
 * byte (spacing, comments, line endings, other errors) stays as written. Pure; never throws.
 */
import type { NetlistFix } from "../types";
import { isLegacy } from "./legacy";
import { parseNetlist } from "./parser";

/** Physical lines with their line endings, so joining them gives the text back byte for byte. */
function splitKeepingEnds(text: string): string[] {
  return (
    text
      .match(/[^\r\n]*(?:\r\n|\n|\r|$)/g)
      ?.filter((piece, i, all) => piece !== "" || i < all.length - 1) ?? [text]
  );
}

/** Apply fixes that sit on distinct places; later ones first so earlier columns stay valid. */
export function applyFixes(text: string, fixes: NetlistFix[]): string {
  const lines = splitKeepingEnds(text);
  const bom = text.startsWith("\uFEFF") ? 1 : 0;
  const ordered = [...fixes].sort((a, b) => b.line - a.line || b.column - a.column);
  let lastLine = -1;
  let lastColumn = Number.POSITIVE_INFINITY;
  for (const fix of ordered) {
    if (fix.line === lastLine && fix.endColumn > lastColumn) continue; // overlapping: keep the later one
    const index = fix.line - 1;
    const line = lines[index];
    if (line === undefined) continue;
    const shift = index === 0 ? bom : 0;
    lines[index] = line.slice(0, fix.column - 1 + shift) + fix.text + line.slice(fix.endColumn - 1 + shift);
    lastLine = fix.line;
    lastColumn = fix.column;
  }
  return lines.join("");
}

/**
 * Rewrite the earlier probe and ground spellings. A line whose reading stops at an unrelated error
 * before such a spelling keeps it (it was not readable before either); repeated passes pick up
 * spellings that one pass could not reach.
 */
export function rewriteLegacyNetlist(text: string): string {
  if (typeof text !== "string") return "";
  let current = text;
  for (let pass = 0; pass < 8; pass++) {
    const fixes = parseNetlist(current)
      .errors.filter(isLegacy)
      .map((e) => e.fix!);
    if (fixes.length === 0) return current;
    current = applyFixes(current, fixes);
  }
  return current;
}
