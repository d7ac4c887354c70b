import { foldRows, type NetlistRow, type RowBlock } from "@/lib/netlist-diff";
import { cn } from "@/lib/utils";

export interface NetlistDiffProps {
  rows: NetlistRow[];
  /** Unchanged lines kept beside each change; longer unchanged stretches fold away. Default 2. */
  context?: number;
  labelA?: string;
  labelB?: string;
  className?: string;
}

/** The word on each changed row, and its colours from our palette (never the colour alone). */
const TAGS = {
  changed: { word: "changed", rule: "border-copper-500", tag: "bg-copper-100 text-copper-700" },
  added: { word: "added", rule: "border-board-500", tag: "bg-board-100 text-board-800" },
  removed: { word: "removed", rule: "border-ink-400", tag: "bg-paper-200 text-ink-700" },
} as const;

const grid = "grid grid-cols-[2.25rem_2.25rem_5.5rem_minmax(0,1fr)] items-baseline";

function LineNo({ n, side }: { n: number | null; side: "A" | "B" }) {
  return (
    <span className="text-ink-500 pr-2 text-right font-mono text-xs select-none">
      {n === null ? (
        ""
      ) : (
        <>
          <span className="sr-only">{side} line </span>
          {n}
        </>
      )}
    </span>
  );
}

function Tag({ kind, subject }: { kind: keyof typeof TAGS; subject: string | null }) {
  return (
    <span className="pr-2">
      <span
        className={cn(
          "text-caption rounded-[2px] px-1.5 font-sans font-semibold tracking-wider uppercase",
          TAGS[kind].tag,
        )}
      >
        {TAGS[kind].word}
      </span>
      {subject ? <span className="sr-only"> {subject}:</span> : null}
    </span>
  );
}

function Row({ row }: { row: NetlistRow }) {
  if (row.kind === "same") {
    return (
      <li className={cn(grid, "border-l-[3px] border-transparent")}>
        <LineNo n={row.oldLine} side="A" />
        <LineNo n={row.newLine} side="B" />
        <span />
        <code className="text-ink-600 whitespace-pre-wrap">{row.text || " "}</code>
      </li>
    );
  }
  const t = TAGS[row.kind];
  return (
    <li data-diff-row={row.kind} className={cn(grid, "border-l-[3px] bg-white py-0.5", t.rule)}>
      <LineNo n={row.kind === "added" ? null : row.oldLine} side="A" />
      <LineNo n={row.kind === "removed" ? null : row.newLine} side="B" />
      <Tag kind={row.kind} subject={row.subject} />
      {row.kind === "changed" ? (
        <code className="text-ink-900 whitespace-pre-wrap">
          {row.segments.map((s, i) =>
            s.kind === "kept" ? (
              <span key={i}>{s.text}</span>
            ) : (
              <span key={i} data-swap="" className="bg-copper-50 rounded-[2px] px-0.5">
                {s.before ? (
                  <del className="text-ink-500 decoration-ink-400 line-through">{s.before}</del>
                ) : null}
                <span aria-hidden="true" className="text-copper-600 px-1 font-sans">
                  →
                </span>
                <span className="sr-only"> becomes </span>
                {s.after ? <ins className="text-copper-800 font-semibold no-underline">{s.after}</ins> : null}
              </span>
            ),
          )}
        </code>
      ) : (
        <code
          className={cn(
            "whitespace-pre-wrap",
            row.kind === "removed" ? "text-ink-500 decoration-ink-300 line-through" : "text-board-900",
          )}
        >
          {row.text || " "}
        </code>
      )}
    </li>
  );
}

function Fold({ block }: { block: RowBlock }) {
  const first = block.rows[0];
  const last = block.rows[block.rows.length - 1];
  const range =
    first?.kind === "same" && last?.kind === "same" ? `lines ${first.newLine}–${last.newLine} of B` : "";
  return (
    <li>
      <details className="group">
        <summary className="text-caption text-ink-500 hover:text-ink-800 cursor-pointer list-none py-1 pl-[4.5rem] font-sans select-none">
          <span aria-hidden="true" className="text-paper-400 mr-1 group-open:hidden">
            ┄┄
          </span>
          {block.rows.length} lines as in both runs{range ? ` (${range})` : ""}
          <span className="text-copper-600 ml-2 underline-offset-2 group-open:hidden hover:underline">
            show
          </span>
          <span className="text-copper-600 ml-2 hidden underline-offset-2 group-open:inline hover:underline">
            hide
          </span>
        </summary>
        <ol>
          {block.rows.map((r, k) => (
            <Row key={k} row={r} />
          ))}
        </ol>
      </details>
    </li>
  );
}

/**
 * The netlist diff by statement: a part, sweep, measure, check or let edited in place is one
 * "changed" row with the words that differ shown old → new; whole lines are "added" or "removed";
 * unchanged stretches fold into a line that opens on demand (a native disclosure: keyboard ready,
 * no script needed).
 */
export function NetlistDiff({ rows, context = 2, labelA = "A", labelB = "B", className }: NetlistDiffProps) {
  if (rows.every((r) => r.kind === "same")) {
    return (
      <p className={cn("text-ink-500 text-sm", className)}>The two netlists are the same, line for line.</p>
    );
  }
  return (
    // relative: the screen-reader words (sr-only, absolutely placed) stay inside this scroller; without
    // it they hang out past its right edge and widen a phone's page by the diff's overflow.
    <div className={cn("border-paper-200 bg-paper-50 relative overflow-x-auto rounded-md border", className)}>
      <p className="sr-only">
        Netlist changes from {labelA} to {labelB}. Each row gives its line in A, its line in B, what happened,
        and the text.
      </p>
      <ol aria-label="Netlist changes" className="min-w-[32rem] py-1 font-mono text-[0.8125rem] leading-5">
        {foldRows(rows, context).map((block, i) =>
          block.kind === "fold" ? (
            <Fold key={`f${i}`} block={block} />
          ) : (
            block.rows.map((r, k) => <Row key={`${i}-${k}`} row={r} />)
          ),
        )}
      </ol>
    </div>
  );
}
