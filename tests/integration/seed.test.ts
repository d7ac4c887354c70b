import bcrypt from "bcryptjs";
import { describe, expect, it } from "vitest";
import { Membership, Project, Team, User } from "@/lib/db";
import { DEMO_PASSWORD, DEMO_TEAM_SLUG, seedDemo } from "../../scripts/seed";
import { useTestDb } from "./setup";

useTestDb({ truncate: "file" });

describe("seedDemo", () => {
  it("creates the demo team with one user per role, two projects and an outsider team", async () => {
    expect(await seedDemo()).toBe(true);
    const team = await Team.findOne({ where: { slug: DEMO_TEAM_SLUG } });
    expect(team?.name).toBe("Corvane Instruments");
    const members = await Membership.findAll({ where: { teamId: team!.id }, include: ["user"] });
    expect(members.map((m) => `${m.role}:${m.user?.email}`).sort()).toEqual([
      "designer:designer@demo.test",
      "owner:owner@demo.test",
      "reviewer:reviewer@demo.test",
      "viewer:viewer@demo.test",
    ]);
    const projects = await Project.findAll({ where: { teamId: team!.id }, order: [["name", "ASC"]] });
    expect(projects.map((p) => p.name)).toEqual(["Anti-alias filter board", "Reference oscillator board"]);

    const outsider = await User.findOne({ where: { email: "outsider@demo.test" }, include: ["memberships"] });
    expect(outsider?.memberships?.map((m) => m.teamId)).not.toContain(team!.id);
    expect(outsider?.memberships).toHaveLength(1);
    expect(await bcrypt.compare(DEMO_PASSWORD, outsider!.passwordHash)).toBe(true);
    expect(outsider!.passwordHash).toMatch(/^\$2[aby]\$10\$/);
  });

  it("is idempotent: a second run adds nothing and keeps the rows", async () => {
    const before = { users: await User.count(), teams: await Team.count(), projects: await Project.count() };
    const owner = await User.findOne({ where: { email: "owner@demo.test" } });
    expect(await seedDemo()).toBe(false);
    expect({ users: await User.count(), teams: await Team.count(), projects: await Project.count() }).toEqual(
      before,
    );
    expect(before).toEqual({ users: 5, teams: 2, projects: 3 });
    const again = await User.findOne({ where: { email: "owner@demo.test" } });
    expect(again?.id).toBe(owner?.id);
    expect(again?.passwordHash).toBe(owner?.passwordHash);
  });
});
