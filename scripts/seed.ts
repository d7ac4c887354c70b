import { existsSync } from "node:fs";
import path from "node:path";
import bcrypt from "bcryptjs";
import type { Transaction } from "sequelize";
import { Membership, Project, sequelize, Team, User } from "@/lib/db";
import type { Role } from "@/lib/roles";

// Demo data: an invented maker of bench test equipment, "Corvane Instruments", and a second,
// unrelated team so that visibility rules can be tried by hand. Every password: phasewright-demo.

export const DEMO_PASSWORD = "phasewright-demo";
export const DEMO_TEAM_SLUG = "corvane-instruments";

const DEMO_USERS: { email: string; name: string; role: Role }[] = [
  { email: "owner@demo.test", name: "Mara Quillon", role: "owner" },
  { email: "designer@demo.test", name: "Tobin Achterberg", role: "designer" },
  { email: "reviewer@demo.test", name: "Ines Varga-Holt", role: "reviewer" },
  { email: "viewer@demo.test", name: "Pelle Sandoval", role: "viewer" },
];

/** What the demo seed created; passed to `scripts/seed-runs.ts` when that file exists. */
export interface DemoSeed {
  team: Team;
  otherTeam: Team;
  users: Record<Role | "outsider", User>;
  projects: { oscillator: Project; filter: Project; other: Project };
  transaction: Transaction;
}

// Hash the demo password only when a user is actually created (bcrypt cost 10 is slow on purpose).
let demoHash: Promise<string> | undefined;
const demoPasswordHash = () => {
  demoHash ??= bcrypt.hash(DEMO_PASSWORD, 10);
  return demoHash;
};

async function upsertUser(email: string, name: string, transaction: Transaction) {
  const existing = await User.findOne({ where: { email }, transaction });
  return (
    existing ??
    User.create(
      { email, name, passwordHash: await demoPasswordHash(), emailVerifiedAt: new Date() },
      { transaction },
    )
  );
}

async function upsertTeam(slug: string, name: string, transaction: Transaction) {
  const [team] = await Team.findOrCreate({ where: { slug }, defaults: { slug, name }, transaction });
  return team;
}

async function upsertMember(teamId: string, userId: string, role: Role, transaction: Transaction) {
  await Membership.findOrCreate({
    where: { teamId, userId },
    defaults: { teamId, userId, role },
    transaction,
  });
}

async function upsertProject(
  teamId: string,
  name: string,
  description: string,
  createdById: string,
  transaction: Transaction,
) {
  const [project] = await Project.findOrCreate({
    where: { teamId, name },
    defaults: { teamId, name, description, createdById },
    transaction,
  });
  return project;
}

/**
 * Create the demo team, users and projects if they are missing (idempotent: looks rows up by their
 * unique keys and never duplicates or overwrites them). Returns true when the demo team was new.
 */
export async function seedDemo(): Promise<boolean> {
  const existed = (await Team.count({ where: { slug: DEMO_TEAM_SLUG } })) > 0;
  await sequelize.transaction(async (transaction) => {
    const team = await upsertTeam(DEMO_TEAM_SLUG, "Corvane Instruments", transaction);
    const users = {} as Record<Role | "outsider", User>;
    for (const u of DEMO_USERS) {
      users[u.role] = await upsertUser(u.email, u.name, transaction);
      await upsertMember(team.id, users[u.role].id, u.role, transaction);
    }
    const otherTeam = await upsertTeam("halden-acoustics", "Halden Acoustics Lab", transaction);
    users.outsider = await upsertUser("outsider@demo.test", "Rune Ekwall", transaction);
    await upsertMember(otherTeam.id, users.outsider.id, "owner", transaction);

    const projects = {
      oscillator: await upsertProject(
        team.id,
        "Reference oscillator board",
        "Low-distortion sine source for the CV-200 calibrator: a bridge network around an op-amp.",
        users.owner.id,
        transaction,
      ),
      filter: await upsertProject(
        team.id,
        "Anti-alias filter board",
        "Input filter ahead of the digitiser on the CV-300 recorder: active low-pass stages.",
        users.designer.id,
        transaction,
      ),
      other: await upsertProject(
        otherTeam.id,
        "Microphone preamp tone stage",
        "Tone-control network of a measurement microphone preamp.",
        users.outsider.id,
        transaction,
      ),
    };

    // Demo runs are added by scripts/seed-runs.ts (exporting `seedRuns(seed: DemoSeed)`) when present.
    const runsSeeder = path.join(__dirname, "seed-runs.ts");
    if (existsSync(runsSeeder)) {
      const mod = (await import(runsSeeder)) as { seedRuns?: (seed: DemoSeed) => Promise<void> };
      await mod.seedRuns?.({ team, otherTeam, users, projects, transaction });
    }
  });
  return !existed;
}

if (typeof require !== "undefined" && require.main === module) {
  seedDemo()
    .then((created) => console.log(created ? "demo data seeded" : "demo data already present"))
    .catch((error: unknown) => {
      console.error("seed failed:", error instanceof Error ? error.message : error);
      process.exitCode = 1;
    })
    .finally(() => sequelize.close());
}
