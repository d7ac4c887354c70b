import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";

/**
 * Verified e-mail addresses and revocable sessions. `email_verified_at` is set when the owner of the
 * address opens the link sent at sign-up (only the sha256 of that link's token is kept, in
 * `verification_token_hash`, until used or replaced). `session_version` travels in the session token
 * and is bumped by "sign out everywhere", a password change and a role change, which ends every
 * older session at once. Accounts that exist before this migration count as verified from now on.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.addColumn(
      "users",
      "email_verified_at",
      { type: DataTypes.DATE, allowNull: true },
      { transaction },
    );
    await qi.addColumn(
      "users",
      "verification_token_hash",
      { type: DataTypes.STRING(64), allowNull: true, unique: true },
      { transaction },
    );
    await qi.addColumn(
      "users",
      "verification_sent_at",
      { type: DataTypes.DATE, allowNull: true },
      { transaction },
    );
    await qi.addColumn(
      "users",
      "session_version",
      { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      { transaction },
    );
    await qi.sequelize.query("UPDATE users SET email_verified_at = now()", { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    for (const column of [
      "session_version",
      "verification_sent_at",
      "verification_token_hash",
      "email_verified_at",
    ])
      await qi.removeColumn("users", column, { transaction });
  });
};
