/**
 * Demo bench readings (invented scenario): Corvane's bench checks the CV-200 rev B boards against a
 * parts-spread run of the same netlist. Board 1 reads inside the Monte Carlo spread; board 3 reads
 * far below it — its Cp came from the 12 nF reel (1/√1.2 ≈ 0.913 of the frequency). Idempotent: the
 * run is added when its title is missing, the readings when the run has none. A small scope CSV is
 * attached when the object store answers; the demo works without it.
 */
import type { Transaction } from "sequelize";
import { BenchReading, type Project, Run, sequelize, type User } from "@/lib/db";
import { sha256Hex } from "@/lib/hash";
import { derivedRunColumns } from "@/lib/run-columns";
import { putObject } from "@/lib/storage/object-store";
import { solveNetlist } from "@/solver";
import { WIEN_REV_B } from "./demo/netlists";

export const SPREAD_RUN_TITLE = "Bridge oscillator parts spread, 1 MHz amplifier";

const SPREAD_NETLIST = `${WIEN_REV_B.replace(/^title [^\n]*/, "title CV-200 reference oscillator, parts spread of the 1 MHz build")}monte-carlo 300 seed=11
`;

async function spreadRun(t: Transaction, project: Project, author: User): Promise<Run> {
  const existing = await Run.findOne({
    where: { projectId: project.id, title: SPREAD_RUN_TITLE },
    transaction: t,
  });
  if (existing) return existing;
  const result = solveNetlist(SPREAD_NETLIST);
  if (!result.ok)
    throw new Error(`demo netlist "${SPREAD_RUN_TITLE}" does not solve: ${result.errors[0]?.message}`);
  const run = await Run.create(
    {
      projectId: project.id,
      authorId: author.id,
      title: SPREAD_RUN_TITLE,
      netlist: SPREAD_NETLIST,
      netlistHash: sha256Hex(SPREAD_NETLIST),
      ...derivedRunColumns(result),
      status: "ok",
      reviewState: "draft",
      timings: { solveMs: result.stats.solveMs },
    },
    { transaction: t },
  );
  await sequelize.query(`UPDATE runs SET created_at = now() - interval '1 day' WHERE id = :id`, {
    replacements: { id: run.id },
    transaction: t,
  });
  return run;
}

/** One period of a 1.587 kHz sine as a scope would export it (invented, 2 V peak, 40 points). */
function scopeCsv(): Uint8Array {
  const lines = ["time_s,ch1_volts"];
  for (let k = 0; k < 40; k++) {
    const t = (k * 630e-6) / 40;
    lines.push(`${t.toExponential(4)},${(2 * Math.sin((2 * Math.PI * k) / 40)).toFixed(4)}`);
  }
  return new TextEncoder().encode(`${lines.join("\n")}\n`);
}

async function attachIfStoreUp(runId: string): Promise<Partial<BenchReading>> {
  const bytes = scopeCsv();
  const key = `runs/${runId}/readings/demo-board-1-scope`;
  try {
    await putObject(key, bytes, "text/csv");
  } catch {
    return {}; // the store is down: the reading goes in without its file
  }
  return {
    attachmentKey: key,
    attachmentType: "text/csv",
    attachmentSize: bytes.byteLength,
    attachmentName: "board1-scope.csv",
  };
}

export async function seedReadings(
  t: Transaction,
  project: Project,
  users: { designer: User; owner: User },
): Promise<void> {
  const run = await spreadRun(t, project, users.designer);
  if ((await BenchReading.count({ where: { runId: run.id }, transaction: t })) > 0) return;
  await BenchReading.create(
    {
      runId: run.id,
      authorId: users.designer.id,
      measureName: "fosc",
      quantity: "period",
      inputForm: "divisions",
      value: null,
      divisions: 6.3,
      perDivision: 100e-6,
      node: "amp_out",
      note: "Board 1 after 10 min warm-up, probe ×10, cursor on the rising zero crossings.",
      ...(await attachIfStoreUp(run.id)),
    },
    { transaction: t },
  );
  await BenchReading.create(
    {
      runId: run.id,
      authorId: users.owner.id,
      measureName: "fosc",
      quantity: "frequency",
      inputForm: "value",
      value: 1443,
      divisions: null,
      perDivision: null,
      node: "amp_out",
      note: "Board 3 on the frequency counter. Cp reads 12 nF on the bridge meter: fitted from the wrong reel.",
    },
    { transaction: t },
  );
}
