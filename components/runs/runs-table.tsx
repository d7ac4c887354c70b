"use client";

import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  type SortingState,
  useReactTable,
} from "@tanstack/react-table";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useState, useTransition } from "react";
import { ReviewStateBadge } from "@/components/review/review-state-badge";
import { buttonClass } from "@/components/ui/button-class";
import type { RunSummary } from "@/lib/run-types";
import { cn, formatDate } from "@/lib/utils";
import { formatQuantity } from "@/solver/format";
import { RunsFilters, type RunsQueryState, runsHref } from "./runs-filters";

export type RunsTableProps = {
  projectId: string;
  runs: RunSummary[];
  total: number;
  pages: number;
  query: RunsQueryState;
  members: { id: string; name: string }[];
};

const col = createColumnHelper<RunSummary>();
const SORTABLE = new Set(["title", "author", "createdAt", "reviewState", "checksPassed"]);

/** The project's runs: sorting, filters and paging live in the URL and run on the server. */
export function RunsTable({ projectId, runs, total, pages, query, members }: RunsTableProps) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [selected, setSelected] = useState<string[]>([]);
  const go = (next: Partial<RunsQueryState>) =>
    startTransition(() => router.push(runsHref(projectId, { ...query, ...next }), { scroll: false }));

  const columns = useMemo(() => {
    // At most two runs are selected: a third replaces the older pick.
    const toggle = (id: string) =>
      setSelected((s) => (s.includes(id) ? s.filter((x) => x !== id) : [...s.slice(-1), id]));
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
      col.accessor("title", {
        header: "Title",
        cell: (c) => (
          <span className="inline-flex flex-wrap items-center gap-2">
            <Link href={`/runs/${c.row.original.id}`} className="text-board-700 font-medium hover:underline">
              {c.getValue()}
            </Link>
            {c.row.original.status !== "ok" ? <StatusPill status={c.row.original.status} /> : null}
            {/* On a phone the right-hand columns are off screen: their gist under the title (the
                columns still hold it for screen readers, so this line is hidden from them). */}
            <span
              aria-hidden="true"
              className="text-caption text-ink-600 flex basis-full flex-wrap items-center gap-x-2 gap-y-1 sm:hidden"
            >
              <ReviewStateBadge state={c.row.original.reviewState} />
              <ChecksCell passed={c.row.original.checksPassed} total={c.row.original.checksTotal} />
              <span className="whitespace-nowrap">{formatDate(c.row.original.createdAt)}</span>
            </span>
          </span>
        ),
      }),
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
  }, [selected]);

  const sorting: SortingState = [{ id: query.sort, desc: query.dir === "desc" }];
  const table = useReactTable({
    data: runs,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    pageCount: pages,
    state: { sorting },
    getRowId: (r) => r.id,
  });

  const [a, b] = selected
    .map((id) => runs.find((r) => r.id === id))
    .filter((r): r is RunSummary => Boolean(r))
    .sort((x, y) => x.createdAt.localeCompare(y.createdAt));

  return (
    <div className="space-y-4">
      <RunsFilters projectId={projectId} query={query} members={members} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-ink-600 text-sm" aria-live="polite">
          {total === 1 ? "1 run" : `${total} runs`}
          {pending ? " · loading…" : ""}
          {selected.length > 0 ? ` · ${selected.length} of 2 selected` : ""}
        </p>
        {a && b ? (
          <Link href={`/compare?a=${a.id}&b=${b.id}`} className={buttonClass({ size: "sm" })}>
            Compare selected
          </Link>
        ) : (
          <span className="text-caption text-ink-500">Select two runs to compare them.</span>
        )}
      </div>
      <div
        className={cn(
          "rounded-panel border-paper-200 relative overflow-x-auto border bg-white",
          pending && "opacity-70",
        )}
      >
        <table className="w-full min-w-[760px] text-left text-sm">
          <thead className="bg-paper-100 text-ink-600">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sortable = SORTABLE.has(h.column.id);
                  const active = query.sort === h.column.id;
                  const aria = active ? (query.dir === "asc" ? "ascending" : "descending") : "none";
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={sortable ? aria : undefined}
                      className="px-3 py-2 font-medium"
                    >
                      {sortable ? (
                        <button
                          type="button"
                          className="hover:text-ink-900 inline-flex items-center gap-1 rounded"
                          onClick={() =>
                            go({
                              sort: h.column.id as RunsQueryState["sort"],
                              dir: active && query.dir === "desc" ? "asc" : "desc",
                              page: 1,
                            })
                          }
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden="true" className={active ? "text-copper-600" : "text-ink-500"}>
                            {active ? (query.dir === "asc" ? "▲" : "▼") : "↕"}
                          </span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr
                key={row.id}
                className={cn(
                  "border-paper-200 border-t align-top",
                  selected.includes(row.id) ? "bg-board-50" : "hover:bg-paper-50",
                )}
              >
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2.5">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {runs.length === 0 ? (
        <p className="text-ink-600 text-sm">
          {total > 0
            ? "There are no runs on this page; go back to the first page."
            : "No run matches these filters. Change or clear them above to see more."}
        </p>
      ) : null}
      <Pager page={query.page} pages={pages} pageSize={query.pageSize} onGo={go} />
    </div>
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

function Pager(props: {
  page: number;
  pages: number;
  pageSize: number;
  onGo: (q: Partial<RunsQueryState>) => void;
}) {
  const { page, pages, pageSize, onGo } = props;
  return (
    <nav aria-label="Pages of runs" className="flex flex-wrap items-center justify-between gap-3 text-sm">
      <div className="flex items-center gap-2">
        <button
          type="button"
          className={buttonClass({ variant: "secondary", size: "sm" })}
          disabled={page <= 1}
          onClick={() => onGo({ page: page - 1 })}
        >
          Previous
        </button>
        <span className="text-ink-600">
          Page {page} of {pages}
        </span>
        <button
          type="button"
          className={buttonClass({ variant: "secondary", size: "sm" })}
          disabled={page >= pages}
          onClick={() => onGo({ page: page + 1 })}
        >
          Next
        </button>
      </div>
      <label className="text-ink-600 flex items-center gap-2">
        Rows per page
        <select
          className="border-paper-300 rounded-md border bg-white px-2 py-1"
          value={pageSize}
          onChange={(e) => onGo({ pageSize: Number(e.target.value), page: 1 })}
        >
          {[10, 20, 50, 100].map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </label>
    </nav>
  );
}
