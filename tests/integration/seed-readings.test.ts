// The demo's bench readings: one inside the Monte Carlo spread, one outside, added once.
import { describe, expect, it } from "vitest";
import { BenchReading, Run } from "@/lib/db";
import { INSIDE_SPREAD, OUTSIDE_SPREAD } from "@/lib/reading-math";
import { readingsOfRuns } from "@/lib/readings";
import { objectExists } from "@/lib/storage/object-store";
import { seedDemo } from "../../scripts/seed";
import { SPREAD_RUN_TITLE } from "../../scripts/seed-readings";
import { useTestDb } from "./setup";

useTestDb({ truncate: "file" });

describe("demo bench readings", () => {
  it("put board 1 inside the spread and board 3 outside it, with board 1's scope CSV in the store", async () => {
    await seedDemo();
    const run = await Run.findOne({ where: { title: SPREAD_RUN_TITLE } });
    expect(run).not.toBeNull();
    const readings = (await readingsOfRuns([String(run?.id)])).get(String(run?.id)) ?? [];
    expect(readings.map((r) => r.comparison.spread?.verdict)).toEqual([INSIDE_SPREAD, OUTSIDE_SPREAD]);
    // 6.3 div × 100 µs/div = 630 µs → 1587.3 Hz (1/630 µs); the counter's 1443 Hz is taken as read.
    expect(readings[0]?.comparison.measured).toBeCloseTo(1 / 630e-6, 6);
    expect(readings[1]?.comparison.measured).toBe(1443);
    expect(readings[0]?.attachment?.type).toBe("text/csv");
    const row = await BenchReading.findByPk(readings[0]?.id);
    expect(await objectExists(String(row?.attachmentKey))).toBe(true);
  });

  it("adds nothing on a second seed", async () => {
    const before = { runs: await Run.count(), readings: await BenchReading.count() };
    await seedDemo();
    expect({ runs: await Run.count(), readings: await BenchReading.count() }).toEqual(before);
    expect(before.readings).toBe(2);
  });
});
