/**
 * Password reset by e-mail through the outbox. Asking never tells whether an account exists; the link
 * (only its sha256 is stored) works once, for an hour; choosing the new password verifies the address
 * (the link reached it) and ends every other session (session version). One request per account per
 * minute; the caller limits requests per peer address.
 */
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { BCRYPT_COST } from "@/lib/auth";
import { sequelize, User } from "@/lib/db";
import { withDb } from "@/lib/errors";
import { sha256Hex } from "@/lib/hash";
import { deliverSoon, enqueueEmails } from "@/lib/mail/outbox";
import { passwordResetMail } from "@/lib/mail/templates";
import { bumpSessionVersion } from "@/lib/session-version";

export const RESET_TTL_MS = 3600 * 1000;
export const RESET_INTERVAL_MS = 60_000;

/** Sends a reset link when the address has an account (and none went out in the last minute). */
export async function requestPasswordReset(email: string, now = Date.now()): Promise<void> {
  const sent = await withDb(() =>
    sequelize.transaction(async (transaction) => {
      const user = await User.findOne({ where: { email }, lock: transaction.LOCK.UPDATE, transaction });
      if (!user) return false;
      if ((user.resetSentAt?.getTime() ?? 0) + RESET_INTERVAL_MS > now) return false;
      const token = randomBytes(32).toString("base64url");
      await user.update({ resetTokenHash: sha256Hex(token), resetSentAt: new Date(now) }, { transaction });
      await enqueueEmails([passwordResetMail({ to: user.email, name: user.name, token })], transaction);
      return true;
    }),
  );
  if (sent) deliverSoon();
}

/** The account a reset token belongs to while it is valid, else null (shown before the form). */
export async function resetTokenEmail(token: string, now = Date.now()): Promise<string | null> {
  if (token.length < 20 || token.length > 100) return null;
  const user = await withDb(() =>
    User.findOne({ where: { resetTokenHash: sha256Hex(token) }, attributes: ["email", "resetSentAt"] }),
  );
  if (!user || (user.resetSentAt?.getTime() ?? 0) + RESET_TTL_MS <= now) return null;
  return user.email;
}

/** Sets the new password for a valid token (single use). Null when the link is unknown, used or stale. */
export async function resetPassword(
  token: string,
  password: string,
  now = Date.now(),
): Promise<{ email: string } | null> {
  if (token.length < 20 || token.length > 100) return null;
  const passwordHash = await bcrypt.hash(password, BCRYPT_COST);
  return withDb(() =>
    sequelize.transaction(async (transaction) => {
      const user = await User.findOne({
        where: { resetTokenHash: sha256Hex(token) },
        lock: transaction.LOCK.UPDATE,
        transaction,
      });
      if (!user || (user.resetSentAt?.getTime() ?? 0) + RESET_TTL_MS <= now) return null;
      await user.update(
        {
          passwordHash,
          resetTokenHash: null,
          ...(user.emailVerifiedAt ? {} : { emailVerifiedAt: new Date(now) }),
        },
        { transaction },
      );
      await bumpSessionVersion(user.id, transaction);
      return { email: user.email };
    }),
  );
}
