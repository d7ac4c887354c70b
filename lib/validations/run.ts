import { z } from "zod";
import { REVIEW_STATES } from "@/lib/review-states";

/** `POST /api/projects/:id/runs`: solve the netlist and save it as a new run. */
export const runCreateSchema = z.object({
  title: z.string().trim().min(1, "Give the run a title.").max(200, "Keep the title under 200 characters."),
  netlist: z.string().min(1, "The netlist is empty."),
  supersedesId: z.uuid("Not a run id.").optional(),
});
export type RunCreateInput = z.infer<typeof runCreateSchema>;

export const RUN_SORT_KEYS = ["createdAt", "title", "author", "reviewState", "checksPassed"] as const;
export type RunSortKey = (typeof RUN_SORT_KEYS)[number];
export const RUN_REVIEW_FILTERS = REVIEW_STATES;

/** Query string of the runs list: server-side sorting, filtering and pagination. */
export const runListQuerySchema = z.object({
  sort: z.enum(RUN_SORT_KEYS).default("createdAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  q: z.string().trim().max(200).optional(),
  review: z.enum(RUN_REVIEW_FILTERS).optional(),
  author: z.uuid("Not a user id.").optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
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
