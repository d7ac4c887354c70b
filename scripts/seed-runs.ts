import type { Transaction } from "sequelize";
import { Comment, Measurement, type Project, ReviewEvent, Run, sequelize, type User } from "@/lib/db";
import { sha256Hex } from "@/lib/hash";
import { derivedRunColumns, storedResult } from "@/lib/run-columns";
import { writeOverlays } from "@/lib/run-overlays";
import { solveNetlist } from "@/solver";
import {
  LINE_DRIVER,
  LOWPASS_STAGE2,
  PILOT_NOTCH,
  WIEN_1K,
  WIEN_REV_A,
  WIEN_REV_B,
  WIEN_REV_C,
} from "./demo/netlists";
import type { DemoSeed } from "./seed";
import { seedReadings } from "./seed-readings";

type SeedUsers = Pick<DemoSeed["users"], "owner" | "designer" | "reviewer">;

/** Saves one solved demo run as `author`, `daysAgo` days back. A netlist that fails to solve stops the seed. */
async function saveRun(
  t: Transaction,
  projectId: string,
  author: User,
  title: string,
  netlist: string,
  daysAgo: number,
  extra: { reviewState?: Run["reviewState"]; supersedesId?: string } = {},
): Promise<Run> {
  const result = solveNetlist(netlist);
  if (!result.ok) {
    const first = result.errors[0];
    throw new Error(`demo netlist "${title}" does not solve: line ${first?.line}: ${first?.message}`);
  }
  const run = await Run.create(
    {
      projectId,
      authorId: author.id,
      title,
      netlist,
      netlistHash: sha256Hex(netlist),
      ...derivedRunColumns(result),
      status: "ok",
      reviewState: extra.reviewState ?? "draft",
      timings: { solveMs: result.stats.solveMs },
      supersedesId: extra.supersedesId ?? null,
    },
    { transaction: t },
  );
  await backdate(t, "runs", run.id, daysAgo);
  return run;
}

async function backdate(t: Transaction, table: string, id: string, daysAgo: number): Promise<void> {
  await sequelize.query(
    `UPDATE ${table} SET created_at = now() - (:days * interval '1 day') WHERE id = :id`,
    {
      replacements: { id, days: daysAgo },
      transaction: t,
    },
  );
}

function measure(run: Run, name: string): number | null {
  const list = run.measures as { name: string; value: number | null }[];
  return list.find((m) => m.name === name)?.value ?? null;
}

/**
 * Demo runs, comments and reviews for the demo team's two projects (idempotent: a project that
 * already has runs is left alone). Called by scripts/seed.ts inside its transaction.
 */
export async function seedRuns(seed: Pick<DemoSeed, "users" | "projects" | "transaction">): Promise<void> {
  const { users, projects, transaction: t } = seed;
  await seedOscillator(t, projects.oscillator, users);
  await seedLimitedOscillator(t, projects.oscillator, users);
  await seedReadings(t, projects.oscillator, users);
  await seedFilter(t, projects.filter, users);
}

/** Title of the diode-limited demo run (bench readings of the demo attach to it). */
export const LIMITED_OSCILLATOR_TITLE = "Bridge oscillator rev C, diode amplitude control";

/**
 * The diode-limited variant with its steady oscillation (harmonic balance) and a Monte Carlo of the
 * steady measures. Added once, also to a project seeded before it existed.
 */
async function seedLimitedOscillator(
  t: Transaction,
  project: Project,
  users: SeedUsers,
): Promise<Run | null> {
  const existing = await Run.findOne({
    where: { projectId: project.id, title: LIMITED_OSCILLATOR_TITLE },
    transaction: t,
  });
  if (existing) return null;
  const run = await saveRun(t, project.id, users.designer, LIMITED_OSCILLATOR_TITLE, WIEN_REV_C, 1);
  const note = await Comment.create(
    {
      runId: run.id,
      authorId: users.designer.id,
      body: "Diodes across part of the feedback resistor hold the level near 4 V; the steady analysis puts the distortion under 5 %.",
    },
    { transaction: t },
  );
  await backdate(t, "comments", note.id, 0.8);
  return run;
}

async function seedOscillator(t: Transaction, project: Project, users: SeedUsers): Promise<void> {
  if ((await Run.count({ where: { projectId: project.id }, transaction: t })) > 0) return;
  const { owner, designer, reviewer } = users;
  const revA = await saveRun(
    t,
    project.id,
    designer,
    "Bridge oscillator rev A, ideal amplifier",
    WIEN_REV_A,
    9,
    {
      reviewState: "signed_off",
    },
  );
  const revB = await saveRun(
    t,
    project.id,
    designer,
    "Bridge oscillator rev B, 1 MHz amplifier",
    WIEN_REV_B,
    4,
    {
      reviewState: "awaiting_signoff",
      supersedesId: revA.id,
    },
  );
  await saveRun(t, project.id, owner, "Service tone 1 kHz variant", WIEN_1K, 2);

  const events: [Run, User, ReviewEvent["action"], string | null, number][] = [
    [revA, designer, "submit", "First pass with an ideal amplifier.", 8.5],
    [revA, reviewer, "sign_off", "Zero-phase point and loop gain as intended.", 7],
    [revA, designer, "supersede", "Superseded by rev B (real amplifier).", 4],
    [
      revB,
      designer,
      "submit",
      "Same bridge with the 1 MHz part we stock; the frequency moves down a little.",
      3.5,
    ],
  ];
  for (const [run, actor, action, note, days] of events) {
    const e = await ReviewEvent.create(
      { runId: run.id, actorId: actor.id, action, note },
      { transaction: t },
    );
    await backdate(t, "review_events", e.id, days);
  }

  await seedBenchSweep(t, project, designer, revA);

  const f0 = measure(revA, "f0");
  const pinned = await Comment.create(
    {
      runId: revA.id,
      authorId: reviewer.id,
      body: "Phase crosses zero here. With K = 3.05 the loop gain is less than 2 % above one, so the amplitude control has little margin.",
      frequencyHz: f0,
      trace: f0 === null ? null : "bridge",
    },
    { transaction: t },
  );
  await backdate(t, "comments", pinned.id, 7.5);
  const reply = await Comment.create(
    {
      runId: revA.id,
      authorId: designer.id,
      parentId: pinned.id,
      body: "Agreed. The lamp-style limiter on the bench board holds it; rev B checks the real amplifier.",
    },
    { transaction: t },
  );
  await backdate(t, "comments", reply.id, 7.2);
  const open = await Comment.create(
    {
      runId: revB.id,
      authorId: owner.id,
      body: "How far does the oscillation frequency move with the 1 MHz part compared with rev A?",
    },
    { transaction: t },
  );
  await backdate(t, "comments", open.id, 3);
}

/**
 * Invented bench data for the demo: the rev A bridge response read every fourth point, as if measured
 * on a board whose parts sit 1.5 % high (so the curve lands a little below the simulated one), with a
 * small fixed ripple standing in for measurement noise.
 */
async function seedBenchSweep(t: Transaction, project: Project, uploader: User, run: Run): Promise<void> {
  const result = storedResult(run.result);
  if (!result) return;
  const bridge = result.traces.find((tr) => tr.name === "bridge");
  if (!bridge) return;
  const data = { frequencies: [] as number[], magnitudeDb: [] as number[], phaseDeg: [] as number[] };
  for (let k = 0; k < result.frequencies.length; k += 4) {
    const ripple = 0.05 * Math.sin(k * 1.7);
    data.frequencies.push(Number(((result.frequencies[k] ?? 0) * 1.015).toPrecision(6)));
    data.magnitudeDb.push(Number(((bridge.magnitudeDb[k] ?? 0) + ripple).toFixed(3)));
    data.phaseDeg.push(Number(((bridge.phaseDeg[k] ?? 0) + 4 * ripple).toFixed(2)));
  }
  const m = await Measurement.create(
    {
      projectId: project.id,
      uploadedById: uploader.id,
      name: "Board 2 bench sweep",
      data,
      points: data.frequencies.length,
    },
    { transaction: t },
  );
  await backdate(t, "measurements", m.id, 8);
  // Drawn on rev A's plot: bench data shows on a run only when attached to it.
  await writeOverlays(run.id, [m.id], t);
}

async function seedFilter(t: Transaction, project: Project, users: SeedUsers): Promise<void> {
  if ((await Run.count({ where: { projectId: project.id }, transaction: t })) > 0) return;
  const { designer, reviewer } = users;
  const lp = await saveRun(
    t,
    project.id,
    designer,
    "Anti-alias stage 2, unity-gain low-pass",
    LOWPASS_STAGE2,
    6,
    {
      reviewState: "sent_back",
    },
  );
  await saveRun(t, project.id, designer, "Pilot-tone notch, twin-T", PILOT_NOTCH, 1);
  // A failing check on purpose: 44.6° of phase margin against the 45° the team asks for.
  await saveRun(t, project.id, designer, "Output driver into the rack cable", LINE_DRIVER, 0.5);
  for (const [actor, action, note, days] of [
    [designer, "submit", null, 5.5],
    [
      reviewer,
      "send_back",
      "Q is 0.62; the spec sheet asks for a flatter pass band. Try swapping values.",
      5,
    ],
  ] as const) {
    const e = await ReviewEvent.create({ runId: lp.id, actorId: actor.id, action, note }, { transaction: t });
    await backdate(t, "review_events", e.id, days);
  }
  const fc = measure(lp, "fc");
  const c = await Comment.create(
    {
      runId: lp.id,
      authorId: reviewer.id,
      body: "The −3 dB edge sits here; the digitiser needs it above 45 kHz.",
      frequencyHz: fc,
      trace: fc === null ? null : "H",
    },
    { transaction: t },
  );
  await backdate(t, "comments", c.id, 5);
}
