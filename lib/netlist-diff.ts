import { diffArrays } from "diff";

/**
 * A statement-aware view of a netlist diff. Lines are first matched as text; then, inside each
 * stretch of changed lines, a removed and an added line that define the same thing (the same part
 * name, the sweep, the same measure, check, let, show, loop, preset or block) are paired into one
 * "changed" row whose differing words are marked old → new. What is left is added or removed.
 * Client-safe: no server imports.
 */

export interface DiffLine {
  kind: "same" | "added" | "removed";
  text: string;
  /** 1-based line in the first netlist (null for an added line). */
  oldLine: number | null;
  /** 1-based line in the second netlist (null for a removed line). */
  newLine: number | null;
}

function splitLines(text: string): string[] {
  const lines = text.replace(/\r\n?/g, "\n").split("\n");
  if (lines.length > 1 && lines[lines.length - 1] === "") lines.pop();
  return lines;
}

/** Line-based diff of two netlists, each line numbered in the text it comes from. */
export function diffNetlists(a: string, b: string): DiffLine[] {
  const out: DiffLine[] = [];
  let oldLine = 1;
  let newLine = 1;
  for (const change of diffArrays(splitLines(a), splitLines(b))) {
    for (const text of change.value) {
      if (change.added) out.push({ kind: "added", text, oldLine: null, newLine: newLine++ });
      else if (change.removed) out.push({ kind: "removed", text, oldLine: oldLine++, newLine: null });
      else out.push({ kind: "same", text, oldLine: oldLine++, newLine: newLine++ });
    }
  }
  return out;
}

/** A run of words of a changed line: kept as it was, or swapped from `before` to `after`. */
export type Segment = { kind: "kept"; text: string } | { kind: "swap"; before: string; after: string };

export type NetlistRow =
  | { kind: "same"; text: string; oldLine: number; newLine: number }
  | { kind: "added"; subject: string | null; text: string; newLine: number }
  | { kind: "removed"; subject: string | null; text: string; oldLine: number }
  | {
      kind: "changed";
      subject: string;
      before: string;
      after: string;
      oldLine: number;
      newLine: number;
      segments: Segment[];
    };

export type NetlistDiffStats = { changed: number; added: number; removed: number; same: number };

const KEYED = /^(let|measure|check|show|loop|preset|block)\s+([A-Za-z_][\w.]*)/;

/**
 * What a line defines, as a short phrase ("part R1", "sweep", "measure fc"), or null for comments,
 * blank lines, `end` and unnamed statements. Two lines with the same subject are two versions of
 * one definition.
 */
export function lineSubject(line: string): string | null {
  const text = line.replace(/#.*$/, "").trim();
  if (text === "") return null;
  const part = /^([A-Za-z_][\w]*)\s*:/.exec(text);
  if (part) return `part ${part[1]}`;
  if (/^sweep\b/.test(text)) return "sweep";
  if (/^title\b/.test(text)) return "title";
  const keyed = KEYED.exec(text);
  if (keyed) {
    // `show v(out)` without a name is named by its probe text.
    if (keyed[1] === "show" && !/^show\s+[A-Za-z_][\w.]*\s*=/.test(text))
      return `show ${text.slice(5).trim()}`;
    return `${keyed[1]} ${keyed[2]}`;
  }
  return null;
}

/** Words and the spaces between them, so that joining the pieces gives the line back. */
function pieces(line: string): string[] {
  return line.match(/\s+|[^\s]+/g) ?? [];
}

/** Word-level old → new segments of two versions of one line. */
export function lineSegments(before: string, after: string): Segment[] {
  const out: Segment[] = [];
  let pending: { before: string; after: string } | null = null;
  const flush = () => {
    if (pending && (pending.before || pending.after)) out.push({ kind: "swap", ...pending });
    pending = null;
  };
  for (const c of diffArrays(pieces(before), pieces(after))) {
    const text = c.value.join("");
    if (c.added || c.removed) {
      pending ??= { before: "", after: "" };
      if (c.added) pending.after += text;
      else pending.before += text;
    } else if (pending && /^\s+$/.test(text)) {
      // A lone space between two swaps belongs to them: one swap reads better than two.
      pending.before += text;
      pending.after += text;
    } else {
      flush();
      out.push({ kind: "kept", text });
    }
  }
  flush();
  return out;
}

/** Pairs removed and added lines of one hunk with the same subject, keeping both orders. */
function pairHunk(removed: DiffLine[], added: DiffLine[]): NetlistRow[] {
  const rows: NetlistRow[] = [];
  const partner = new Map<number, number>();
  let lastAdded = -1;
  removed.forEach((r, i) => {
    const subject = lineSubject(r.text);
    if (!subject) return;
    const j = added.findIndex((a, k) => k > lastAdded && lineSubject(a.text) === subject);
    if (j >= 0) {
      partner.set(i, j);
      lastAdded = j;
    }
  });
  let j = 0;
  removed.forEach((r, i) => {
    const pair = partner.get(i);
    if (pair === undefined) {
      rows.push({ kind: "removed", subject: lineSubject(r.text), text: r.text, oldLine: r.oldLine ?? 0 });
      return;
    }
    for (; j < pair; j++) {
      const a = added[j] as DiffLine;
      rows.push({ kind: "added", subject: lineSubject(a.text), text: a.text, newLine: a.newLine ?? 0 });
    }
    const a = added[pair] as DiffLine;
    j = pair + 1;
    rows.push({
      kind: "changed",
      subject: lineSubject(r.text) as string,
      before: r.text,
      after: a.text,
      oldLine: r.oldLine ?? 0,
      newLine: a.newLine ?? 0,
      segments: lineSegments(r.text, a.text),
    });
  });
  for (; j < added.length; j++) {
    const a = added[j] as DiffLine;
    rows.push({ kind: "added", subject: lineSubject(a.text), text: a.text, newLine: a.newLine ?? 0 });
  }
  return rows;
}

/** The rows of the diff, in reading order, from a line diff (see `diffNetlists`). */
export function netlistRows(diff: DiffLine[]): NetlistRow[] {
  const rows: NetlistRow[] = [];
  let removed: DiffLine[] = [];
  let added: DiffLine[] = [];
  const endHunk = () => {
    if (removed.length + added.length > 0) rows.push(...pairHunk(removed, added));
    removed = [];
    added = [];
  };
  for (const d of diff) {
    if (d.kind === "removed") removed.push(d);
    else if (d.kind === "added") added.push(d);
    else {
      endHunk();
      rows.push({ kind: "same", text: d.text, oldLine: d.oldLine ?? 0, newLine: d.newLine ?? 0 });
    }
  }
  endHunk();
  return rows;
}

export function netlistDiffStats(rows: NetlistRow[]): NetlistDiffStats {
  const stats: NetlistDiffStats = { changed: 0, added: 0, removed: 0, same: 0 };
  for (const r of rows) stats[r.kind]++;
  return stats;
}

/** Rows to show and unchanged stretches to fold: `context` unchanged rows stay beside each change. */
export type RowBlock = { kind: "rows"; rows: NetlistRow[] } | { kind: "fold"; rows: NetlistRow[] };

export function foldRows(rows: NetlistRow[], context = 2): RowBlock[] {
  const keep = rows.map((r) => r.kind !== "same");
  rows.forEach((r, i) => {
    if (r.kind === "same") return;
    for (let k = Math.max(0, i - context); k <= Math.min(rows.length - 1, i + context); k++) keep[k] = true;
  });
  const blocks: RowBlock[] = [];
  rows.forEach((r, i) => {
    const kind = keep[i] ? "rows" : "fold";
    const last = blocks[blocks.length - 1];
    if (last && last.kind === kind) last.rows.push(r);
    else blocks.push({ kind, rows: [r] });
  });
  // A fold of a single line hides nothing worth a control: show that line.
  return blocks.map((b) => (b.kind === "fold" && b.rows.length === 1 ? { kind: "rows", rows: b.rows } : b));
}

/** "2 changed, 1 added, 1 removed" (only the non-zero counts), or "No lines changed". */
export function describeDiffStats(stats: NetlistDiffStats): string {
  const parts = (["changed", "added", "removed"] as const)
    .filter((k) => stats[k] > 0)
    .map((k) => `${stats[k]} ${k}`);
  return parts.length > 0 ? `${parts.join(", ")} · ${stats.same} as before` : "No lines changed";
}
