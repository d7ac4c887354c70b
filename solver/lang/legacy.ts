/**
 * The language's earlier spellings that are now errors with a fix: the probes `v(…)` and `i(…)`
 * (now `volts(…)` and `amps(…)`) and `0` as ground (now `gnd` only). The errors built here are
 * remembered, so `rewriteLegacyNetlist` (rewrite.ts) can apply exactly their fixes and no others.
 */
import type { NetlistError, SourceSpan } from "../types";
import { table } from "./table";

const LEGACY = new WeakSet<NetlistError>();

/** True when `error` is one of the earlier spellings (its fix is a pure rename). */
export function isLegacy(error: NetlistError): boolean {
  return LEGACY.has(error);
}

function remember(error: NetlistError): NetlistError {
  LEGACY.add(error);
  return error;
}

/** `0` written where a node goes. */
export function legacyGround(at: SourceSpan): NetlistError {
  const span = { line: at.line, column: at.column, endColumn: at.endColumn };
  return remember({
    ...span,
    message: "ground is `gnd`",
    hint: "write `gnd` instead of `0`",
    fix: { ...span, text: "gnd", label: "Write gnd" },
  });
}

/** The new name of an old probe word. */
export const PROBE_RENAMES = table<"volts" | "amps">({ v: "volts", i: "amps" });

/**
 * `v(…)` or `i(…)`: `word` is the old word's token, `args` the names as written inside the
 * parentheses. The fix renames the word only, so the rest stays as written.
 */
export function legacyProbe(word: SourceSpan & { text: string }, args: string[]): NetlistError {
  const renamed = PROBE_RENAMES[word.text]!;
  const span = { line: word.line, column: word.column, endColumn: word.endColumn };
  const written = `${renamed}(${args.join(", ")})`;
  return remember({
    ...span,
    message: `\`${word.text}(…)\` is not a probe; probes read \`volts(…)\` and \`amps(…)\``,
    hint: `write \`${written}\``,
    fix: { ...span, text: renamed, label: `Write ${written}` },
  });
}
