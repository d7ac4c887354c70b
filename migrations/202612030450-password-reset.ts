import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";

/**
 * Password reset by e-mail: only the sha256 of the pending reset link's token is kept
 * (`reset_token_hash`, single use, replaced by a newer request) with the time it was sent.
 */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.addColumn(
      "users",
      "reset_token_hash",
      { type: DataTypes.STRING(64), allowNull: true, unique: true },
      { transaction },
    );
    await qi.addColumn("users", "reset_sent_at", { type: DataTypes.DATE, allowNull: true }, { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.removeColumn("users", "reset_sent_at", { transaction });
    await qi.removeColumn("users", "reset_token_hash", { transaction });
  });
};
