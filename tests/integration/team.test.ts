import { describe, expect, it } from "vitest";
import { Membership } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { changeMemberRole, getTeamForMember, listTeamsForUser, removeMember } from "@/lib/teams";
import { createFixtures, useTestDb } from "./setup";

useTestDb();

async function failure(p: Promise<unknown>): Promise<{ status: number; message: string }> {
  const err = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(AppError);
  return { status: (err as AppError).status, message: (err as AppError).message };
}

async function membershipOf(teamId: string, userId: string) {
  const m = await Membership.findOne({ where: { teamId, userId } });
  if (!m) throw new Error("fixture membership missing");
  return m;
}

describe("team reads", () => {
  it("lists the user's teams with role and member count, members ordered by role", async () => {
    const fx = await createFixtures();
    expect(await listTeamsForUser(fx.users.reviewer.id)).toEqual([
      { id: fx.team.id, name: "Fixture Bench", slug: "fixture-bench", role: "reviewer", memberCount: 4 },
    ]);
    const data = await getTeamForMember(fx.users.viewer.id, fx.team.id);
    expect(data.role).toBe("viewer");
    expect(data.members.map((m) => [m.email, m.role])).toEqual([
      ["owner@fixture.test", "owner"],
      ["designer@fixture.test", "designer"],
      ["reviewer@fixture.test", "reviewer"],
      ["viewer@fixture.test", "viewer"],
    ]);
    expect((await failure(getTeamForMember(fx.users.outsider.id, fx.team.id))).status).toBe(404);
  });
});

describe("role management", () => {
  it("lets the owner change a role; others get 403, outsiders 404", async () => {
    const fx = await createFixtures();
    const designer = await membershipOf(fx.team.id, fx.users.designer.id);
    await changeMemberRole(fx.users.owner.id, fx.team.id, designer.id, "reviewer");
    expect((await designer.reload()).role).toBe("reviewer");

    const viewer = await membershipOf(fx.team.id, fx.users.viewer.id);
    expect(
      (await failure(changeMemberRole(fx.users.reviewer.id, fx.team.id, viewer.id, "owner"))).status,
    ).toBe(403);
    expect(
      (await failure(changeMemberRole(fx.users.outsider.id, fx.team.id, viewer.id, "owner"))).status,
    ).toBe(404);
    expect((await viewer.reload()).role).toBe("viewer");
  });

  it("never demotes or removes the last owner, but allows it once there is a second", async () => {
    const fx = await createFixtures();
    const owner = await membershipOf(fx.team.id, fx.users.owner.id);
    const demote = await failure(changeMemberRole(fx.users.owner.id, fx.team.id, owner.id, "designer"));
    expect(demote).toEqual({
      status: 400,
      message: "A team needs at least one owner: make someone else owner first.",
    });
    expect((await failure(removeMember(fx.users.owner.id, fx.team.id, owner.id))).status).toBe(400);
    expect((await owner.reload()).role).toBe("owner");

    const designer = await membershipOf(fx.team.id, fx.users.designer.id);
    await changeMemberRole(fx.users.owner.id, fx.team.id, designer.id, "owner");
    await changeMemberRole(fx.users.designer.id, fx.team.id, owner.id, "viewer");
    expect((await owner.reload()).role).toBe("viewer");
    expect(await Membership.count({ where: { teamId: fx.team.id, role: "owner" } })).toBe(1);
  });

  it("removes a member, and treats a membership of another team as not found", async () => {
    const fx = await createFixtures();
    const reviewer = await membershipOf(fx.team.id, fx.users.reviewer.id);
    await removeMember(fx.users.owner.id, fx.team.id, reviewer.id);
    expect(await Membership.findByPk(reviewer.id)).toBeNull();
    expect(await Membership.count({ where: { teamId: fx.team.id } })).toBe(3);

    const foreign = await membershipOf(fx.otherTeam.id, fx.users.outsider.id);
    expect((await failure(removeMember(fx.users.owner.id, fx.team.id, foreign.id))).status).toBe(404);
    expect(await Membership.findByPk(foreign.id)).not.toBeNull();
  });
});
