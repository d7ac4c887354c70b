import { DataTypes, type QueryInterface, Sequelize } from "sequelize";
import type { MigrationFn } from "umzug";
import { timestamps, uuidPk } from "./_columns";

/** The e-mail outbox, drained by the mailer. */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      "outbox_emails",
      {
        id: uuidPk,
        to: { type: DataTypes.STRING(320), allowNull: false },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: false },
        html: { type: DataTypes.TEXT, allowNull: true },
        status: {
          type: DataTypes.ENUM("pending", "sent", "failed"),
          allowNull: false,
          defaultValue: "pending",
        },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        last_error: { type: DataTypes.TEXT, allowNull: true },
        next_attempt_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
        sent_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex("outbox_emails", ["status", "next_attempt_at"], {
      name: "outbox_emails_status_next_attempt_at",
      transaction,
    });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.dropTable("outbox_emails", { transaction });
    await qi.sequelize.query('DROP TYPE IF EXISTS "enum_outbox_emails_status"', { transaction });
  });
};
