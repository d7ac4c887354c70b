import { z } from "zod";
import { REVIEW_STATES } from "@/lib/review-states";
import { MAX_RUN_PAGE_SIZE, RUN_LIST_DEFAULTS, RUN_SORT_KEYS, SORT_DIRECTIONS } from "@/lib/run-list";

/** `POST /api/projects/:id/runs`: solve the netlist and save it as a new run. */
export const runCreateSchema = z.object({
  title: z.string().trim().min(1, "Give the run a title.").max(200, "Keep the title under 200 characters."),
  netlist: z.string().min(1, "The netlist is empty."),
  supersedesId: z.uuid("Not a run id.").optional(),
});
export type RunCreateInput = z.infer<typeof runCreateSchema>;

export { RUN_SORT_KEYS, type RunSortKey } from "@/lib/run-list";
export const RUN_REVIEW_FILTERS = REVIEW_STATES;

/** Query string of the runs list: server-side sorting, filtering and pagination. */
export const runListQuerySchema = z.object({
  sort: z.enum(RUN_SORT_KEYS).default(RUN_LIST_DEFAULTS.sort),
  dir: z.enum(SORT_DIRECTIONS).default(RUN_LIST_DEFAULTS.dir),
  q: z.string().trim().max(200).optional(),
  review: z.enum(RUN_REVIEW_FILTERS).optional(),
  author: z.uuid("Not a user id.").optional(),
  page: z.coerce.number().int().min(1).default(RUN_LIST_DEFAULTS.page),
  pageSize: z.coerce.number().int().min(1).max(MAX_RUN_PAGE_SIZE).default(RUN_LIST_DEFAULTS.pageSize),
});
export type RunListQuery = z.infer<typeof runListQuerySchema>;

/** Reads the list query from URL search params; empty values count as absent. */
export function parseRunListQuery(params: URLSearchParams | Record<string, string | string[] | undefined>) {
  const entries =
    params instanceof URLSearchParams
      ? [...params.entries()]
      : Object.entries(params).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v] as const);
  const raw: Record<string, string> = {};
  for (const [k, v] of entries) if (typeof v === "string" && v !== "") raw[k] = v;
  return runListQuerySchema.parse(raw);
}

/** `GET /api/compare?a=&b=` */
export const compareQuerySchema = z.object({
  a: z.uuid("Not a run id."),
  b: z.uuid("Not a run id."),
});
