import { json, readJson, withActor } from "@/lib/api";
import { TooLargeError } from "@/lib/errors";
import { MAX_NETLIST_BYTES } from "@/lib/limits";
import { createRun } from "@/lib/run-create";
import { listRuns } from "@/lib/runs";
import { parseRunListQuery, runCreateSchema } from "@/lib/validations/run";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ id: string }> };

/** GET /api/projects/:id/runs?sort=&dir=&q=&review=&author=&page=&pageSize= → one page of runs. */
export const GET = withActor<Ctx>(async (actor, { id }, req) => {
  const query = parseRunListQuery(new URL(req.url).searchParams);
  return json(await listRuns(actor, id, query));
});

/** POST /api/projects/:id/runs `{title, netlist, supersedesId?}` → 201 with the saved run; 422 on a bad netlist. */
export const POST = withActor<Ctx>(async (actor, { id }, req) => {
  if (Number(req.headers.get("content-length") ?? "0") > MAX_NETLIST_BYTES * 2 + 4096) {
    throw new TooLargeError(`The netlist is larger than ${MAX_NETLIST_BYTES / 1000} kB.`, {
      field: "netlist",
    });
  }
  const input = await readJson(req, runCreateSchema);
  const run = await createRun(actor, id, input);
  return json({ run }, 201);
});
