// Bench readings through the route handlers, against PostgreSQL and the object store fake (s3rver,
// started by scripts/test.sh or by global-setup.ts): upload, download, roles, the store being down,
// and validation errors by field.
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { GET as compareRoute } from "@/app/api/compare/route";
import { GET as getAttachment } from "@/app/api/runs/[id]/readings/[readingId]/attachment/route";
import { DELETE as deleteRoute } from "@/app/api/runs/[id]/readings/[readingId]/route";
import { GET as listRoute, POST as postRoute } from "@/app/api/runs/[id]/readings/route";
import { POST as reviewRoute } from "@/app/api/runs/[id]/review/route";
import { BenchReading, OutboxEmail, Run } from "@/lib/db";
import { INSIDE_SPREAD, OUTSIDE_SPREAD } from "@/lib/reading-math";
import { configureObjectStore, objectExists, type StoreConfig } from "@/lib/storage/object-store";
import { call, insertRun, smallResult, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();
process.env.OUTBOX_AUTODELIVER = "0";

let fx: Fixtures;
let tokens: Record<Who, string>;
let runId: string;

// The predicted frequency of an equal-part bridge, f0 = 1/(2πRC) with R = 10 kΩ, C = 1.6 nF
// (common practice): 9947.18 Hz.
const F0 = 1 / (2 * Math.PI * 10e3 * 1.6e-9);

beforeEach(async () => {
  fx = await createFixtures();
  tokens = await tokensFor(fx);
  const run = await insertRun(fx.project.id, fx.users.designer.id, { title: "Bridge fixture" });
  const measures = [{ name: "f0", value: F0, unit: "Hz", reason: null }];
  // A hand-made Monte Carlo summary: 300 samples spread evenly over 9.8…10.1 kHz.
  const monteCarlo = {
    samples: 300,
    seed: 1,
    yield: 1,
    measures: [
      {
        name: "f0",
        mean: 9950,
        std: 86.6,
        min: 9800,
        max: 10100,
        percentiles: { p1: 9803, p5: 9815, p50: 9950, p95: 10085, p99: 10097 },
        histogram: { edges: [9800, 9900, 10000, 10100], counts: [100, 100, 100] },
      },
    ],
  };
  await Run.update(
    { measures, result: { ...smallResult(), measures, monteCarlo } },
    { where: { id: run.id } },
  );
  runId = run.id;
});

const PNG = new Uint8Array([
  0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 73, 72, 68, 82, 1, 2, 3,
]);

/** Calls the POST handler with multipart form data, as a browser's form would send it. */
async function postForm(
  who: Who,
  fields: Record<string, string>,
  file?: { bytes: Uint8Array; name: string },
) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  if (file) form.set("file", new File([Buffer.from(file.bytes)], file.name));
  const req = new Request("http://localhost/api/runs/x/readings", {
    method: "POST",
    headers: { authorization: `Bearer ${tokens[who]}` },
    body: form,
  });
  const res = await postRoute(req, { params: Promise.resolve({ id: runId }) });
  return { status: res.status, body: await res.json() };
}

const scope = {
  quantity: "period",
  form: "divisions",
  divisions: "9.8",
  perDivision: "10e-6",
  measureName: "f0",
};

describe("POST and GET /api/runs/:id/readings", () => {
  it("records an oscilloscope period with its arithmetic and its place in the spread", async () => {
    const res = await call(postRoute, {
      token: tokens.designer,
      params: { id: runId },
      body: {
        quantity: "period",
        form: "divisions",
        divisions: 9.8,
        perDivision: 10e-6,
        measureName: "f0",
        node: "out",
      },
    });
    expect(res.status).toBe(201);
    const r = res.body.reading;
    // 9.8 div × 10 µs/div = 98 µs; 1/98 µs = 10 204.08 Hz (the worked example).
    expect(r.steps).toBe("9.8 div × 10 µs/div = 98 µs → 10.2 kHz");
    expect(r.comparison.measured).toBeCloseTo(1 / 98e-6, 6);
    expect(r.comparison.predicted).toBeCloseTo(F0, 6);
    expect(r.comparison.deviationPct).toBeCloseTo(((1 / 98e-6 - F0) / F0) * 100, 9); // +2.58 %
    expect(r.comparison.spread).toMatchObject({ percentile: 100, inside: false, verdict: OUTSIDE_SPREAD });

    const inside = await call(postRoute, {
      token: tokens.owner,
      params: { id: runId },
      body: { quantity: "frequency", form: "value", value: 9947.18, measureName: "f0" },
    });
    // 100 samples below 9.9 kHz and 47.18 of the next bin's 100: (100 + 47.18) / 300 = 49.06 %.
    expect(inside.body.reading.comparison.spread.percentile).toBeCloseTo(49.06, 2);
    expect(inside.body.reading.comparison.spread.verdict).toBe(INSIDE_SPREAD);

    const list = await call(listRoute, { token: tokens.viewer, params: { id: runId } });
    expect(list.status).toBe(200);
    expect(list.body.readings.map((x: { authorName: string }) => x.authorName)).toEqual([
      "Fixture designer",
      "Fixture owner",
    ]);
  });

  it("lets designers and owners record, not reviewers or viewers; outsiders see no run", async () => {
    const body = { quantity: "amplitude", form: "peak", value: 2.9 };
    const status = async (who: Who) =>
      (await call(postRoute, { token: tokens[who], params: { id: runId }, body })).status;
    expect(await status("designer")).toBe(201);
    expect(await status("owner")).toBe(201);
    expect(await status("reviewer")).toBe(403);
    expect(await status("viewer")).toBe(403);
    expect(await status("outsider")).toBe(404);
    expect((await call(listRoute, { token: tokens.outsider, params: { id: runId } })).status).toBe(404);
    expect(await BenchReading.count()).toBe(2);
  });

  it("names each bad field", async () => {
    const res = await call(postRoute, {
      token: tokens.designer,
      params: { id: runId },
      body: { quantity: "period", form: "divisions", divisions: -1 },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.divisions).toEqual(["The number of divisions must be above 0."]);
    expect(res.body.error.details.fields.perDivision).toEqual(["Enter the scale per division."]);
    const kind = await call(postRoute, {
      token: tokens.designer,
      params: { id: runId },
      body: { quantity: "speed", form: "value", value: 1 },
    });
    expect(Object.keys(kind.body.error.details.fields)).toEqual(["quantity"]);
    const form = await call(postRoute, {
      token: tokens.designer,
      params: { id: runId },
      body: { quantity: "frequency", form: "peak", value: 1 },
    });
    expect(form.body.error.details.fields.form).toEqual(["A frequency is entered as value."]);
    const unit = await call(postRoute, {
      token: tokens.designer,
      params: { id: runId },
      body: { quantity: "amplitude", form: "peak", value: 1, measureName: "f0" },
    });
    expect(unit.status).toBe(400);
    expect(unit.body.error.details.fields.measureName[0]).toContain(
      "cannot be set beside an amplitude reading",
    );
    const multipart = await postForm("designer", {
      quantity: "period",
      form: "divisions",
      divisions: "abc",
      perDivision: "1e-5",
    });
    expect(multipart.body.error.details.fields.divisions).toEqual([
      "The number of divisions must be a number.",
    ]);
    expect(await BenchReading.count()).toBe(0);
  });
});

describe("attachments in the object store", () => {
  it("stores a scope capture, serves it only to the run's team, and deletes it with the reading", async () => {
    const res = await postForm("designer", scope, { bytes: PNG, name: "C:\\scope\\capture 1.png" });
    expect(res.status).toBe(201);
    const r = res.body.reading;
    expect(r.attachment).toMatchObject({ name: "capture 1.png", type: "image/png", size: PNG.byteLength });
    const row = await BenchReading.findByPk(r.id);
    expect(row?.attachmentKey).toMatch(new RegExp(`^runs/${runId}/readings/[0-9a-f-]{36}$`));
    expect(await objectExists(String(row?.attachmentKey))).toBe(true);

    const params = { id: runId, readingId: r.id };
    const got = await call(getAttachment, { token: tokens.viewer, params });
    expect(got.status).toBe(200);
    expect(got.headers.get("content-type")).toBe("image/png");
    expect(got.headers.get("content-disposition")).toContain('inline; filename="capture 1.png"');
    expect((await call(getAttachment, { token: tokens.outsider, params })).status).toBe(404);

    expect((await call(deleteRoute, { token: tokens.reviewer, method: "DELETE", params })).status).toBe(403);
    expect((await call(deleteRoute, { token: tokens.designer, method: "DELETE", params })).status).toBe(204);
    expect(await BenchReading.count()).toBe(0);
    expect(await objectExists(String(row?.attachmentKey))).toBe(false);
  });

  it("judges a file by its content, not its name, and refuses what is neither image nor CSV", async () => {
    const csv = new TextEncoder().encode("time_s,volts\n0,0.1\n1e-5,2.8\n");
    const named = await postForm("designer", scope, { bytes: csv, name: "capture.png" });
    expect(named.body.reading.attachment.type).toBe("text/csv");
    const binary = await postForm("designer", scope, {
      bytes: new Uint8Array([0x4d, 0x5a, 0x90, 0, 3, 0, 0, 0]),
      name: "data.csv",
    });
    expect(binary.status).toBe(400);
    expect(binary.body.error.details.fields.file[0]).toContain("PNG or JPEG");
    const big = new TextEncoder().encode(`a,b\n${"1,2\n".repeat((5 * 1024 * 1024) / 4)}`);
    const tooBig = await postForm("designer", scope, { bytes: big, name: "long.csv" });
    expect(tooBig.status).toBe(413);
    expect(tooBig.body.error.details.fields.file[0]).toBe("A CSV is accepted up to 5 MB.");
    expect(await BenchReading.count()).toBe(1);
  });

  describe("with the store down", () => {
    let saved: StoreConfig | null = null;
    afterEach(() => {
      if (saved) configureObjectStore(saved);
      saved = null;
    });

    it("answers 503 and saves nothing; a reading keeps its file until the store is back", async () => {
      const kept = await postForm("designer", scope, { bytes: PNG, name: "a.png" });
      expect(kept.status).toBe(201);
      saved = configureObjectStore({ endpoint: "http://127.0.0.1:1" }); // nothing listens on port 1

      const res = await postForm("designer", scope, { bytes: PNG, name: "b.png" });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe("storage_unavailable");
      expect(await BenchReading.count()).toBe(1);

      const params = { id: runId, readingId: kept.body.reading.id };
      expect((await call(getAttachment, { token: tokens.viewer, params })).status).toBe(503);
      expect((await call(deleteRoute, { token: tokens.designer, method: "DELETE", params })).status).toBe(
        503,
      );
      expect(await BenchReading.count()).toBe(1);

      // A reading without a file does not need the store.
      const plain = await call(postRoute, {
        token: tokens.designer,
        params: { id: runId },
        body: { quantity: "frequency", form: "value", value: 1e4 },
      });
      expect(plain.status).toBe(201);

      configureObjectStore(saved);
      saved = null;
      expect((await call(deleteRoute, { token: tokens.designer, method: "DELETE", params })).status).toBe(
        204,
      );
      expect(await BenchReading.count()).toBe(1);
    });
  });
});

describe("readings in compare", () => {
  it("sets each reading beside both runs' predictions", async () => {
    const later = await insertRun(fx.project.id, fx.users.designer.id, { title: "Bridge, 1.5 nF" });
    // The same bridge with C = 1.5 nF: f0 = 1/(2π · 10 kΩ · 1.5 nF) = 10 610.33 Hz (common practice).
    const f0b = 1 / (2 * Math.PI * 10e3 * 1.5e-9);
    await Run.update(
      { measures: [{ name: "f0", value: f0b, unit: "Hz", reason: null }] },
      { where: { id: later.id } },
    );
    const reading = {
      quantity: "period",
      form: "divisions",
      divisions: 9.8,
      perDivision: 10e-6,
      measureName: "f0",
    };
    expect(
      (await call(postRoute, { token: tokens.designer, params: { id: runId }, body: reading })).status,
    ).toBe(201);

    const res = await call(compareRoute, {
      token: tokens.viewer,
      path: `/api/compare?a=${runId}&b=${later.id}`,
    });
    expect(res.status).toBe(200);
    expect(res.body.readings).toHaveLength(1);
    const row = res.body.readings[0];
    expect(row.of).toBe("a");
    expect(row.against.a.deviationPct).toBeCloseTo(((1 / 98e-6 - F0) / F0) * 100, 9);
    expect(row.against.a.spread.inside).toBe(false);
    // B has no Monte Carlo: a deviation, no spread. 10 204.08 Hz vs 10 610.33 Hz = −3.83 %.
    expect(row.against.b.deviationPct).toBeCloseTo(((1 / 98e-6 - f0b) / f0b) * 100, 9);
    expect(row.against.b.spread).toBeNull();
  });
});

describe("readings in the review e-mail", () => {
  it("lists each reading with its arithmetic and verdict when sign-off is asked", async () => {
    const body = {
      quantity: "period",
      form: "divisions",
      divisions: 9.8,
      perDivision: 10e-6,
      measureName: "f0",
      node: "out",
    };
    expect((await call(postRoute, { token: tokens.designer, params: { id: runId }, body })).status).toBe(201);
    const res = await call(reviewRoute, {
      token: tokens.designer,
      params: { id: runId },
      body: { action: "submit" },
    });
    expect(res.status).toBe(200);
    const mail = await OutboxEmail.findOne({ where: { to: "reviewer@fixture.test" } });
    expect(mail?.text).toContain("Bench readings (1):");
    expect(mail?.text).toContain(
      "- Period (oscilloscope) at out: 9.8 div × 10 µs/div = 98 µs → 10.2 kHz — f0: measured 10.2 kHz, predicted 9.947 kHz (+2.58 %); above every Monte Carlo sample, outside: look for a build fault or a wrong part (Fixture designer)",
    );
  });
});
