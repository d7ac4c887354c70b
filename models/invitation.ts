import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import { ROLES, type Role } from "@/lib/roles";
import type { Team } from "./team";
import type { User } from "./user";

/** An invitation to join a team; only the sha256 hex of its token is stored. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare teamId: string;
  declare email: string;
  declare role: Role;
  declare tokenHash: string;
  declare invitedById: string;
  declare expiresAt: Date;
  declare acceptedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare team?: NonAttribute<Team>;
  declare invitedBy?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): typeof Invitation {
    Invitation.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        teamId: { type: DataTypes.UUID, allowNull: false },
        email: {
          type: DataTypes.STRING(320),
          allowNull: false,
          set(value: string) {
            this.setDataValue("email", String(value).trim().toLowerCase());
          },
        },
        role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        invitedById: { type: DataTypes.UUID, allowNull: false },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Invitation", tableName: "invitations", underscored: true },
    );
    return Invitation;
  }
}
