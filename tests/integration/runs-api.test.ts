import { createHash } from "node:crypto";
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { GET as compareRoute } from "@/app/api/compare/route";
import {
  GET as listMeasurementsRoute,
  POST as uploadRoute,
} from "@/app/api/projects/[id]/measurements/route";
import { POST as createRunRoute, GET as listRunsRoute } from "@/app/api/projects/[id]/runs/route";
import { GET as exportRoute } from "@/app/api/runs/[id]/export.csv/route";
import { GET as getRunRoute } from "@/app/api/runs/[id]/route";
import { Measurement, ReviewEvent, Run } from "@/lib/db";
import { MAX_NETLIST_BYTES } from "@/lib/limits";
import { call, insertRun, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

// First-order RC low-pass, R = 10 kΩ, C = 10 nF (CHECKS.md §1, OAFE §16.2 Fig. 16-2 — confirmed):
// fc = 1/(2πRC) = 1591.5494309190 Hz; at 10·fc |H| = −20.043214 dB, −84.289407°.
const RC_LOWPASS = `title RC low-pass check
Vin: vsource   in  gnd 1
R1:  resistor  in  out 10k
C1:  capacitor out gnd 10n
sweep 100Hz to 100kHz log 20 per decade
show H = volts(out) / volts(in)
measure fc  = crossing(H, half-power)
measure att = db(H) at 15.915494309190kHz
measure ph  = phase(H) at 15.915494309190kHz
check fc between 1.5kHz and 1.7kHz
check att > -10dB
`;

const BROKEN = `title broken
R1: resistor in out 10q
C1: capacitr out gnd 10n
`;

let fx: Fixtures;
let tokens: Record<Who, string>;

beforeAll(() => {
  process.env.OUTBOX_AUTODELIVER = "0";
});

beforeEach(async () => {
  fx = await createFixtures();
  tokens = await tokensFor(fx);
});

const save = (who: Who, body: unknown, id = fx.project.id) =>
  call(createRunRoute, { token: tokens[who], params: { id }, body });

describe("POST /api/projects/:id/runs", () => {
  it("solves and saves: 201 with the run, and the row holds the solver's real values", async () => {
    const res = await save("designer", { title: "RC corner", netlist: RC_LOWPASS });
    expect(res.status).toBe(201);
    const run = res.body.run;
    expect(run).toMatchObject({
      title: "RC corner",
      authorName: "Fixture designer",
      reviewState: "draft",
      status: "ok",
    });
    expect(run.checksTotal).toBe(2);
    expect(run.checksPassed).toBe(1); // att is about −20 dB, so "att > -10dB" fails

    const row = await Run.findByPk(run.id);
    expect(row?.netlistHash).toBe(createHash("sha256").update(RC_LOWPASS).digest("hex"));
    expect(row?.authorId).toBe(fx.users.designer.id);
    const measures = row?.measures as { name: string; value: number }[];
    const value = (n: string) => measures.find((m) => m.name === n)?.value ?? Number.NaN;
    expect(value("fc")).toBeCloseTo(1591.549430919, 6); // CHECKS.md §1
    expect(value("att")).toBeCloseTo(-20.043214, 5); // CHECKS.md §1
    expect(value("ph")).toBeCloseTo(-84.289407, 5); // CHECKS.md §1
    const result = row?.result as { frequencies: number[]; traces: { name: string }[] };
    expect(result.frequencies).toHaveLength(61); // 100 Hz … 100 kHz, 20 per decade, both ends
    expect(result.traces.map((t) => t.name)).toEqual(["H"]);
  });

  it("422 invalid_netlist with every error's line and column, and nothing saved", async () => {
    const res = await save("designer", { title: "Broken", netlist: BROKEN });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe("invalid_netlist");
    const errors = res.body.error.details.errors as { line: number; column: number; message: string }[];
    expect(errors.length).toBeGreaterThanOrEqual(2);
    expect(errors.map((e) => e.line)).toEqual(expect.arrayContaining([2, 3]));
    for (const e of errors) {
      expect(e.column).toBeGreaterThan(0);
      expect(e.message.length).toBeGreaterThan(0);
    }
    expect(await Run.count()).toBe(0);
  });

  it("400 on malformed JSON and on missing fields (named), 413 on an oversized netlist", async () => {
    const malformed = await call(createRunRoute, {
      token: tokens.designer,
      params: { id: fx.project.id },
      rawBody: "{title:",
    });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.message).toBe("The request body is not valid JSON.");
    const missing = await save("designer", { netlist: RC_LOWPASS });
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.details.fields)).toEqual(["title"]);
    const huge = await save("designer", {
      title: "big",
      netlist: `# ${"x".repeat(MAX_NETLIST_BYTES)}\n${RC_LOWPASS}`,
    });
    expect(huge.status).toBe(413);
    expect(await Run.count()).toBe(0);
  });

  it("a sweep over the saved-run limit is refused with line and column, nothing saved", async () => {
    const many = RC_LOWPASS.replace(
      "sweep 100Hz to 100kHz log 20 per decade",
      "sweep 1Hz to 1MHz linear 200000 points",
    );
    const res = await save("designer", { title: "too many", netlist: many });
    expect([413, 422]).toContain(res.status);
    if (res.status === 422) expect(res.body.error.details.errors[0].line).toBe(5);
    expect(await Run.count()).toBe(0);
  });

  it("viewer and reviewer 403, outsider 404, an id that isn't a UUID 404", async () => {
    expect((await save("viewer", { title: "t", netlist: RC_LOWPASS })).status).toBe(403);
    expect((await save("reviewer", { title: "t", netlist: RC_LOWPASS })).status).toBe(403);
    expect((await save("outsider", { title: "t", netlist: RC_LOWPASS })).status).toBe(404);
    expect((await save("owner", { title: "t", netlist: RC_LOWPASS }, "not-a-uuid")).status).toBe(404);
    expect(await Run.count()).toBe(0);
  });

  it("supersedesId links the new run to an earlier one and records a supersede event in the same save", async () => {
    const first = await save("designer", { title: "rev 1", netlist: RC_LOWPASS });
    const second = await save("designer", {
      title: "rev 2",
      netlist: RC_LOWPASS,
      supersedesId: first.body.run.id,
    });
    expect(second.status).toBe(201);
    expect(second.body.run.supersedesId).toBe(first.body.run.id);
    const events = await ReviewEvent.findAll({ where: { runId: first.body.run.id } });
    expect(events.map((e) => [e.action, e.note])).toEqual([["supersede", 'Superseded by "rev 2".']]);
    const foreign = await insertRun(fx.otherProject.id, fx.users.outsider.id);
    const bad = await save("designer", { title: "rev 3", netlist: RC_LOWPASS, supersedesId: foreign.id });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields.supersedesId).toEqual(["Not a run of this project."]);
  });
});

describe("GET /api/projects/:id/runs", () => {
  it("sorts, filters and pages on the server", async () => {
    const d = fx.users.designer.id;
    await insertRun(fx.project.id, d, { title: "Bravo notch" });
    await insertRun(fx.project.id, fx.users.owner.id, {
      title: "alpha bridge",
      reviewState: "awaiting_signoff",
    });
    await insertRun(fx.project.id, d, { title: "Charlie bridge", reviewState: "signed_off" });
    await insertRun(fx.otherProject.id, fx.users.outsider.id, { title: "Other team bridge" });
    const list = (q: string, who: Who = "viewer") =>
      call(listRunsRoute, {
        token: tokens[who],
        params: { id: fx.project.id },
        path: `/api/projects/x/runs?${q}`,
      });

    const byTitle = await list("sort=title&dir=asc");
    expect(byTitle.status).toBe(200);
    expect(byTitle.body.runs.map((r: { title: string }) => r.title)).toEqual([
      "alpha bridge",
      "Bravo notch",
      "Charlie bridge",
    ]);
    expect(byTitle.body.total).toBe(3);
    const newest = await list("");
    expect(newest.body.runs.map((r: { title: string }) => r.title)).toEqual([
      "Charlie bridge",
      "alpha bridge",
      "Bravo notch",
    ]);
    const bridges = await list("q=BRIDGE&sort=title&dir=desc");
    expect(bridges.body.runs.map((r: { title: string }) => r.title)).toEqual([
      "Charlie bridge",
      "alpha bridge",
    ]);
    const inReview = await list("review=awaiting_signoff");
    expect(inReview.body.runs.map((r: { authorName: string }) => r.authorName)).toEqual(["Fixture owner"]);
    const mine = await list(`author=${d}&sort=title&dir=asc`);
    expect(mine.body.runs.map((r: { title: string }) => r.title)).toEqual(["Bravo notch", "Charlie bridge"]);
    const page2 = await list("sort=title&dir=asc&pageSize=2&page=2");
    expect(page2.body).toMatchObject({ total: 3, page: 2, pageSize: 2, pages: 2 });
    expect(page2.body.runs.map((r: { title: string }) => r.title)).toEqual(["Charlie bridge"]);
    expect(page2.body.runs[0].measures).toEqual([{ name: "fc", value: 1000, unit: "Hz", reason: null }]);
    expect(page2.body.runs[0]).not.toHaveProperty("result");

    const byAuthor = await list("sort=author&dir=asc");
    expect(byAuthor.body.runs.map((r: { authorName: string }) => r.authorName)).toEqual([
      "Fixture designer",
      "Fixture designer",
      "Fixture owner",
    ]);
    await Run.update({ checksPassed: 0 }, { where: { title: "Bravo notch" } });
    const byChecks = await list("sort=checksPassed&dir=asc");
    expect(byChecks.body.runs[0].title).toBe("Bravo notch");

    const bad = await list("sort=colour&pageSize=1000");
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.details.fields).sort()).toEqual(["pageSize", "sort"]);
    expect((await list("", "outsider")).status).toBe(404);
  });
});

describe("run, export, compare, measurements", () => {
  it("GET /api/runs/:id returns the result; CSV export has one row per frequency", async () => {
    const saved = await save("designer", { title: "RC corner", netlist: RC_LOWPASS });
    const id = saved.body.run.id;
    const res = await call(getRunRoute, { token: tokens.viewer, params: { id } });
    expect(res.status).toBe(200);
    expect(res.body.run.result.frequencies).toHaveLength(61);
    expect(res.body.run.project).toMatchObject({ id: fx.project.id, teamName: "Fixture Bench" });
    expect(res.body.run.permissions).toEqual({
      comment: false,
      review: false,
      askSignOff: false,
      createRun: false,
    });

    const csv = await call(exportRoute, { token: tokens.viewer, params: { id } });
    expect(csv.status).toBe(200);
    expect(csv.headers.get("content-type")).toContain("text/csv");
    expect(csv.headers.get("content-disposition")).toBe('attachment; filename="RC-corner.csv"');
    const lines = csv.text.trim().split(/\r?\n/);
    expect(lines[0]).toBe("frequency_hz,H_re,H_im,H_db,H_deg,H_delay_s");
    expect(lines).toHaveLength(62);
    expect(Number(lines[1]?.split(",")[0])).toBeCloseTo(100, 9);

    expect((await call(getRunRoute, { token: tokens.outsider, params: { id } })).status).toBe(404);
    expect((await call(exportRoute, { token: tokens.outsider, params: { id } })).status).toBe(404);
    expect((await call(getRunRoute, { token: tokens.viewer, params: { id: "123" } })).status).toBe(404);
  });

  it("GET /api/compare needs both runs visible", async () => {
    const a = await save("designer", { title: "10 nF", netlist: RC_LOWPASS });
    const b = await save("designer", {
      title: "22 nF",
      netlist: RC_LOWPASS.replace("out gnd 10n", "out gnd 22n"),
    });
    const path = `/api/compare?a=${a.body.run.id}&b=${b.body.run.id}`;
    const res = await call(compareRoute, { token: tokens.viewer, path });
    expect(res.status).toBe(200);
    expect(res.body.a.title).toBe("10 nF");
    const fc = res.body.comparison.measures.find((m: { name: string }) => m.name === "fc");
    // fc scales as 1/C: 10/22 of 1591.549 Hz (common practice, from fc = 1/(2πRC)).
    expect(fc.b).toBeCloseTo((1591.549430919 * 10) / 22, 5);
    expect(fc.deltaPct).toBeCloseTo((10 / 22 - 1) * 100, 6);
    const changed = res.body.comparison.parts.filter((p: { change: string }) => p.change === "changed");
    expect(changed.map((p: { name: string }) => p.name)).toEqual(["C1"]);

    const foreign = await insertRun(fx.otherProject.id, fx.users.outsider.id);
    const hidden = await call(compareRoute, {
      token: tokens.viewer,
      path: `/api/compare?a=${a.body.run.id}&b=${foreign.id}`,
    });
    expect(hidden.status).toBe(404);
    const malformed = await call(compareRoute, { token: tokens.viewer, path: "/api/compare?a=1" });
    expect(malformed.status).toBe(400);
    expect(Object.keys(malformed.body.error.details.fields).sort()).toEqual(["a", "b"]);
  });

  it("POST measurements: a CSV upload is stored; bad rows come back with their line numbers", async () => {
    const csv =
      "frequency_hz,magnitude_db,phase_deg\n100,-0.0017,-3.6\n1000,-3.01,-45.0\n\n10000,-20.04,-84.3\n";
    const form = new FormData();
    form.set("name", "Board 3 bench sweep");
    form.set("file", new Blob([csv], { type: "text/csv" }), "board3.csv");
    const req = new Request("http://localhost/api/projects/x/measurements", {
      method: "POST",
      headers: { authorization: `Bearer ${tokens.designer}` },
      body: form,
    });
    const res = await uploadRoute(req, { params: Promise.resolve({ id: fx.project.id }) });
    expect(res.status).toBe(201);
    const row = await Measurement.findOne();
    expect(row?.points).toBe(3);
    expect(row?.data).toEqual({
      frequencies: [100, 1000, 10000],
      magnitudeDb: [-0.0017, -3.01, -20.04],
      phaseDeg: [-3.6, -45, -84.3],
    });

    const bad = await call(uploadRoute, {
      token: tokens.designer,
      params: { id: fx.project.id },
      body: { name: "bad", csv: "f,db,deg\n100,-1,-2\n50,-1,-2\n200,x,-3\n300,-1\n" },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.errors).toEqual([
      { line: 3, message: "Frequencies must rise: 50 Hz follows 100 Hz." },
      { line: 4, message: 'Column 2 is not a magnitude in dB: "x".' },
      { line: 5, message: "Expected 3 columns (frequency, magnitude dB, phase deg), found 2." },
    ]);
    expect(
      (
        await call(uploadRoute, {
          token: tokens.viewer,
          params: { id: fx.project.id },
          body: { name: "v", csv },
        })
      ).status,
    ).toBe(403);
    expect(
      (
        await call(uploadRoute, {
          token: tokens.outsider,
          params: { id: fx.project.id },
          body: { name: "v", csv },
        })
      ).status,
    ).toBe(404);
    const list = await call(listMeasurementsRoute, { token: tokens.reviewer, params: { id: fx.project.id } });
    expect(list.body.measurements.map((m: { name: string; points: number }) => [m.name, m.points])).toEqual([
      ["Board 3 bench sweep", 3],
    ]);
  });
});
