// Replays issue 13's team takeover: read an owner's invitation in the development outbox, sign up with
// the invited address, accept → owner. Each step must now fail: the outbox is private, a fresh account
// must confirm its address through a link only its mailbox receives, and tokens are kept hashed.
import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { GET as outboxRoute } from "@/app/api/dev/outbox/route";
import { POST as inviteRoute } from "@/app/api/teams/[id]/invitations/route";
import { registerUser } from "@/lib/auth";
import { Invitation, Membership, OutboxEmail, User } from "@/lib/db";
import { sha256Hex } from "@/lib/hash";
import { acceptInvitation, hashInvitationToken } from "@/lib/invitations";
import { deliverPending, listOutbox } from "@/lib/mail/outbox";
import { resendVerification, verifyEmail } from "@/lib/verification";
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

const linkIn = (text: string, kind: "invite" | "verify") =>
  new RegExp(`/${kind}/([A-Za-z0-9_-]{20,})`).exec(text)?.[1] ?? null;

async function mailTo(to: string): Promise<string> {
  const rows = await OutboxEmail.findAll({ where: { to } });
  return rows.map((r) => r.text).join("\n");
}

describe("the outbox takeover of issue 13", () => {
  it("fails at every step: private outbox, hashed tokens, verified address required, single use", async () => {
    const invited = await call(inviteRoute, {
      token: tokens.owner,
      params: { id: fx.team.id },
      body: { email: "new.owner@example.test", role: "owner" },
    });
    expect(invited.status).toBe(201);

    // 1. The outbox answers no anonymous visitor, and another signed-in user sees none of this mail.
    expect((await call(outboxRoute, {})).status).toBe(401);
    const outsiderView = await call(outboxRoute, { token: tokens.outsider });
    expect(outsiderView.status).toBe(200);
    expect(outsiderView.text).not.toMatch(/\/invite\//);
    expect(outsiderView.body.emails).toEqual([]);

    // 2. The database holds only the token's sha256; the e-mail is the only copy of the token.
    const inviteToken = linkIn(await mailTo("new.owner@example.test"), "invite");
    if (!inviteToken) throw new Error("no invitation link in the mail");
    const row = await Invitation.findOne();
    expect(row?.tokenHash).toBe(hashInvitationToken(inviteToken));
    expect(JSON.stringify(row?.toJSON())).not.toContain(inviteToken);

    // 3. Sign up with the invited address: the account starts unverified, and even holding the token
    //    (as the attacker did) it cannot join.
    const { userId } = await registerUser({
      name: "Mallory",
      email: "new.owner@example.test",
      password: "attacker password 1",
    });
    const attacker = { userId, email: "new.owner@example.test", name: "Mallory" };
    expect((await User.findByPk(userId))?.emailVerifiedAt).toBeNull();
    await expect(acceptInvitation(attacker, inviteToken)).rejects.toMatchObject({
      status: 403,
      code: "email_unverified",
    });
    expect(await Membership.count({ where: { teamId: fx.team.id, userId } })).toBe(0);

    // 4. The verification link went only to that address's mail; nobody else's outbox lists it.
    const verifyToken = linkIn(await mailTo("new.owner@example.test"), "verify");
    if (!verifyToken) throw new Error("no verification link in the mail");
    for (const who of ["owner", "outsider", "viewer"] as const) {
      const view = await call(outboxRoute, { token: tokens[who] });
      expect(view.text).not.toContain(verifyToken);
    }
    expect((await User.findByPk(userId))?.verificationTokenHash).toBe(sha256Hex(verifyToken));

    // Only whoever reads that mailbox can confirm it: then the invitation works, once.
    expect(await verifyEmail(verifyToken)).toEqual({ email: "new.owner@example.test" });
    expect(await verifyEmail(verifyToken)).toBeNull();
    expect(await acceptInvitation(attacker, inviteToken)).toEqual({ teamId: fx.team.id, role: "owner" });
    await expect(acceptInvitation(attacker, inviteToken)).rejects.toMatchObject({ status: 410 });
  });

  it("resending: a new link replaces the old, at most once a minute, none once verified", async () => {
    const { userId } = await registerUser({
      name: "Ana",
      email: "ana@example.test",
      password: "ana password 12",
    });
    const first = linkIn(await mailTo("ana@example.test"), "verify");
    await expect(resendVerification(userId)).rejects.toMatchObject({ status: 429 });
    await User.update({ verificationSentAt: new Date(Date.now() - 61_000) }, { where: { id: userId } });
    expect(await resendVerification(userId)).toBe(true);
    const mails = await listOutbox("ana@example.test");
    expect(mails).toHaveLength(2);
    const second = linkIn(mails[0]?.text ?? "", "verify");
    expect(second).not.toBe(first);
    expect(await verifyEmail(first ?? "")).toBeNull();
    expect(await verifyEmail(second ?? "")).toEqual({ email: "ana@example.test" });
    expect(await resendVerification(userId)).toBe(false);
  });

  it("past the local mail fake, a delivered row no longer stores the token", async () => {
    await registerUser({ name: "Bo", email: "bo@example.test", password: "bo password 123" });
    vi.stubEnv("SMTP_URL", "smtp://mail.example.test:587");
    try {
      const report = await deliverPending({ send: async () => undefined });
      expect(report.sent).toBe(1);
    } finally {
      vi.unstubAllEnvs();
    }
    const text = await mailTo("bo@example.test");
    expect(text).toContain("/verify/(link sent by e-mail)");
    expect(linkIn(text, "verify")).toBeNull();
  });
});
