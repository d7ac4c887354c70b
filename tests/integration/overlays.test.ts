// Bench data is drawn on a run only when attached to it (lib/run-overlays.ts via /api/runs/:id/overlays).
import { beforeEach, describe, expect, it } from "vitest";
import { GET as getOverlays, PUT as putOverlays } from "@/app/api/runs/[id]/overlays/route";
import { Measurement } from "@/lib/db";
import { call, insertRun, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

let fx: Fixtures;
let tokens: Record<Who, string>;

beforeEach(async () => {
  fx = await createFixtures();
  tokens = await tokensFor(fx);
});

const data = { frequencies: [100, 1000], magnitudeDb: [0, -3], phaseDeg: [0, -45] };
const measurement = (projectId: string, name: string) =>
  Measurement.create({ projectId, uploadedById: fx.users.designer.id, name, data, points: 2 });

describe("bench data overlays of a run", () => {
  it("none by default; designers choose from the run's project; everyone who reads the run sees the list", async () => {
    const run = await insertRun(fx.project.id, fx.users.designer.id, { title: "Overlay run" });
    const m1 = await measurement(fx.project.id, "board 1");
    const m2 = await measurement(fx.project.id, "board 2");
    const foreign = await measurement(fx.otherProject.id, "elsewhere");
    const params = { id: run.id };

    expect((await call(getOverlays, { token: tokens.viewer, params })).body).toEqual({ measurementIds: [] });

    const set = await call(putOverlays, {
      token: tokens.designer,
      params,
      method: "PUT",
      body: { measurementIds: [m2.id, m1.id] },
    });
    expect(set.status).toBe(200);
    // The order of attachment is kept (each set gets its own symbol in that order).
    expect((await call(getOverlays, { token: tokens.reviewer, params })).body).toEqual({
      measurementIds: [m2.id, m1.id],
    });

    // Viewers and reviewers may not change it; an outsider does not see the run.
    for (const who of ["viewer", "reviewer"] as const) {
      const res = await call(putOverlays, {
        token: tokens[who],
        params,
        method: "PUT",
        body: { measurementIds: [] },
      });
      expect(res.status).toBe(403);
    }
    expect((await call(getOverlays, { token: tokens.outsider, params })).status).toBe(404);

    // Another project's data, or a malformed id, is refused with the field named; nothing changes.
    const wrong = await call(putOverlays, {
      token: tokens.designer,
      params,
      method: "PUT",
      body: { measurementIds: [foreign.id] },
    });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details.fields.measurementIds).toEqual(["Not a measurement of this project."]);
    const bad = await call(putOverlays, {
      token: tokens.designer,
      params,
      method: "PUT",
      body: { measurementIds: ["x"] },
    });
    expect(bad.status).toBe(400);
    expect((await call(getOverlays, { token: tokens.designer, params })).body.measurementIds).toHaveLength(2);

    // Deleting a data set takes it off every plot.
    await m2.destroy();
    expect((await call(getOverlays, { token: tokens.designer, params })).body).toEqual({
      measurementIds: [m1.id],
    });
  });
});

describe("what the pages load (issue 14: only what they draw)", () => {
  it("the project's list carries each set's range but not its points; a run loads the points of its overlays only", async () => {
    const { listMeasurements } = await import("@/lib/measurements");
    const { overlaidData, setOverlays } = await import("@/lib/run-overlays");
    const run = await insertRun(fx.project.id, fx.users.designer.id, { title: "Overlay run" });
    const m1 = await measurement(fx.project.id, "board 1");
    await Measurement.create({
      projectId: fx.project.id,
      uploadedById: fx.users.designer.id,
      name: "board 2",
      data: { frequencies: [20, 200, 2000], magnitudeDb: [0, -1, -9], phaseDeg: [0, -10, -60] },
      points: 3,
    });
    const designer = { userId: fx.users.designer.id, email: fx.users.designer.email, name: "d" };

    const list = await listMeasurements(designer, fx.project.id);
    expect(list.map((m) => [m.name, m.points, m.fromHz, m.toHz, "data" in m])).toEqual([
      ["board 2", 3, 20, 2000, false],
      ["board 1", 2, 100, 1000, false],
    ]);

    expect(await overlaidData(run.id)).toEqual([]);
    await setOverlays(designer, run.id, [m1.id]);
    expect(await overlaidData(run.id)).toEqual([{ id: m1.id, name: "board 1", data }]);
  });
});
