"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { PlainButton } from "@/components/ui/button";
import { buttonClass } from "@/components/ui/button-class";
import { inputClass } from "@/components/ui/field";
import { REVIEW_STATE_LABELS, REVIEW_STATES } from "@/lib/review-states";
import { RUN_LIST_DEFAULTS, type RunSortKey, type SortDirection } from "@/lib/run-list";

export type RunsQueryState = {
  sort: RunSortKey;
  dir: SortDirection;
  q?: string | undefined;
  review?: string | undefined;
  author?: string | undefined;
  page: number;
  pageSize: number;
};

const DEFAULTS = RUN_LIST_DEFAULTS;

/** The project page URL for a query; defaults are left out so links stay short. */
export function runsHref(projectId: string, q: RunsQueryState): string {
  const p = new URLSearchParams();
  if (q.sort !== DEFAULTS.sort) p.set("sort", q.sort);
  if (q.dir !== DEFAULTS.dir) p.set("dir", q.dir);
  if (q.q) p.set("q", q.q);
  if (q.review) p.set("review", q.review);
  if (q.author) p.set("author", q.author);
  if (q.page !== DEFAULTS.page) p.set("page", String(q.page));
  if (q.pageSize !== DEFAULTS.pageSize) p.set("pageSize", String(q.pageSize));
  const s = p.toString();
  return `/projects/${projectId}${s ? `?${s}` : ""}`;
}

export function RunsFilters({
  projectId,
  query,
  members,
}: {
  projectId: string;
  query: RunsQueryState;
  members: { id: string; name: string }[];
}) {
  const router = useRouter();
  const [text, setText] = useState(query.q ?? "");
  const go = (next: Partial<RunsQueryState>) =>
    router.push(runsHref(projectId, { ...query, ...next, page: 1 }), { scroll: false });
  return (
    <search aria-label="Filter runs">
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          go({ q: text.trim() || undefined });
        }}
      >
        <div className="min-w-48 flex-1">
          <label htmlFor="runs-q" className="text-ink-700 mb-1 block text-sm font-medium">
            Title contains
          </label>
          <input
            id="runs-q"
            type="search"
            className={inputClass}
            value={text}
            onChange={(e) => setText(e.target.value)}
            placeholder="e.g. Wien"
          />
        </div>
        <div>
          <label htmlFor="runs-review" className="text-ink-700 mb-1 block text-sm font-medium">
            Review
          </label>
          <select
            id="runs-review"
            className={inputClass}
            value={query.review ?? ""}
            onChange={(e) => go({ review: e.target.value || undefined })}
          >
            <option value="">Any state</option>
            {REVIEW_STATES.map((s) => (
              <option key={s} value={s}>
                {REVIEW_STATE_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="runs-author" className="text-ink-700 mb-1 block text-sm font-medium">
            Author
          </label>
          <select
            id="runs-author"
            className={inputClass}
            value={query.author ?? ""}
            onChange={(e) => go({ author: e.target.value || undefined })}
          >
            <option value="">Anyone</option>
            {members.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
        </div>
        <PlainButton type="submit" className={buttonClass({ variant: "secondary" })}>
          Apply
        </PlainButton>
      </form>
    </search>
  );
}
