// Helpers for integration tests against the real PostgreSQL test database (phasewright_test).
// The integration project's setupFiles point DATABASE_URL at it and its globalSetup migrates it.
//
//   import { useTestDb, createFixtures } from "./setup";
//   useTestDb();                       // migrate once per file, empty every table before each test
//   const fx = await createFixtures(); // a team with one user per role, an outsider, projects
import bcrypt from "bcryptjs";
import { afterAll, beforeAll, beforeEach } from "vitest";
import { Membership, Project, sequelize, Team, User } from "@/lib/db";
import { ROLES, type Role } from "@/lib/roles";
import { createMigrator } from "../../scripts/lib/migrator";

/** Password of every fixture user (hashed with bcrypt cost 4 to keep tests fast). */
export const FIXTURE_PASSWORD = "fixture-password-1";

async function assertTestDatabase(): Promise<void> {
  const [rows] = await sequelize.query("SELECT current_database() AS name");
  const name = (rows[0] as { name: string }).name;
  if (!name.endsWith("_test")) throw new Error(`Refusing to touch database "${name}": not a *_test database`);
}

/** Apply every pending migration to the test database. */
export async function migrateTestDb(): Promise<void> {
  await assertTestDatabase();
  await createMigrator(sequelize).up();
}

/** Empty every application table (keeps the migration log). */
export async function truncateAll(): Promise<void> {
  await assertTestDatabase();
  const [rows] = await sequelize.query(
    `SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename <> 'SequelizeMeta'`,
  );
  const tables = (rows as { tablename: string }[]).map((r) => `"${r.tablename}"`);
  if (tables.length > 0)
    await sequelize.query(`TRUNCATE TABLE ${tables.join(", ")} RESTART IDENTITY CASCADE`);
}

/**
 * Register hooks: migrate before the file, truncate before each test (or once, with
 * `{ truncate: "file" }`), and close the pool after the file.
 */
export function useTestDb(options: { truncate?: "each" | "file" } = {}): void {
  beforeAll(async () => {
    await migrateTestDb();
    if (options.truncate === "file") await truncateAll();
  });
  if (options.truncate !== "file") beforeEach(truncateAll);
  afterAll(async () => {
    await sequelize.close();
  });
}

export interface Fixtures {
  team: Team;
  otherTeam: Team;
  users: Record<Role | "outsider", User>;
  project: Project;
  otherProject: Project;
}

/**
 * A team ("Fixture Bench") with owner, designer, reviewer and viewer, one project in it, and an outsider
 * who is the owner of another team with its own project. E-mails: `<role>@fixture.test`.
 */
export async function createFixtures(): Promise<Fixtures> {
  const passwordHash = await bcrypt.hash(FIXTURE_PASSWORD, 4);
  const team = await Team.create({ name: "Fixture Bench", slug: "fixture-bench" });
  const otherTeam = await Team.create({ name: "Elsewhere Lab", slug: "elsewhere-lab" });
  const roles = ROLES;
  const users = {} as Record<Role | "outsider", User>;
  for (const role of roles) {
    users[role] = await User.create({
      email: `${role}@fixture.test`,
      name: `Fixture ${role}`,
      passwordHash,
      emailVerifiedAt: new Date(),
    });
    await Membership.create({ teamId: team.id, userId: users[role].id, role });
  }
  users.outsider = await User.create({
    email: "outsider@fixture.test",
    name: "Fixture outsider",
    passwordHash,
    emailVerifiedAt: new Date(),
  });
  await Membership.create({ teamId: otherTeam.id, userId: users.outsider.id, role: "owner" });
  const project = await Project.create({
    teamId: team.id,
    name: "Fixture filter board",
    description: "Project for integration tests",
    createdById: users.owner.id,
  });
  const otherProject = await Project.create({
    teamId: otherTeam.id,
    name: "Elsewhere amplifier",
    createdById: users.outsider.id,
  });
  return { team, otherTeam, users, project, otherProject };
}
