import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { Membership } from "./membership";

/** A person who signs in. The e-mail is stored trimmed and lower-case. */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare passwordHash: string;
  /** When the owner of the address opened the verification link; null until then. */
  declare emailVerifiedAt: CreationOptional<Date | null>;
  /** sha256 of the pending verification link's token (the e-mail carries the only copy). */
  declare verificationTokenHash: CreationOptional<string | null>;
  declare verificationSentAt: CreationOptional<Date | null>;
  /** sha256 of the pending password-reset link's token, and when it was sent (lib/password-reset.ts). */
  declare resetTokenHash: CreationOptional<string | null>;
  declare resetSentAt: CreationOptional<Date | null>;
  /** Carried by session tokens; bumping it ends every older session. */
  declare sessionVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare memberships?: NonAttribute<Membership[]>;

  static initModel(sequelize: Sequelize): typeof User {
    User.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        email: {
          type: DataTypes.STRING(320),
          allowNull: false,
          unique: true,
          set(value: string) {
            this.setDataValue("email", String(value).trim().toLowerCase());
          },
        },
        name: { type: DataTypes.STRING(120), allowNull: false },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        emailVerifiedAt: { type: DataTypes.DATE, allowNull: true },
        verificationTokenHash: { type: DataTypes.STRING(64), allowNull: true, unique: true },
        verificationSentAt: { type: DataTypes.DATE, allowNull: true },
        resetTokenHash: { type: DataTypes.STRING(64), allowNull: true, unique: true },
        resetSentAt: { type: DataTypes.DATE, allowNull: true },
        sessionVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "User", tableName: "users", underscored: true },
    );
    return User;
  }
}
