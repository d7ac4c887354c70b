// The bench's own user, team and project in the bench database (scripts/bench-app.ts and
// scripts/bench-pages.ts): found or made, the project's earlier runs removed.
import type { Transaction } from "sequelize";
import { Membership, Project, Run, Team, User } from "@/lib/db";

export interface BenchUserSpec {
  email: string;
  name: string;
  passwordHash: string;
  /** Project name in the "Bench Bay" team. */
  project: string;
  /** Confirm the address (needed to sign in through the pages). */
  verified?: boolean;
}

/** The user (password hash set anew), owner of the bench team, and an empty project of theirs. */
export async function benchWorkspace(
  spec: BenchUserSpec,
  transaction: Transaction,
): Promise<{ user: User; project: Project }> {
  const { email, name, passwordHash } = spec;
  const [user] = await User.findOrCreate({
    where: { email },
    defaults: { email, name, passwordHash, ...(spec.verified ? { emailVerifiedAt: new Date() } : {}) },
    transaction,
  });
  await user.update({ passwordHash }, { transaction });
  const [team] = await Team.findOrCreate({
    where: { slug: "bench-bay" },
    defaults: { slug: "bench-bay", name: "Bench Bay" },
    transaction,
  });
  await Membership.findOrCreate({
    where: { teamId: team.id, userId: user.id },
    defaults: { teamId: team.id, userId: user.id, role: "owner" },
    transaction,
  });
  const [project] = await Project.findOrCreate({
    where: { teamId: team.id, name: spec.project },
    defaults: { teamId: team.id, name: spec.project, createdById: user.id },
    transaction,
  });
  await Run.destroy({ where: { projectId: project.id }, transaction });
  return { user, project };
}
