import { createColumnHelper } from "@tanstack/react-table";
import Link from "next/link";
import { ReviewStateBadge } from "@/components/review/review-state-badge";
import type { RunSummary } from "@/lib/run-types";
import { cn, formatDate } from "@/lib/utils";
import { formatQuantity } from "@/solver/format";

const col = createColumnHelper<RunSummary>();

/** The runs table's columns; the first is a checkbox that picks runs for comparison. */
export function runColumns(selected: readonly string[], toggle: (id: string) => void) {
  return [
    col.display({
      id: "select",
      header: () => <span className="sr-only">Select for comparison</span>,
      cell: ({ row }) => (
        <input
          type="checkbox"
          className="accent-board-600 size-4"
          checked={selected.includes(row.original.id)}
          onChange={() => toggle(row.original.id)}
          aria-label={`Select "${row.original.title}" for comparison`}
        />
      ),
    }),
    col.accessor("title", { header: "Title", cell: (c) => <TitleCell run={c.row.original} /> }),
    col.accessor("authorName", { id: "author", header: "Author" }),
    col.accessor("createdAt", {
      header: "Created",
      cell: (c) => <time dateTime={c.getValue()}>{formatDate(c.getValue())}</time>,
    }),
    col.accessor("reviewState", {
      header: "Review",
      cell: (c) => <ReviewStateBadge state={c.getValue()} />,
    }),
    col.display({
      id: "measures",
      header: "Key measures",
      cell: ({ row }) => (
        <ul className="text-caption text-ink-700 space-y-0.5 font-mono">
          {row.original.measures.slice(0, 2).map((m) => (
            <li key={m.name} className="whitespace-nowrap">
              {m.name} = {formatQuantity(m.value, m.unit)}
            </li>
          ))}
        </ul>
      ),
    }),
    col.accessor("checksPassed", {
      header: "Checks",
      cell: ({ row }) => <ChecksCell passed={row.original.checksPassed} total={row.original.checksTotal} />,
    }),
  ];
}

/** The run's title as a link, its status when not ok, and on a phone the gist of the hidden columns. */
function TitleCell({ run }: { run: RunSummary }) {
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <Link href={`/runs/${run.id}`} className="text-board-700 font-medium hover:underline">
        {run.title}
      </Link>
      {run.status !== "ok" ? <StatusPill status={run.status} /> : null}
      {/* On a phone the right-hand columns are off screen: their gist under the title (the
          columns still hold it for screen readers, so this line is hidden from them). */}
      <span
        aria-hidden="true"
        className="text-caption text-ink-600 flex basis-full flex-wrap items-center gap-x-2 gap-y-1 sm:hidden"
      >
        <ReviewStateBadge state={run.reviewState} />
        <ChecksCell passed={run.checksPassed} total={run.checksTotal} />
        <span className="whitespace-nowrap">{formatDate(run.createdAt)}</span>
      </span>
    </span>
  );
}

const STATUS: Record<string, string> = {
  queued: "bg-paper-100 text-ink-600 ring-paper-300",
  running: "bg-board-50 text-board-700 ring-board-200",
  failed: "bg-signal-fault-soft text-signal-fault ring-signal-fault/30",
  cancelled: "bg-paper-100 text-ink-500 ring-paper-300",
};

/** A solve that isn't finished (or failed): shown beside the title. */
function StatusPill({ status }: { status: string }) {
  return (
    <span
      className={cn(
        "text-caption rounded-full px-2 py-0.5 ring-1 ring-inset",
        STATUS[status] ?? STATUS.queued,
      )}
    >
      {status}
    </span>
  );
}

function ChecksCell({ passed, total }: { passed: number | null; total: number | null }) {
  if (total === null || total === 0) return <span className="text-ink-500">none</span>;
  const ok = passed === total;
  return (
    <span className={cn("font-mono font-medium", ok ? "text-signal-ok" : "text-signal-fault")}>
      {passed ?? 0}/{total}
      <span className="sr-only">{ok ? " checks pass" : " checks pass; some fail"}</span>
    </span>
  );
}
