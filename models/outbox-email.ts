import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type Sequelize,
} from "sequelize";

export const OUTBOX_STATUSES = ["pending", "sent", "failed"] as const;
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number];

/** An e-mail waiting to be sent (or sent); written in the same transaction as the change it reports. */
export class OutboxEmail extends Model<InferAttributes<OutboxEmail>, InferCreationAttributes<OutboxEmail>> {
  declare id: CreationOptional<string>;
  declare to: string;
  declare subject: string;
  declare text: string;
  declare html: CreationOptional<string | null>;
  declare status: CreationOptional<OutboxStatus>;
  declare attempts: CreationOptional<number>;
  declare lastError: CreationOptional<string | null>;
  declare nextAttemptAt: CreationOptional<Date>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof OutboxEmail {
    OutboxEmail.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        to: { type: DataTypes.STRING(320), allowNull: false },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: false },
        html: { type: DataTypes.TEXT, allowNull: true },
        status: { type: DataTypes.ENUM(...OUTBOX_STATUSES), allowNull: false, defaultValue: "pending" },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        lastError: { type: DataTypes.TEXT, allowNull: true },
        nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        modelName: "OutboxEmail",
        tableName: "outbox_emails",
        underscored: true,
        indexes: [{ fields: ["status", "next_attempt_at"] }],
      },
    );
    return OutboxEmail;
  }
}
