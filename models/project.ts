import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { Team } from "./team";
import type { User } from "./user";

/** A board or design under study; names are unique within a team. */
export class Project extends Model<InferAttributes<Project>, InferCreationAttributes<Project>> {
  declare id: CreationOptional<string>;
  declare teamId: string;
  declare name: string;
  declare description: CreationOptional<string | null>;
  declare createdById: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare team?: NonAttribute<Team>;
  declare createdBy?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): typeof Project {
    Project.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        teamId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: true },
        createdById: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        modelName: "Project",
        tableName: "projects",
        underscored: true,
        indexes: [{ unique: true, fields: ["team_id", "name"] }],
      },
    );
    return Project;
  }
}
