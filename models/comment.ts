import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { Run } from "./run";
import type { User } from "./user";

/**
 * A remark on a run, optionally pinned to a frequency on a trace, optionally a reply (parentId).
 * A thread is open until someone settles it (`settledAt`, `settledById`); it can be opened again.
 */
export class Comment extends Model<InferAttributes<Comment>, InferCreationAttributes<Comment>> {
  declare id: CreationOptional<string>;
  declare runId: string;
  declare authorId: string;
  declare parentId: CreationOptional<string | null>;
  declare body: string;
  declare frequencyHz: CreationOptional<number | null>;
  declare trace: CreationOptional<string | null>;
  declare settledAt: CreationOptional<Date | null>;
  declare settledById: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare run?: NonAttribute<Run>;
  declare author?: NonAttribute<User>;
  declare parent?: NonAttribute<Comment | null>;
  declare replies?: NonAttribute<Comment[]>;
  declare settledBy?: NonAttribute<User | null>;

  static initModel(sequelize: Sequelize): typeof Comment {
    Comment.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        runId: { type: DataTypes.UUID, allowNull: false },
        authorId: { type: DataTypes.UUID, allowNull: false },
        parentId: { type: DataTypes.UUID, allowNull: true },
        body: { type: DataTypes.TEXT, allowNull: false },
        frequencyHz: { type: DataTypes.DOUBLE, allowNull: true },
        trace: { type: DataTypes.STRING(120), allowNull: true },
        settledAt: { type: DataTypes.DATE, allowNull: true },
        settledById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        modelName: "Comment",
        tableName: "comments",
        underscored: true,
        indexes: [{ fields: ["run_id", "created_at"] }],
      },
    );
    return Comment;
  }
}
