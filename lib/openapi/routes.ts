/**
 * The API's routes as the OpenAPI document (`/api/openapi.json`, lib/openapi/document.ts) describes
 * them: path, method, who may call, and the zod schemas the route handlers themselves parse with
 * (lib/validations). Add a route here when you add a `route.ts`; tests/unit/openapi.test.ts walks
 * app/api and fails on a route or method missing from this list.
 */

import { z } from "zod";
import { RUN_ROUTES } from "@/lib/openapi/run-routes";
import { invitationCreateSchema } from "@/lib/validations/invitation";
import { measurementUploadSchema } from "@/lib/validations/measurement";
import { projectCreateSchema, projectListQuerySchema, tokenCreateSchema } from "@/lib/validations/project";
import { runCreateSchema, runListQuerySchema } from "@/lib/validations/run";
import { solveRequestSchema } from "@/lib/validations/solve";

export type Method = "get" | "post" | "put" | "patch" | "delete";

export interface ApiRoute {
  /** OpenAPI path: `/api/runs/{id}` for app/api/runs/[id]/route.ts. */
  path: string;
  method: Method;
  tag: string;
  summary: string;
  description?: string;
  /** `token`: an API token or the session cookie; `none`: public; `browser`: next-auth's own pages. */
  auth: "token" | "none" | "browser";
  params?: z.ZodObject;
  query?: z.ZodObject;
  body?: z.ZodType;
  /** Another request body type than JSON (the CSV upload). */
  otherBodies?: Record<string, string>;
  /** The success status and what it returns. */
  ok: { status: number; description: string; contentType?: string };
  /** Error statuses this route answers besides 401/500 (all `{error:{code,message,details}}`). */
  errors?: number[];
}

const id = (what: string) => z.object({ id: z.uuid().describe(`the ${what}'s id`) });

export const API_ROUTES: ApiRoute[] = [
  {
    path: "/api/health",
    method: "get",
    tag: "service",
    summary: "Process and database status",
    auth: "none",
    ok: {
      status: 200,
      description: '`{status:"ok",db:"up"}`; 503 with `degraded` when the database does not answer',
    },
  },
  {
    path: "/api/openapi.json",
    method: "get",
    tag: "service",
    summary: "This API description (OpenAPI 3.1)",
    auth: "none",
    ok: { status: 200, description: "the OpenAPI document" },
  },
  {
    path: "/api/solve",
    method: "post",
    tag: "solve",
    summary: "Solve a netlist without saving it",
    description:
      "Answers the solver's JSON result; netlist errors are a 200 with `ok: false` and every error's line and column. The netlist's size is limited in bytes. " +
      'With `stage: "sweep"` a netlist whose preview has studies beyond its nominal sweep (vary, monte-carlo, sensitivity, steady) answers the nominal sweep alone, with its measures and checks, and names those studies in `pending`; ask again without `stage` (or with `"all"`) for the whole preview. ' +
      "A `Server-Timing` header says where the time went (read, solve, engine).",
    auth: "token",
    body: solveRequestSchema,
    ok: {
      status: 200,
      description:
        "the solve result (`ok`, `frequencies`, `traces`, `measures`, `checks`, …; `pending` on a sweep-stage answer whose studies are still to come)",
    },
    errors: [400, 413, 429],
  },
  {
    path: "/api/projects",
    method: "get",
    tag: "projects",
    summary: "Projects of the teams you belong to",
    auth: "token",
    query: projectListQuerySchema,
    ok: { status: 200, description: "`{projects}`" },
    errors: [400],
  },
  {
    path: "/api/projects",
    method: "post",
    tag: "projects",
    summary: "Create a project in a team",
    auth: "token",
    body: projectCreateSchema,
    ok: { status: 201, description: "`{project}`" },
    errors: [400, 404],
  },
  {
    path: "/api/projects/{id}/runs",
    method: "get",
    tag: "runs",
    summary: "A project's runs: sorted, filtered, one page",
    auth: "token",
    params: id("project"),
    query: runListQuerySchema,
    ok: { status: 200, description: "`{runs, total, page, pageSize, pages}`" },
    errors: [400, 404],
  },
  {
    path: "/api/projects/{id}/runs",
    method: "post",
    tag: "runs",
    summary: "Solve a netlist and save it as a run",
    description: "Large studies are saved `queued` and solved by a worker (see `/api/runs/{id}/job`).",
    auth: "token",
    params: id("project"),
    body: runCreateSchema,
    ok: { status: 201, description: "`{run}`" },
    errors: [400, 404, 413],
  },
  {
    path: "/api/projects/{id}/measurements",
    method: "get",
    tag: "measurements",
    summary: "A project's bench measurements",
    auth: "token",
    params: id("project"),
    ok: { status: 200, description: "`{measurements}`" },
    errors: [404],
  },
  {
    path: "/api/projects/{id}/measurements",
    method: "post",
    tag: "measurements",
    summary: "Upload bench data: frequency (Hz), magnitude (dB), phase (deg)",
    description:
      "JSON `{name, csv}`, multipart form data (`file`, `name`), or `text/csv` with `?name=`. Bad rows are a 400 with `details.errors` [{line, message}].",
    auth: "token",
    params: id("project"),
    body: measurementUploadSchema,
    otherBodies: {
      "text/csv": "the CSV itself; name in `?name=`",
      "multipart/form-data": "`file` (CSV) and `name`",
    },
    ok: { status: 201, description: "`{measurement}`" },
    errors: [400, 404, 413],
  },
  // Routes under /api/runs/{id}: lib/openapi/run-routes.ts.
  ...RUN_ROUTES,
  {
    path: "/api/teams/{id}/invitations",
    method: "get",
    tag: "teams",
    summary: "A team's open invitations (owners)",
    auth: "token",
    params: id("team"),
    ok: { status: 200, description: "`{invitations}`" },
    errors: [404],
  },
  {
    path: "/api/teams/{id}/invitations",
    method: "post",
    tag: "teams",
    summary: "Invite someone to a team by e-mail (owners)",
    auth: "token",
    params: id("team"),
    body: invitationCreateSchema,
    ok: { status: 201, description: "`{invitation}`" },
    errors: [400, 403, 404, 409],
  },
  {
    path: "/api/teams/{id}/invitations/{invitationId}",
    method: "delete",
    tag: "teams",
    summary: "Withdraw a pending invitation: its link stops working (owners)",
    auth: "token",
    params: z.object({ id: z.uuid(), invitationId: z.uuid() }),
    ok: { status: 200, description: "`{revoked: true}`" },
    errors: [400, 403, 404],
  },
  {
    path: "/api/teams/{id}/invitations/{invitationId}/resend",
    method: "post",
    tag: "teams",
    summary: "Send a pending invitation again with a new link and seven more days (owners)",
    auth: "token",
    params: z.object({ id: z.uuid(), invitationId: z.uuid() }),
    ok: { status: 201, description: "`{invitation}`" },
    errors: [400, 403, 404],
  },
  {
    path: "/api/tokens",
    method: "get",
    tag: "tokens",
    summary: "Your API tokens (first characters only)",
    auth: "token",
    ok: { status: 200, description: "`{tokens}`" },
  },
  {
    path: "/api/tokens",
    method: "post",
    tag: "tokens",
    summary: "Create an API token (shown once)",
    auth: "token",
    body: tokenCreateSchema,
    ok: {
      status: 201,
      description: "`{token, id, name, prefix, createdAt, …}`: the token text is shown this once",
    },
    errors: [400],
  },
  {
    path: "/api/tokens/{tokenId}",
    method: "delete",
    tag: "tokens",
    summary: "Revoke one of your API tokens",
    auth: "token",
    params: z.object({ tokenId: z.uuid() }),
    ok: { status: 204, description: "revoked (no body)" },
    errors: [404],
  },
  {
    path: "/api/dev/outbox",
    method: "get",
    tag: "service",
    summary: "Latest outgoing e-mails (development and tests only; 404 in production)",
    auth: "none",
    ok: { status: 200, description: "`{emails}`" },
    errors: [404],
  },
  {
    path: "/api/auth/{nextauth}",
    method: "get",
    tag: "sign-in",
    summary: "Sign-in pages and session of the web app (browsers only; scripts use API tokens)",
    auth: "browser",
    params: z.object({ nextauth: z.string() }),
    ok: { status: 200, description: "next-auth's answer" },
  },
  {
    path: "/api/auth/{nextauth}",
    method: "post",
    tag: "sign-in",
    summary: "Sign in or out in the web app (browsers only; rate-limited)",
    auth: "browser",
    params: z.object({ nextauth: z.string() }),
    ok: { status: 200, description: "next-auth's answer" },
    errors: [429],
  },
];
