/**
 * Where the netlist text is, and what the user is told about it: spans, errors with their quick
 * fixes, warnings (NETLIST.md "On bad input").
 */

/** A place in the netlist text. Lines and columns are 1-based; endColumn is exclusive. */
export interface SourceSpan {
  line: number;
  column: number;
  endColumn: number;
}

/** A netlist error as the user sees it (NETLIST.md "On bad input"). */
export interface NetlistError extends SourceSpan {
  message: string;
  hint?: string;
  /** A known rewrite that resolves this error (an editor offers it as a quick fix). */
  fix?: NetlistFix;
}

/**
 * A machine-readable fix: replace the text of `line` from `column` to `endColumn` (1-based,
 * exclusive, on that one physical line) with `text`. `label` says it in words for a menu.
 */
export interface NetlistFix extends SourceSpan {
  text: string;
  label: string;
}

export interface Warning {
  /** 1-based line the warning is about, or null when it concerns the whole netlist. */
  line: number | null;
  message: string;
}
