"use client";

import {
  flexRender,
  getCoreRowModel,
  type Header,
  type SortingState,
  useReactTable,
} from "@tanstack/react-table";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useState, useTransition } from "react";
import { PlainButton } from "@/components/ui/button";
import { buttonClass } from "@/components/ui/button-class";
import { isRunSortKey } from "@/lib/run-list";
import type { RunSummary } from "@/lib/run-types";
import { cn } from "@/lib/utils";
import { runColumns } from "./runs-columns";
import { RunsFilters, type RunsQueryState, runsHref } from "./runs-filters";
import { RunsPager } from "./runs-pager";

export type RunsTableProps = {
  projectId: string;
  runs: RunSummary[];
  total: number;
  pages: number;
  query: RunsQueryState;
  members: { id: string; name: string }[];
};

/** The project's runs: sorting, filters and paging live in the URL and run on the server. */
export function RunsTable({ projectId, runs, total, pages, query, members }: RunsTableProps) {
  const router = useRouter();
  const [pending, startTransition] = useTransition();
  const [selected, setSelected] = useState<string[]>([]);
  const go = (next: Partial<RunsQueryState>) =>
    startTransition(() => router.push(runsHref(projectId, { ...query, ...next }), { scroll: false }));

  // At most two runs are selected: a third replaces the older pick.
  const columns = useMemo(
    () =>
      runColumns(selected, (id) =>
        setSelected((s) => (s.includes(id) ? s.filter((x) => x !== id) : [...s.slice(-1), id])),
      ),
    [selected],
  );
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

  return (
    <div className="space-y-4">
      <RunsFilters projectId={projectId} query={query} members={members} />
      <SelectionBar runs={runs} selected={selected} total={total} pending={pending} />
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
                {hg.headers.map((h) => (
                  <HeaderCell key={h.id} header={h} query={query} onGo={go} />
                ))}
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
      <RunsPager page={query.page} pages={pages} pageSize={query.pageSize} onGo={go} />
    </div>
  );
}

/** How many runs there are and are picked, and the link that compares two picked runs (older as A). */
function SelectionBar(props: { runs: RunSummary[]; selected: string[]; total: number; pending: boolean }) {
  const { runs, selected, total, pending } = props;
  const [a, b] = selected
    .map((id) => runs.find((r) => r.id === id))
    .filter((r): r is RunSummary => Boolean(r))
    .sort((x, y) => x.createdAt.localeCompare(y.createdAt));
  return (
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
  );
}

/** A column heading; a sortable one is a button that sorts by it (descending first, then ascending). */
function HeaderCell(props: {
  header: Header<RunSummary, unknown>;
  query: RunsQueryState;
  onGo: (next: Partial<RunsQueryState>) => void;
}) {
  const { header: h, query, onGo } = props;
  const label = flexRender(h.column.columnDef.header, h.getContext());
  const sortKey = isRunSortKey(h.column.id) ? h.column.id : null;
  const active = query.sort === h.column.id;
  const aria = active ? (query.dir === "asc" ? "ascending" : "descending") : "none";
  return (
    <th scope="col" aria-sort={sortKey ? aria : undefined} className="px-3 py-2 font-medium">
      {sortKey ? (
        <PlainButton
          type="button"
          className="hover:text-ink-900 inline-flex items-center gap-1 rounded"
          onClick={() =>
            onGo({
              sort: sortKey,
              dir: active && query.dir === "desc" ? "asc" : "desc",
              page: 1,
            })
          }
        >
          {label}
          <span aria-hidden="true" className={active ? "text-copper-600" : "text-ink-500"}>
            {active ? (query.dir === "asc" ? "▲" : "▼") : "↕"}
          </span>
        </PlainButton>
      ) : (
        label
      )}
    </th>
  );
}
