import { randomBytes } from "node:crypto";
import type { Transaction } from "sequelize";
import { sequelize, User } from "@/lib/db";
import { AppError, NotFoundError, RateLimitError, withDb } from "@/lib/errors";
import { sha256Hex } from "@/lib/hash";
import { deliverSoon, enqueueEmails } from "@/lib/mail/outbox";
import { verificationMail } from "@/lib/mail/templates";

/** A verification link works for two days; a new one can be asked for once a minute. */
export const VERIFICATION_TTL_MS = 48 * 3600 * 1000;
export const RESEND_INTERVAL_MS = 60_000;

/** Thrown when an unverified account tries something that needs a verified address. */
export class EmailUnverifiedError extends AppError {
  constructor(email: string) {
    super(
      403,
      "email_unverified",
      `Confirm your e-mail address first: open the link we sent to ${email}, or send a new one.`,
    );
  }
}

/**
 * Gives the user a fresh verification token (only its sha256 is stored, replacing any earlier one)
 * and writes the e-mail carrying it to the outbox, in the caller's transaction.
 */
export async function issueVerification(user: User, transaction: Transaction): Promise<void> {
  const token = randomBytes(32).toString("base64url");
  await user.update(
    { verificationTokenHash: sha256Hex(token), verificationSentAt: new Date() },
    { transaction },
  );
  await enqueueEmails([verificationMail({ to: user.email, name: user.name, token })], transaction);
}

/** Marks the address behind a verification token as verified (single use). Null for an unknown or stale token. */
export async function verifyEmail(token: string): Promise<{ email: string } | null> {
  if (token.length < 20 || token.length > 100) return null;
  return withDb(() =>
    sequelize.transaction(async (transaction) => {
      const user = await User.findOne({
        where: { verificationTokenHash: sha256Hex(token) },
        lock: transaction.LOCK.UPDATE,
        transaction,
      });
      if (!user) return null;
      const sent = user.verificationSentAt?.getTime() ?? 0;
      if (sent + VERIFICATION_TTL_MS <= Date.now()) return null;
      await user.update({ emailVerifiedAt: new Date(), verificationTokenHash: null }, { transaction });
      return { email: user.email };
    }),
  );
}

/** Sends a new verification link to the signed-in user (at most once a minute); false when already verified. */
export async function resendVerification(userId: string): Promise<boolean> {
  const sent = await withDb(() =>
    sequelize.transaction(async (transaction) => {
      const user = await User.findByPk(userId, { lock: transaction.LOCK.UPDATE, transaction });
      if (!user) throw new NotFoundError();
      if (user.emailVerifiedAt) return false;
      const last = user.verificationSentAt?.getTime() ?? 0;
      if (last + RESEND_INTERVAL_MS > Date.now()) {
        throw new RateLimitError("A link was sent less than a minute ago. Check your mail, then try again.");
      }
      await issueVerification(user, transaction);
      return true;
    }),
  );
  if (sent) deliverSoon();
  return sent;
}

/** Throws EmailUnverifiedError unless the user's address is verified. */
export async function requireVerifiedEmail(userId: string, transaction?: Transaction): Promise<void> {
  const user = await User.findByPk(userId, {
    attributes: ["email", "emailVerifiedAt"],
    ...(transaction ? { transaction } : {}),
  });
  if (!user) throw new NotFoundError();
  if (!user.emailVerifiedAt) throw new EmailUnverifiedError(user.email);
}

/** Whether the user's address is verified (false for an unknown user). */
export async function isEmailVerified(userId: string): Promise<boolean> {
  const user = await withDb(() => User.findByPk(userId, { attributes: ["emailVerifiedAt"] }));
  return Boolean(user?.emailVerifiedAt);
}
