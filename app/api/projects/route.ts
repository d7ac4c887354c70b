import { json, readJson, withActor } from "@/lib/api";
import { BadRequestError } from "@/lib/errors";
import { createProject, listProjects } from "@/lib/projects";
import { projectCreateSchema, projectListQuerySchema } from "@/lib/validations/project";

/** GET /api/projects[?teamId=] — the projects of the caller's teams. */
export const GET = withActor(async (actor, _params, req) => {
  const query = projectListQuerySchema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!query.success) {
    throw new BadRequestError("Some query parameters are not valid.", {
      fields: { teamId: query.error.issues.map((i) => i.message) },
    });
  }
  const projects = await listProjects(actor.userId, query.data.teamId);
  return json({ projects });
});

/** POST /api/projects {teamId, name, description?} — owner or designer of the team. */
export const POST = withActor(async (actor, _params, req) => {
  const input = await readJson(req, projectCreateSchema);
  const project = await createProject(actor.userId, input);
  return json({ project }, 201);
});
