import { ConnectionRefusedError } from "sequelize";
import { afterEach, describe, expect, it, vi } from "vitest";
import { GET, POST } from "@/app/api/projects/route";
import { Project, Run } from "@/lib/db";
import { createApiToken } from "@/lib/tokens";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

// The real route handlers, called with real API tokens (no session mock).
useTestDb();

type Who = keyof Fixtures["users"];

async function bearer(fx: Fixtures, who: Who): Promise<Record<string, string>> {
  const { token } = await createApiToken(fx.users[who].id, `test ${who}`);
  return { authorization: `Bearer ${token}` };
}

function post(headers: Record<string, string>, body: string): Promise<Response> {
  const req = new Request("http://localhost/api/projects", {
    method: "POST",
    headers: { "content-type": "application/json", ...headers },
    body,
  });
  return POST(req, undefined);
}

function get(headers: Record<string, string>, query = ""): Promise<Response> {
  return GET(new Request(`http://localhost/api/projects${query}`, { headers }), undefined);
}

type ErrorBody = {
  error: { code: string; message: string; details?: { fields?: Record<string, string[]> } };
};

afterEach(() => {
  vi.restoreAllMocks();
});

describe("POST /api/projects", () => {
  it("lets a designer create a project, then lists it with its run count", async () => {
    const fx = await createFixtures();
    const auth = await bearer(fx, "designer");
    const res = await post(
      auth,
      JSON.stringify({ teamId: fx.team.id, name: "  Notch filter, rev A ", description: "" }),
    );
    expect(res.status).toBe(201);
    const { project } = (await res.json()) as {
      project: { id: string; name: string; description: null; runCount: number };
    };
    expect(project.name).toBe("Notch filter, rev A");
    expect(project.description).toBeNull();
    expect(project.runCount).toBe(0);
    const row = await Project.findByPk(project.id);
    expect(row?.createdById).toBe(fx.users.designer.id);
    expect(row?.teamId).toBe(fx.team.id);

    await Run.create({
      projectId: project.id,
      authorId: fx.users.designer.id,
      title: "first sweep",
      netlist: "title x",
      netlistHash: "1".repeat(64),
      solverVersion: "test",
      status: "ok",
    });
    const list = (await (await get(auth)).json()) as {
      projects: { name: string; runCount: number; role: string }[];
    };
    expect(list.projects.map((p) => [p.name, p.runCount, p.role])).toEqual([
      ["Fixture filter board", 0, "designer"],
      ["Notch filter, rev A", 1, "designer"],
    ]);
  });

  it("answers 403 to a viewer and a reviewer, 404 to an outsider, 401 without credentials", async () => {
    const fx = await createFixtures();
    const body = JSON.stringify({ teamId: fx.team.id, name: "Not allowed" });
    expect((await post(await bearer(fx, "viewer"), body)).status).toBe(403);
    const reviewer = await post(await bearer(fx, "reviewer"), body);
    expect(reviewer.status).toBe(403);
    expect(((await reviewer.json()) as ErrorBody).error.code).toBe("forbidden");
    const outsider = await post(await bearer(fx, "outsider"), body);
    expect(outsider.status).toBe(404);
    expect(((await outsider.json()) as ErrorBody).error.code).toBe("not_found");
    const anonymous = await post({}, body);
    expect(anonymous.status).toBe(401);
    expect(((await anonymous.json()) as ErrorBody).error.code).toBe("unauthorized");
    expect(await Project.count({ where: { name: "Not allowed" } })).toBe(0);
  });

  it("answers 400 with the field for bad input, malformed JSON and a duplicate name", async () => {
    const fx = await createFixtures();
    const auth = await bearer(fx, "owner");
    const bad = await post(auth, JSON.stringify({ teamId: "nope", name: "" }));
    expect(bad.status).toBe(400);
    const fields = ((await bad.json()) as ErrorBody).error.details?.fields ?? {};
    expect(Object.keys(fields).sort()).toEqual(["name", "teamId"]);
    expect(fields.name).toEqual(["Give the project a name."]);

    const malformed = await post(auth, "{ name: ");
    expect(malformed.status).toBe(400);
    expect(((await malformed.json()) as ErrorBody).error.message).toBe("The request body is not valid JSON.");

    const dup = await post(auth, JSON.stringify({ teamId: fx.team.id, name: "Fixture filter board" }));
    expect(dup.status).toBe(400);
    expect(((await dup.json()) as ErrorBody).error.details?.fields?.name?.[0]).toMatch(
      /already has a project/,
    );
  });

  it("answers 503 in the error shape when the database refuses connections", async () => {
    const fx = await createFixtures();
    const auth = await bearer(fx, "owner");
    vi.spyOn(Project, "create").mockRejectedValue(
      new ConnectionRefusedError(new Error("connect ECONNREFUSED")),
    );
    const res = await post(auth, JSON.stringify({ teamId: fx.team.id, name: "During outage" }));
    expect(res.status).toBe(503);
    const body = (await res.json()) as ErrorBody;
    expect(body.error.code).toBe("db_unavailable");
    expect(JSON.stringify(body)).not.toMatch(/ECONNREFUSED|at .*\.ts/);
  });
});

describe("GET /api/projects", () => {
  it("shows each caller only their teams' projects; another team's id is 404", async () => {
    const fx = await createFixtures();
    const outsider = (await (await get(await bearer(fx, "outsider"))).json()) as {
      projects: { name: string }[];
    };
    expect(outsider.projects.map((p) => p.name)).toEqual(["Elsewhere amplifier"]);

    const viewer = await bearer(fx, "viewer");
    const own = (await (await get(viewer, `?teamId=${fx.team.id}`)).json()) as {
      projects: { teamName: string }[];
    };
    expect(own.projects.map((p) => p.teamName)).toEqual(["Fixture Bench"]);
    expect((await get(viewer, `?teamId=${fx.otherTeam.id}`)).status).toBe(404);
    const bad = await get(viewer, "?teamId=abc");
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as ErrorBody).error.details?.fields?.teamId).toEqual(["Not a valid team id."]);
  });
});
