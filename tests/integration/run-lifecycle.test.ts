/**
 * The one state machine of a run's solve (lib/run-lifecycle.ts) against the real database: every
 * allowed transition moves runs.status and run_jobs.state together, a disallowed one is refused,
 * racing transitions cannot both win, and a job whose worker died is taken back within 60 s.
 */
import { createHash } from "node:crypto";
import { beforeEach, describe, expect, it } from "vitest";
import { Run, RunJob, sequelize } from "@/lib/db";
import {
  beat,
  canMove,
  claim,
  complete,
  fail,
  finishCancelled,
  getRunJob,
  HEARTBEAT_SECONDS,
  markAbandoned,
  openJob,
  RUN_TRANSITIONS,
  recoverStale,
  requestCancel,
  STALE_JOB_SECONDS,
} from "@/lib/run-lifecycle";
import type { RunStatus } from "@/models/run";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

let fx: Fixtures;
beforeEach(async () => {
  fx = await createFixtures();
});

async function queued(): Promise<string> {
  const netlist = `title lifecycle ${Math.random()}`;
  const run = await Run.create({
    projectId: fx.project.id,
    authorId: fx.users.designer.id,
    title: "lifecycle",
    netlist,
    netlistHash: createHash("sha256").update(netlist).digest("hex"),
    solverVersion: "queued",
    status: "queued",
    result: null,
  });
  await openJob(run.id);
  return run.id;
}

/** The run's status and its job's state, which must always agree. */
async function states(runId: string): Promise<RunStatus> {
  const run = await Run.findByPk(runId, { attributes: ["status"] });
  const job = await RunJob.findByPk(runId);
  expect(job?.state).toBe(run?.status);
  return run!.status;
}

const result = {
  solverVersion: "t",
  result: { ok: true },
  measures: [],
  checks: [],
  checksPassed: 0,
  checksTotal: 0,
};

describe("the transition table", () => {
  it("lets final states go nowhere and refuses a move it does not list", async () => {
    for (const s of ["ok", "failed", "cancelled"] as const) expect(RUN_TRANSITIONS[s]).toEqual([]);
    expect(canMove("queued", "ok")).toBe(false);
    expect(canMove("running", "ok")).toBe(true);
    const id = await queued();
    expect(await complete(id, result)).toBe(false); // queued → ok is not a move
    expect(await states(id)).toBe("queued");
  });
});

describe("each transition moves the run and its job together", () => {
  it("queued → running → ok (with the result), heartbeat in between", async () => {
    const id = await queued();
    expect(await claim(id, "w1")).toBe(true);
    expect(await states(id)).toBe("running");
    expect((await RunJob.findByPk(id))!.attempts).toBe(1);
    expect(await beat(id, 0.5)).toEqual({ cancelRequested: false });
    expect((await getRunJob(id))!.progress).toBe(0.5);
    expect(await complete(id, result)).toBe(true);
    expect(await states(id)).toBe("ok");
    const job = await getRunJob(id);
    expect(job).toMatchObject({ progress: 1, error: null });
    expect(job!.finishedAt).not.toBeNull();
    expect((await Run.findByPk(id))!.checksTotal).toBe(0);
    expect(await beat(id, 0.9)).toBeNull(); // no longer running
  });

  it("queued → failed and running → failed keep the reason", async () => {
    const a = await queued();
    expect(await fail(a, "the job queue is not reachable")).toBe(true);
    expect(await states(a)).toBe("failed");
    const b = await queued();
    await claim(b, "w1");
    expect(await fail(b, "line 2, column 5: boom")).toBe(true);
    expect(await states(b)).toBe("failed");
    expect((await getRunJob(b))!.error).toBe("line 2, column 5: boom");
  });

  it("cancel: queued at once; running when its worker sees the request; final left alone", async () => {
    const a = await queued();
    expect(await requestCancel(a)).toBe("cancelled");
    expect(await states(a)).toBe("cancelled");
    expect(await claim(a, "w1")).toBe(false); // a worker reaching it leaves it alone

    const b = await queued();
    await claim(b, "w1");
    expect(await requestCancel(b)).toBe("requested");
    expect(await states(b)).toBe("running");
    expect(await beat(b, 0.3)).toEqual({ cancelRequested: true });
    expect(await finishCancelled(b)).toBe(true);
    expect(await states(b)).toBe("cancelled");
    expect(await requestCancel(b)).toBe("final");
  });

  it("a cancelled-while-queued run is never claimed, even if the cancel came first in a race", async () => {
    for (let i = 0; i < 5; i++) {
      const id = await queued();
      const [claimed, cancelled] = await Promise.all([claim(id, "w"), requestCancel(id)]);
      const final = await states(id);
      // Exactly one of the two won, and the state says which.
      expect(claimed ? final === "running" && cancelled === "requested" : final === "cancelled").toBe(true);
    }
  });

  it("a cancel racing a finish: one final state, run and job agree", async () => {
    for (let i = 0; i < 5; i++) {
      const id = await queued();
      await claim(id, "w");
      const [done, asked] = await Promise.all([complete(id, result), requestCancel(id)]);
      const final = await states(id);
      expect(done).toBe(true); // the finished result is kept (nothing computed is thrown away)
      expect(final).toBe("ok");
      expect(["requested", "final"]).toContain(asked);
      expect(await finishCancelled(id)).toBe(false); // too late: ok is final
    }
  });
});

describe("a worker that died", () => {
  it("is detected within 60 s: stale after STALE_JOB_SECONDS without a heartbeat", async () => {
    expect(HEARTBEAT_SECONDS * 3).toBeLessThanOrEqual(STALE_JOB_SECONDS); // three missed beats
    expect(STALE_JOB_SECONDS + 15).toBeLessThanOrEqual(60); // + the recovery interval
    const id = await queued();
    await claim(id, "dead-worker");
    await beat(id, 0.19);
    // 30 s without a beat: still alive.
    await sequelize.query(
      "UPDATE run_jobs SET updated_at = now() - interval '30 seconds' WHERE run_id = :id",
      {
        replacements: { id },
      },
    );
    expect(await recoverStale()).toEqual([]);
    // 45 s: taken back, progress reset, attempts kept.
    await sequelize.query(
      "UPDATE run_jobs SET updated_at = now() - interval '45 seconds' WHERE run_id = :id",
      {
        replacements: { id },
      },
    );
    expect(await recoverStale()).toEqual([id]);
    expect(await states(id)).toBe("queued");
    expect(await getRunJob(id)).toMatchObject({ progress: 0, startedAt: null });
    // Another worker claims it.
    expect(await claim(id, "w2")).toBe(true);
    expect((await RunJob.findByPk(id))!.attempts).toBe(2);
  });

  it("stopped by the queue is stale at once; a cancel asked meanwhile ends it cancelled", async () => {
    const a = await queued();
    await claim(a, "w");
    await markAbandoned(a);
    expect(await recoverStale()).toEqual([a]);

    const b = await queued();
    await claim(b, "w");
    await requestCancel(b);
    await markAbandoned(b);
    expect(await recoverStale()).toEqual([]);
    expect(await states(b)).toBe("cancelled");
  });
});
