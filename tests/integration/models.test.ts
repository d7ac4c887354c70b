import { describe, expect, it } from "vitest";
import { Comment, Membership, OutboxEmail, Project, ReviewEvent, Run, Team, User } from "@/lib/db";
import { createFixtures, truncateAll, useTestDb } from "./setup";

useTestDb();

const NETLIST = "demo netlist text";
const HASH = "a".repeat(64);

async function makeRun(projectId: string, authorId: string): Promise<Run> {
  return Run.create({
    projectId,
    authorId,
    title: "First sweep",
    netlist: NETLIST,
    netlistHash: HASH,
    solverVersion: "0.1.0",
    status: "ok",
    result: { traces: [{ name: "out", points: 3 }] },
    checksPassed: 2,
    checksTotal: 3,
  });
}

describe("models over the migrated schema", () => {
  it("store e-mails lower-case and reject a second user with the same address", async () => {
    const user = await User.create({ email: "  Mixed.Case@Example.TEST ", name: "M", passwordHash: "x" });
    expect(user.email).toBe("mixed.case@example.test");
    await expect(
      User.create({ email: "MIXED.case@example.test", name: "N", passwordHash: "x" }),
    ).rejects.toThrow(/Validation error|unique/i);
  });

  it("give a fixture team one member per role and keep memberships unique per (team, user)", async () => {
    const fx = await createFixtures();
    const members = await Membership.findAll({ where: { teamId: fx.team.id }, include: ["user"] });
    expect(members.map((m) => `${m.role}:${m.user?.email}`).sort()).toEqual([
      "designer:designer@fixture.test",
      "owner:owner@fixture.test",
      "reviewer:reviewer@fixture.test",
      "viewer:viewer@fixture.test",
    ]);
    await expect(
      Membership.create({ teamId: fx.team.id, userId: fx.users.viewer.id, role: "owner" }),
    ).rejects.toThrow();
    await expect(
      Project.create({ teamId: fx.team.id, name: fx.project.name, createdById: fx.users.owner.id }),
    ).rejects.toThrow();
  });

  it("fill run defaults, round-trip JSONB and keep no updatedAt", async () => {
    const fx = await createFixtures();
    const run = await makeRun(fx.project.id, fx.users.designer.id);
    const loaded = await Run.findByPk(run.id, { include: ["project", "author"] });
    expect(loaded?.reviewState).toBe("draft");
    expect(loaded?.result).toEqual({ traces: [{ name: "out", points: 3 }] });
    expect(loaded?.measures).toBeNull();
    expect(loaded?.project?.name).toBe("Fixture filter board");
    expect(loaded?.author?.email).toBe("designer@fixture.test");
    expect(loaded?.get("updatedAt")).toBeUndefined();
  });

  it("delete a team's projects, runs, comments and review events with the team", async () => {
    const fx = await createFixtures();
    const run = await makeRun(fx.project.id, fx.users.designer.id);
    const top = await Comment.create({
      runId: run.id,
      authorId: fx.users.reviewer.id,
      body: "Phase at 1 kHz?",
    });
    await Comment.create({ runId: run.id, authorId: fx.users.designer.id, parentId: top.id, body: "Fixed." });
    await ReviewEvent.create({ runId: run.id, actorId: fx.users.designer.id, action: "submit" });
    expect(await Comment.count()).toBe(2);

    await Team.destroy({ where: { id: fx.team.id } });
    expect(await Project.count({ where: { teamId: fx.team.id } })).toBe(0);
    expect(await Run.count()).toBe(0);
    expect(await Comment.count()).toBe(0);
    expect(await ReviewEvent.count()).toBe(0);
    // The other team is untouched.
    expect(await Project.count({ where: { id: fx.otherProject.id } })).toBe(1);
  });

  it("queue outbox e-mails as pending with zero attempts, due now", async () => {
    const before = Date.now();
    const mail = await OutboxEmail.create({ to: "a@b.test", subject: "Hi", text: "Body" });
    await mail.reload();
    expect(mail.status).toBe("pending");
    expect(mail.attempts).toBe(0);
    expect(mail.nextAttemptAt.getTime()).toBeGreaterThanOrEqual(before - 5_000);
  });

  it("empty every table with truncateAll", async () => {
    await createFixtures();
    expect(await User.count()).toBe(5);
    await truncateAll();
    expect(await User.count()).toBe(0);
    expect(await Team.count()).toBe(0);
  });
});
