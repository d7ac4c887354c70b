import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import { REVIEW_ACTIONS, type ReviewAction } from "@/lib/review-states";
import type { Run } from "./run";
import type { User } from "./user";

export { REVIEW_ACTIONS, type ReviewAction };

/** One step in a run's review history (append-only: no updatedAt). */
export class ReviewEvent extends Model<InferAttributes<ReviewEvent>, InferCreationAttributes<ReviewEvent>> {
  declare id: CreationOptional<string>;
  declare runId: string;
  declare actorId: string;
  declare action: ReviewAction;
  declare note: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;

  declare run?: NonAttribute<Run>;
  declare actor?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): typeof ReviewEvent {
    ReviewEvent.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        runId: { type: DataTypes.UUID, allowNull: false },
        actorId: { type: DataTypes.UUID, allowNull: false },
        action: { type: DataTypes.ENUM(...REVIEW_ACTIONS), allowNull: false },
        note: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      {
        sequelize,
        modelName: "ReviewEvent",
        tableName: "review_events",
        underscored: true,
        updatedAt: false,
        indexes: [{ fields: ["run_id", "created_at"] }],
      },
    );
    return ReviewEvent;
  }
}
