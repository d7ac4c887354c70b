import { readFileSync } from "node:fs";
import { createHash } from "node:crypto";
import { Project, Run, sequelize, User } from "../lib/db";
import { enqueueRunSolve, stopBoss } from "../lib/jobs";
import { createApiToken } from "../lib/tokens";

async function main() {
  const user = await User.findOne({ where: { email: "designer@demo.test" } });
  const project = await Project.findOne({ where: { name: "Reference oscillator board" } });
  if (!user || !project) throw new Error("demo seed missing");
  const { token } = await createApiToken(user.id, "queue demo");
  const text = readFileSync("solver/examples/wien-bridge.pwn", "utf8")
    .replace(/^sweep .*$/m, "sweep 100Hz to 20kHz linear 400 points")
    .replace(/^monte-carlo .*$/m, `monte-carlo ${process.env.SAMPLES ?? "4000"} seed=11`);
  const run = await Run.create({
    projectId: project.id,
    authorId: user.id,
    title: "Bridge oscillator spread, 4000 samples (queued)",
    netlist: text,
    netlistHash: createHash("sha256").update(text).digest("hex"),
    solverVersion: "queued",
    status: "queued",
    result: null,
  });
  await enqueueRunSolve(run.id);
  console.log(JSON.stringify({ token, runId: run.id }));
  await stopBoss();
  await sequelize.close();
}
main();
