// Password reset by e-mail through the outbox (lib/password-reset.ts): no account probing, a
// single-use link for an hour, the new password works and every other session ends.
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { verifyCredentials } from "@/lib/auth";
import { OutboxEmail, User } from "@/lib/db";
import {
  RESET_INTERVAL_MS,
  RESET_TTL_MS,
  requestPasswordReset,
  resetPassword,
  resetTokenEmail,
} from "@/lib/password-reset";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

let fx: Fixtures;

beforeAll(() => {
  process.env.OUTBOX_AUTODELIVER = "0";
});

beforeEach(async () => {
  fx = await createFixtures();
});

async function linkFor(to: string): Promise<string> {
  const mail = await OutboxEmail.findOne({ where: { to }, order: [["createdAt", "DESC"]] });
  const token = /\/reset\/([A-Za-z0-9_-]+)/.exec(mail?.text ?? "")?.[1];
  if (!token) throw new Error(`no reset link in the mail to ${to}`);
  return token;
}

describe("password reset", () => {
  it("an unknown address gets no mail (and the caller cannot tell); a known one gets a single-use link", async () => {
    await requestPasswordReset("nobody@fixture.test");
    expect(await OutboxEmail.count()).toBe(0);

    const email = fx.users.designer.email;
    const versionBefore = (await User.findByPk(fx.users.designer.id))!.sessionVersion;
    await requestPasswordReset(email);
    const token = await linkFor(email);
    const row = await User.findByPk(fx.users.designer.id);
    expect(row!.resetTokenHash).toMatch(/^[0-9a-f]{64}$/);
    expect(row!.resetTokenHash).not.toContain(token);
    expect(await resetTokenEmail(token)).toBe(email);

    expect(await resetPassword(token, "a new long password")).toEqual({ email });
    expect(await verifyCredentials(email, "a new long password")).toMatchObject({ email });
    expect(await verifyCredentials(email, "fixture-password-1")).toBeNull();
    // Every other session ends; the link is used up.
    expect((await User.findByPk(fx.users.designer.id))!.sessionVersion).toBe(versionBefore + 1);
    expect(await resetPassword(token, "yet another password")).toBeNull();
    expect(await resetTokenEmail(token)).toBeNull();
  });

  it("one link a minute per account; a link over an hour old is refused", async () => {
    const email = fx.users.reviewer.email;
    const t0 = Date.now();
    await requestPasswordReset(email, t0);
    await requestPasswordReset(email, t0 + 1000);
    expect(await OutboxEmail.count({ where: { to: email } })).toBe(1);
    const token = await linkFor(email);
    expect(await resetPassword(token, "a new long password", t0 + RESET_TTL_MS + 1)).toBeNull();
    await requestPasswordReset(email, t0 + RESET_INTERVAL_MS + 1);
    expect(await OutboxEmail.count({ where: { to: email } })).toBe(2);
  });
});
