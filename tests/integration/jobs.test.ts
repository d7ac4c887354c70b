/**
 * The job queue against the real database: a queued run is solved by an in-process pg-boss worker
 * and its result saved; cancel before start and while running; the progress/cancel route with
 * its authorization.
 */
import { createHash } from "node:crypto";
import { afterAll, beforeEach, describe, expect, it } from "vitest";
import { POST as createRunRoute } from "@/app/api/projects/[id]/runs/route";
import { DELETE as cancelRoute, GET as jobRoute } from "@/app/api/runs/[id]/job/route";
import { Run, sequelize } from "@/lib/db";
import { recoverStaleJobs, solveQueuedRun, startRunSolveWorker } from "@/lib/job-runner";
import {
  cancelRunJob,
  enqueueRunSolve,
  getBoss,
  getRunJob,
  RUN_SOLVE_QUEUE,
  shouldQueue,
  stopBoss,
} from "@/lib/jobs";
import { MAX_QUEUED_SAMPLES } from "@/lib/limits";
import { compile, type SolveSuccess } from "@/solver";
import { stopSampleWorkers } from "@/solver/parallel";
import { call, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

// First-order RC low-pass with a ±10 % resistor (CHECKS.md §1: fc = 1/(2πRC) = 1591.5494309 Hz at
// R = 10 kΩ, C = 10 nF). With R uniform in ±t the spread of fc lies in [f0/(1+t), f0/(1−t)]
// (derived in tests/solver/monte-carlo.test.ts).
const mcNetlist = (samples: number) => `title queued spread
V1: vsource   in  gnd 1
R1: resistor  in  out 10k tol=10%
C1: capacitor out gnd 10n
sweep 10Hz to 100kHz linear 400 points
show H = volts(out) / volts(in)
measure fc = crossing(H, half-power)
check fc between 1.5kHz and 1.7kHz
monte-carlo ${samples} seed=4
`;
const F0 = 1591.5494309189535;

let fx: Fixtures;
let tokens: Record<Who, string>;

beforeEach(async () => {
  fx = await createFixtures();
  tokens = await tokensFor(fx);
});

afterAll(async () => {
  await stopBoss({ graceful: false, timeout: 2000 });
  await stopSampleWorkers();
});

async function queuedRun(netlist: string): Promise<Run> {
  return Run.create({
    projectId: fx.project.id,
    authorId: fx.users.designer.id,
    title: "queued spread",
    netlist,
    netlistHash: createHash("sha256").update(netlist).digest("hex"),
    solverVersion: "queued",
    status: "queued",
    result: null,
  });
}

async function waitFor<T>(read: () => Promise<T>, done: (v: T) => boolean, ms = 60_000): Promise<T> {
  const t0 = Date.now();
  for (;;) {
    const v = await read();
    if (done(v) || Date.now() - t0 > ms) return v;
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe("shouldQueue", () => {
  it("queues 1 000 samples × 400 points (400 400 sweep points of work > 200 000), not 100 × 400", () => {
    const big = compile(mcNetlist(1000));
    const small = compile(mcNetlist(100));
    if (!big.ok || !small.ok) throw new Error("compile");
    expect(shouldQueue(big.circuit)).toBe(true);
    expect(shouldQueue(small.circuit)).toBe(false);
  });
});

describe("a queued run", () => {
  it("is worked by an in-process worker: status ok, result and measures saved, progress 1", async () => {
    const run = await queuedRun(mcNetlist(1000));
    const jobId = await enqueueRunSolve(run.id);
    expect(jobId).toMatch(/[0-9a-f-]{36}/);
    expect(await getRunJob(run.id)).toMatchObject({ state: "queued", progress: 0, jobId });

    const { boss, workerId } = await startRunSolveWorker({ threads: 2, pollingIntervalSeconds: 0.5 });
    const job = await waitFor(
      () => getRunJob(run.id),
      (j) => j?.state === "ok" || j?.state === "failed",
    );
    await boss.offWork(RUN_SOLVE_QUEUE, { id: workerId, wait: true });
    expect(job).toMatchObject({ state: "ok", progress: 1, error: null });

    await run.reload();
    expect(run.status).toBe("ok");
    const result = run.result as SolveSuccess;
    expect(result.ok).toBe(true);
    expect(result.monteCarlo!.samples).toBe(1000);
    const fc = result.monteCarlo!.measures.find((m) => m.name === "fc")!;
    expect(fc.min!).toBeGreaterThanOrEqual((F0 / 1.1) * (1 - 1e-9));
    expect(fc.max!).toBeLessThanOrEqual((F0 / 0.9) * (1 + 1e-9));
    expect(run.checksTotal).toBe(1);
    expect((run.measures as { name: string; value: number }[])[0]!.value).toBeCloseTo(F0, 4);

    const res = await call(jobRoute, { token: tokens.viewer, params: { id: run.id } });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ state: "ok", progress: 1 });
  }, 90_000);

  it("is cancelled before a worker takes it: run 'cancelled', the queue's job cancelled", async () => {
    const run = await queuedRun(mcNetlist(1000));
    const jobId = await enqueueRunSolve(run.id);
    const res = await call(cancelRoute, { token: tokens.designer, method: "DELETE", params: { id: run.id } });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ state: "cancelled" });
    await run.reload();
    expect(run.status).toBe("cancelled");
    const boss = await getBoss();
    const [queued] = await boss.findJobs(RUN_SOLVE_QUEUE, { id: jobId } as never);
    expect(queued?.state).toBe("cancelled");
    // A worker reaching it anyway leaves it alone.
    expect(await solveQueuedRun(run.id)).toBe("cancelled");
  });

  it("stops while running when cancelled, and saves no result", async () => {
    const run = await queuedRun(mcNetlist(20_000));
    await enqueueRunSolve(run.id);
    const solving = solveQueuedRun(run.id, { threads: 0 });
    await waitFor(
      () => getRunJob(run.id),
      (j) => (j?.progress ?? 0) > 0,
    );
    expect((await getRunJob(run.id))?.state).toBe("running");
    await cancelRunJob(run.id);
    expect(await solving).toBe("cancelled");
    await run.reload();
    expect(run.status).toBe("cancelled");
    expect(run.result).toBeNull();
    const job = await getRunJob(run.id);
    expect(job?.state).toBe("cancelled");
    expect(job!.progress).toBeGreaterThan(0);
    expect(job!.progress).toBeLessThan(1);
  }, 90_000);

  it("fails with the netlist's errors kept on the job", async () => {
    const run = await queuedRun("title broken\nR1: resistor in out 10q\n");
    await enqueueRunSolve(run.id);
    expect(await solveQueuedRun(run.id, { threads: 0 })).toBe("failed");
    const job = await getRunJob(run.id);
    expect(job?.error).toMatch(/^line 2, column \d+: /);
    await run.reload();
    expect(run.status).toBe("failed");
  });
});

describe("recoverStaleJobs", () => {
  it("queues again a running job whose worker stopped writing progress; fails it after 3 attempts", async () => {
    const a = await queuedRun(mcNetlist(1000));
    const b = await queuedRun(mcNetlist(1000));
    const firstJob = await enqueueRunSolve(a.id);
    await enqueueRunSolve(b.id);
    await sequelize.query(
      `UPDATE run_jobs SET state = 'running', attempts = CASE WHEN run_id = :b THEN 3 ELSE 1 END,
         updated_at = now() - interval '10 minutes'`,
      { replacements: { b: b.id } },
    );
    await Run.update({ status: "running" }, { where: {} });
    expect(await recoverStaleJobs()).toEqual([a.id]);
    const ja = await getRunJob(a.id);
    expect(ja).toMatchObject({ state: "queued", progress: 0 });
    expect(ja!.jobId).not.toBe(firstJob);
    expect((await Run.findByPk(a.id))!.status).toBe("queued");
    const jb = await getRunJob(b.id);
    expect(jb?.state).toBe("failed");
    expect(jb?.error).toBe("the solve was interrupted 3 times; save the run again to retry");
    expect((await Run.findByPk(b.id))!.status).toBe("failed");
    // A fresh running job is left alone.
    expect(await recoverStaleJobs()).toEqual([]);
  });
});

describe("POST /api/projects/:id/runs with a large study", () => {
  it("saves the run as 'queued' without a result and puts it on the queue", async () => {
    const res = await call(createRunRoute, {
      token: tokens.designer,
      params: { id: fx.project.id },
      body: { title: "big spread", netlist: mcNetlist(1000) },
    });
    expect(res.status).toBe(201);
    expect(res.body.run).toMatchObject({ status: "queued", title: "big spread" });
    const run = await Run.findByPk(res.body.run.id);
    expect(run?.result).toBeNull();
    const job = await getRunJob(res.body.run.id);
    expect(job).toMatchObject({ state: "queued", progress: 0 });
    expect(job?.jobId).toBeTruthy();
    // Solved by a worker afterwards: the nominal fc is the closed form (CHECKS.md §1).
    expect(await solveQueuedRun(res.body.run.id, { threads: 0 })).toBe("ok");
    await run!.reload();
    expect((run!.measures as { value: number }[])[0]!.value).toBeCloseTo(F0, 4);
  }, 60_000);

  it("a large study with errors answers 422 at once and saves nothing", async () => {
    const res = await call(createRunRoute, {
      token: tokens.designer,
      params: { id: fx.project.id },
      body: {
        title: "bad",
        netlist: mcNetlist(1000).replace("R1: resistor  in  out 10k", "R1: resistor  in  out 10q"),
      },
    });
    expect(res.status).toBe(422);
    expect(res.body.error.details.errors[0]).toMatchObject({ line: 3 });
    expect(await Run.count()).toBe(0);
  });

  it("more samples than MAX_QUEUED_SAMPLES is a 422 on the monte-carlo line", async () => {
    const res = await call(createRunRoute, {
      token: tokens.designer,
      params: { id: fx.project.id },
      body: { title: "too many", netlist: mcNetlist(MAX_QUEUED_SAMPLES + 1) },
    });
    expect(res.status).toBe(422);
    expect(res.body.error.details.errors[0]).toMatchObject({ line: 9 });
  });
});

describe("GET/DELETE /api/runs/:id/job authorization", () => {
  it("read for members (404 for outsiders); cancel needs run:create (viewer 403)", async () => {
    const run = await queuedRun(mcNetlist(1000));
    await enqueueRunSolve(run.id);
    expect((await call(jobRoute, { token: tokens.outsider, params: { id: run.id } })).status).toBe(404);
    expect((await call(jobRoute, { params: { id: run.id } })).status).toBe(401);
    const seen = await call(jobRoute, { token: tokens.reviewer, params: { id: run.id } });
    expect(seen.body).toMatchObject({ state: "queued", progress: 0 });
    const denied = await call(cancelRoute, {
      token: tokens.viewer,
      method: "DELETE",
      params: { id: run.id },
    });
    expect(denied.status).toBe(403);
    const hidden = await call(cancelRoute, {
      token: tokens.outsider,
      method: "DELETE",
      params: { id: run.id },
    });
    expect(hidden.status).toBe(404);
    expect((await getRunJob(run.id))?.state).toBe("queued");
  });
});
