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

/** A user's role in one team; one membership per (team, user). */
export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<string>;
  declare teamId: string;
  declare userId: string;
  declare role: Role;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare team?: NonAttribute<Team>;
  declare user?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): typeof Membership {
    Membership.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        teamId: { type: DataTypes.UUID, allowNull: false },
        userId: { type: DataTypes.UUID, allowNull: false },
        role: { type: DataTypes.ENUM(...ROLES), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        modelName: "Membership",
        tableName: "memberships",
        underscored: true,
        indexes: [{ unique: true, fields: ["team_id", "user_id"] }],
      },
    );
    return Membership;
  }
}
