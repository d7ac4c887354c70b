/**
 * The runs list's query words, declared once (client-safe: no imports): the zod schema of
 * `GET /api/projects/:id/runs` (lib/validations/run.ts), the SQL order (lib/runs.ts, a
 * `Record<RunSortKey, …>`), the sortable column headers and the page URL (components/runs) derive
 * from these.
 */
export const RUN_SORT_KEYS = ["createdAt", "title", "author", "reviewState", "checksPassed"] as const;
export type RunSortKey = (typeof RUN_SORT_KEYS)[number];

export const SORT_DIRECTIONS = ["asc", "desc"] as const;
export type SortDirection = (typeof SORT_DIRECTIONS)[number];

/** Defaults of the list; the page URL leaves them out. */
export const RUN_LIST_DEFAULTS = {
  sort: "createdAt",
  dir: "desc",
  page: 1,
  pageSize: 20,
} as const satisfies { sort: RunSortKey; dir: SortDirection; page: number; pageSize: number };

export const MAX_RUN_PAGE_SIZE = 100;

export function isRunSortKey(value: string): value is RunSortKey {
  return (RUN_SORT_KEYS as readonly string[]).includes(value);
}
