import { createHash } from "node:crypto";
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { POST as resendRoute } from "@/app/api/teams/[id]/invitations/[invitationId]/resend/route";
import { DELETE as revokeRoute } from "@/app/api/teams/[id]/invitations/[invitationId]/route";
import { POST as inviteRoute, GET as listRoute } from "@/app/api/teams/[id]/invitations/route";
import { Invitation, Membership, OutboxEmail, User } from "@/lib/db";
import { acceptInvitation, INVITATION_TTL_MS, previewInvitation } from "@/lib/invitations";
import { call, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

let fx: Fixtures;
let tokens: Record<Who, string>;

beforeAll(() => {
  process.env.OUTBOX_AUTODELIVER = "0";
});

beforeEach(async () => {
  fx = await createFixtures();
  tokens = await tokensFor(fx);
});

const invite = (who: Who, body: unknown, teamId = fx.team.id) =>
  call(inviteRoute, { token: tokens[who], params: { id: teamId }, body });

/** The token from the invitation e-mail's link. */
async function tokenFromMail(to: string): Promise<string> {
  const mail = await OutboxEmail.findOne({ where: { to }, order: [["createdAt", "DESC"]] });
  const token = /\/invite\/([A-Za-z0-9_-]+)/.exec(mail?.text ?? "")?.[1];
  if (!token) throw new Error(`no invitation link in the mail to ${to}`);
  return token;
}

async function newUser(email: string) {
  const u = await User.create({ email, name: "Newcomer", passwordHash: "x", emailVerifiedAt: new Date() });
  return { userId: u.id, email, name: "Newcomer" };
}

describe("team invitations", () => {
  it("owner invites: 201, e-mail with a link, only the sha256 of the token stored, 7-day expiry", async () => {
    const before = Date.now();
    const res = await invite("owner", { email: "New.Person@Example.test", role: "reviewer" });
    expect(res.status).toBe(201);
    expect(res.body.invitation).toMatchObject({ email: "new.person@example.test", role: "reviewer" });
    expect(JSON.stringify(res.body)).not.toMatch(/token/i);

    const token = await tokenFromMail("new.person@example.test");
    const row = await Invitation.findOne();
    expect(row?.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(row?.tokenHash).not.toContain(token);
    const ttl = (row?.expiresAt.getTime() ?? 0) - before;
    expect(ttl).toBeGreaterThanOrEqual(INVITATION_TTL_MS - 1000);
    expect(ttl).toBeLessThanOrEqual(INVITATION_TTL_MS + 5000);
    const mail = await OutboxEmail.findOne();
    expect(mail?.subject).toBe("Fixture owner invited you to Fixture Bench on Phasewright");

    const list = await call(listRoute, { token: tokens.owner, params: { id: fx.team.id } });
    expect(list.body.invitations.map((i: { email: string }) => i.email)).toEqual(["new.person@example.test"]);
  });

  it("only the owner may invite: designer/reviewer/viewer 403, outsider 404; bad input names the field", async () => {
    for (const who of ["designer", "reviewer", "viewer"] as const) {
      expect((await invite(who, { email: "a@b.test", role: "viewer" })).status).toBe(403);
    }
    expect((await invite("outsider", { email: "a@b.test", role: "viewer" })).status).toBe(404);
    const bad = await invite("owner", { email: "not-an-email", role: "boss" });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.details.fields).sort()).toEqual(["email", "role"]);
    const member = await invite("owner", { email: "viewer@fixture.test", role: "designer" });
    expect(member.status).toBe(400);
    expect(member.body.error.details.fields.email).toEqual(["Already a member of this team."]);
    expect(await Invitation.count()).toBe(0);
    expect(await OutboxEmail.count()).toBe(0);
  });

  it("the invited address accepts once and joins with the role; other addresses and reuse are refused", async () => {
    await invite("owner", { email: "joiner@example.test", role: "designer" });
    const token = await tokenFromMail("joiner@example.test");
    expect(await previewInvitation(token)).toMatchObject({
      teamName: "Fixture Bench",
      role: "designer",
      inviterName: "Fixture owner",
      state: "pending",
    });
    expect(await previewInvitation("x".repeat(43))).toBeNull();

    const stranger = await newUser("stranger@example.test");
    await expect(acceptInvitation(stranger, token)).rejects.toMatchObject({ status: 403 });

    const joiner = await newUser("joiner@example.test");
    expect(await acceptInvitation(joiner, token)).toEqual({ teamId: fx.team.id, role: "designer" });
    const m = await Membership.findOne({ where: { teamId: fx.team.id, userId: joiner.userId } });
    expect(m?.role).toBe("designer");
    await expect(acceptInvitation(joiner, token)).rejects.toMatchObject({ status: 410 });
    expect((await previewInvitation(token))?.state).toBe("accepted");
  });

  it("an expired link and a replaced link no longer work", async () => {
    await invite("owner", { email: "late@example.test", role: "viewer" });
    const first = await tokenFromMail("late@example.test");
    await new Promise((r) => setTimeout(r, 5));
    await invite("owner", { email: "late@example.test", role: "reviewer" });
    const second = await tokenFromMail("late@example.test");
    expect(second).not.toBe(first);
    const late = await newUser("late@example.test");
    expect((await previewInvitation(first))?.state).toBe("expired");
    await expect(acceptInvitation(late, first)).rejects.toMatchObject({ status: 410 });

    await Invitation.update(
      { expiresAt: new Date(Date.now() - 1000) },
      { where: { email: "late@example.test" } },
    );
    await expect(acceptInvitation(late, second)).rejects.toMatchObject({ status: 410 });
    expect(await Membership.count({ where: { userId: late.userId } })).toBe(0);
  });

  it("owner sends an invitation again (new link, old one dead) or withdraws it; others may not", async () => {
    const created = await invite("owner", { email: "again@example.test", role: "designer" });
    const id = created.body.invitation.id as string;
    const first = await tokenFromMail("again@example.test");
    const ref = { id: fx.team.id, invitationId: id };

    // Not the owner: designer 403, another team's owner 404 (the team is invisible to them).
    expect((await call(resendRoute, { token: tokens.designer, params: ref, method: "POST" })).status).toBe(
      403,
    );
    expect((await call(revokeRoute, { token: tokens.outsider, params: ref, method: "DELETE" })).status).toBe(
      404,
    );

    await new Promise((r) => setTimeout(r, 5)); // the newest mail is the resent one
    const again = await call(resendRoute, { token: tokens.owner, params: ref, method: "POST" });
    expect(again.status).toBe(201);
    expect(again.body.invitation).toMatchObject({ email: "again@example.test", role: "designer" });
    const second = await tokenFromMail("again@example.test");
    expect(second).not.toBe(first);
    expect((await previewInvitation(first))?.state).toBe("expired");
    expect((await previewInvitation(second))?.state).toBe("pending");

    const newId = again.body.invitation.id as string;
    // The first one is no longer open: revoking it is a 404; revoking the new one works.
    expect((await call(revokeRoute, { token: tokens.owner, params: ref, method: "DELETE" })).status).toBe(
      404,
    );
    const gone = await call(revokeRoute, {
      token: tokens.owner,
      params: { id: fx.team.id, invitationId: newId },
      method: "DELETE",
    });
    expect(gone.status).toBe(200);
    expect((await previewInvitation(second))?.state).toBe("expired");
    const list = await call(listRoute, { token: tokens.owner, params: { id: fx.team.id } });
    expect(list.body.invitations).toEqual([]);
    // A malformed id is a 400 with the field named, never a 500.
    const bad = await call(revokeRoute, {
      token: tokens.owner,
      params: { id: fx.team.id, invitationId: "nope" },
      method: "DELETE",
    });
    expect(bad.status).toBe(400);
  });
});
