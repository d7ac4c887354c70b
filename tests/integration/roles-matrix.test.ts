// Every route of the runs area × every role: the expected status for owner, designer, reviewer,
// viewer and an outsider (member of another team only), following the roles table of PRODUCT.md.
import { beforeAll, describe, expect, it } from "vitest";
import { GET as compareRoute } from "@/app/api/compare/route";
import { GET as outboxRoute } from "@/app/api/dev/outbox/route";
import {
  GET as listMeasurements,
  POST as uploadMeasurement,
} from "@/app/api/projects/[id]/measurements/route";
import { POST as createRun, GET as listRuns } from "@/app/api/projects/[id]/runs/route";
import { PATCH as patchComment } from "@/app/api/runs/[id]/comments/[commentId]/route";
import { GET as listComments, POST as postComment } from "@/app/api/runs/[id]/comments/route";
import { GET as exportCsv } from "@/app/api/runs/[id]/export.csv/route";
import { GET as listReadings, POST as postReading } from "@/app/api/runs/[id]/readings/route";
import { POST as reviewRoute } from "@/app/api/runs/[id]/review/route";
import { GET as getRun } from "@/app/api/runs/[id]/route";
import { POST as invite, GET as listInvitations } from "@/app/api/teams/[id]/invitations/route";
import { Comment } from "@/lib/db";
import { call, EVERYONE, insertRun, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb({ truncate: "file" });

const NETLIST = `title matrix
Vin: vsource in gnd 1
R1: resistor in out 1k
C1: capacitor out gnd 100n
sweep 100Hz to 10kHz log 10 per decade
show H = volts(out) / volts(in)
`;

let fx: Fixtures;
let tokens: Record<Who, string>;
let runId: string;
let otherRunId: string;
let commentId: string;

beforeAll(async () => {
  process.env.OUTBOX_AUTODELIVER = "0";
  fx = await createFixtures();
  tokens = await tokensFor(fx);
  runId = (await insertRun(fx.project.id, fx.users.designer.id)).id;
  otherRunId = (await insertRun(fx.project.id, fx.users.designer.id)).id;
  commentId = (await Comment.create({ runId, authorId: fx.users.reviewer.id, body: "seed" })).id;
});

type Expect = Record<Who, number>;
const READ: Expect = { owner: 200, designer: 200, reviewer: 200, viewer: 200, outsider: 404 };

type Case = { name: string; expect: Expect; run: (who: Who) => Promise<{ status: number }> };

const cases: Case[] = [
  {
    name: "GET /api/projects/:id/runs",
    expect: READ,
    run: (who) => call(listRuns, { token: tokens[who], params: { id: fx.project.id } }),
  },
  {
    name: "POST /api/projects/:id/runs",
    expect: { owner: 201, designer: 201, reviewer: 403, viewer: 403, outsider: 404 },
    run: (who) =>
      call(createRun, {
        token: tokens[who],
        params: { id: fx.project.id },
        body: { title: `by ${who}`, netlist: NETLIST },
      }),
  },
  {
    name: "GET /api/runs/:id",
    expect: READ,
    run: (who) => call(getRun, { token: tokens[who], params: { id: runId } }),
  },
  {
    name: "GET /api/runs/:id/export.csv",
    expect: READ,
    run: (who) => call(exportCsv, { token: tokens[who], params: { id: runId } }),
  },
  {
    name: "GET /api/runs/:id/comments",
    expect: READ,
    run: (who) => call(listComments, { token: tokens[who], params: { id: runId } }),
  },
  {
    name: "POST /api/runs/:id/comments",
    expect: { owner: 201, designer: 201, reviewer: 201, viewer: 403, outsider: 404 },
    run: (who) =>
      call(postComment, { token: tokens[who], params: { id: runId }, body: { body: `from ${who}` } }),
  },
  {
    name: "PATCH /api/runs/:id/comments/:commentId",
    expect: { owner: 200, designer: 200, reviewer: 200, viewer: 403, outsider: 404 },
    run: (who) =>
      call(patchComment, {
        token: tokens[who],
        method: "PATCH",
        params: { id: runId, commentId },
        body: { state: "settled" },
      }),
  },
  {
    name: "POST /api/runs/:id/review submit (fresh draft run each time)",
    expect: { owner: 200, designer: 200, reviewer: 403, viewer: 403, outsider: 404 },
    run: async (who) => {
      const run = await insertRun(fx.project.id, fx.users.designer.id);
      return call(reviewRoute, { token: tokens[who], params: { id: run.id }, body: { action: "submit" } });
    },
  },
  {
    name: "POST /api/runs/:id/review sign_off (fresh run awaiting sign-off each time)",
    expect: { owner: 200, designer: 403, reviewer: 200, viewer: 403, outsider: 404 },
    run: async (who) => {
      const run = await insertRun(fx.project.id, fx.users.designer.id, { reviewState: "awaiting_signoff" });
      return call(reviewRoute, { token: tokens[who], params: { id: run.id }, body: { action: "sign_off" } });
    },
  },
  {
    name: "POST /api/runs/:id/review send_back (fresh run awaiting sign-off each time)",
    expect: { owner: 200, designer: 403, reviewer: 200, viewer: 403, outsider: 404 },
    run: async (who) => {
      const run = await insertRun(fx.project.id, fx.users.designer.id, { reviewState: "awaiting_signoff" });
      return call(reviewRoute, {
        token: tokens[who],
        params: { id: run.id },
        body: { action: "send_back", note: "Tighten the tolerance." },
      });
    },
  },
  {
    name: "GET /api/compare",
    expect: READ,
    run: (who) => call(compareRoute, { token: tokens[who], path: `/api/compare?a=${runId}&b=${otherRunId}` }),
  },
  {
    name: "GET /api/projects/:id/measurements",
    expect: READ,
    run: (who) => call(listMeasurements, { token: tokens[who], params: { id: fx.project.id } }),
  },
  {
    name: "POST /api/projects/:id/measurements",
    expect: { owner: 201, designer: 201, reviewer: 403, viewer: 403, outsider: 404 },
    run: (who) =>
      call(uploadMeasurement, {
        token: tokens[who],
        params: { id: fx.project.id },
        body: { name: `bench ${who}`, csv: "100,-1,-5\n1000,-3,-45\n" },
      }),
  },
  {
    name: "GET /api/runs/:id/readings",
    expect: READ,
    run: (who) => call(listReadings, { token: tokens[who], params: { id: runId } }),
  },
  {
    name: "POST /api/runs/:id/readings (as for bench measurements)",
    expect: { owner: 201, designer: 201, reviewer: 403, viewer: 403, outsider: 404 },
    run: (who) =>
      call(postReading, {
        token: tokens[who],
        params: { id: runId },
        body: { quantity: "frequency", form: "value", value: 1000, note: `read by ${who}` },
      }),
  },
  {
    name: "GET /api/teams/:id/invitations",
    expect: { owner: 200, designer: 403, reviewer: 403, viewer: 403, outsider: 404 },
    run: (who) => call(listInvitations, { token: tokens[who], params: { id: fx.team.id } }),
  },
  {
    name: "POST /api/teams/:id/invitations",
    expect: { owner: 201, designer: 403, reviewer: 403, viewer: 403, outsider: 404 },
    run: (who) =>
      call(invite, {
        token: tokens[who],
        params: { id: fx.team.id },
        body: { email: `new-${who}@x.test`, role: "viewer" },
      }),
  },
];

describe("route × role", () => {
  for (const c of cases) {
    it(c.name, async () => {
      const got = {} as Record<Who, number>;
      for (const who of EVERYONE) got[who] = (await c.run(who)).status;
      expect(got).toEqual(c.expect);
    });
  }

  it("the outsider's own project and run answer 404 to every member of the first team", async () => {
    const foreignRun = await insertRun(fx.otherProject.id, fx.users.outsider.id);
    for (const who of ["owner", "designer", "reviewer", "viewer"] as const) {
      const t = tokens[who];
      const statuses = [
        (await call(listRuns, { token: t, params: { id: fx.otherProject.id } })).status,
        (await call(getRun, { token: t, params: { id: foreignRun.id } })).status,
        (await call(listComments, { token: t, params: { id: foreignRun.id } })).status,
        (await call(exportCsv, { token: t, params: { id: foreignRun.id } })).status,
        (await call(reviewRoute, { token: t, params: { id: foreignRun.id }, body: { action: "submit" } }))
          .status,
        (await call(compareRoute, { token: t, path: `/api/compare?a=${runId}&b=${foreignRun.id}` })).status,
        (await call(listMeasurements, { token: t, params: { id: fx.otherProject.id } })).status,
        (
          await call(invite, {
            token: t,
            params: { id: fx.otherTeam.id },
            body: { email: "z@x.test", role: "viewer" },
          })
        ).status,
      ];
      expect(statuses).toEqual([404, 404, 404, 404, 404, 404, 404, 404]);
    }
  });

  it("no token or an unknown token is 401 on every route, /api/dev/outbox included", async () => {
    const bogus = `pw_${"A".repeat(43)}`;
    const statuses = [
      (await call(listRuns, { token: bogus, params: { id: fx.project.id } })).status,
      (await call(getRun, { token: bogus, params: { id: runId } })).status,
      (await call(postComment, { token: bogus, params: { id: runId }, body: { body: "x" } })).status,
      (await call(reviewRoute, { token: bogus, params: { id: runId }, body: { action: "submit" } })).status,
      (await call(compareRoute, { token: bogus, path: `/api/compare?a=${runId}&b=${otherRunId}` })).status,
      (await call(listReadings, { token: bogus, params: { id: runId } })).status,
    ];
    expect(statuses).toEqual([401, 401, 401, 401, 401, 401]);
    expect((await call(outboxRoute, {})).status).toBe(401);
    expect((await call(outboxRoute, { token: bogus })).status).toBe(401);
  });
});
