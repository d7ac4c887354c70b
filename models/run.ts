import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { Comment } from "./comment";
import type { Project } from "./project";
import type { ReviewEvent } from "./review-event";
import type { User } from "./user";

export const RUN_STATUSES = ["ok", "failed", "queued", "running", "cancelled"] as const;
export type RunStatus = (typeof RUN_STATUSES)[number];

import { REVIEW_STATES, type ReviewState } from "@/lib/review-states";

export { REVIEW_STATES, type ReviewState };
/**
 * The large columns of a run (a 10 000 × 8 result is megabytes). Queries that only check or change
 * a run's state leave them out: `{ attributes: { exclude: RUN_HEAVY_COLUMNS } }`.
 */
export const RUN_HEAVY_COLUMNS = ["result", "netlist", "checks", "timings"];

/**
 * One solve of one netlist, kept for good. Runs are immutable once saved (a change is a new run);
 * only status, reviewState and the result of a queued job change later, so there is no updatedAt.
 * JSON columns (result — `json` with lz4, written once and read whole — and the JSONB measures,
 * checks, timings) are `unknown`, null when absent: map them to plain types in lib/ before use.
 */
export class Run extends Model<InferAttributes<Run>, InferCreationAttributes<Run>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare authorId: string;
  declare title: string;
  declare netlist: string;
  declare netlistHash: string;
  declare solverVersion: string;
  declare status: RunStatus;
  declare reviewState: CreationOptional<ReviewState>;
  declare result?: unknown;
  declare measures?: unknown;
  declare checks?: unknown;
  declare checksPassed: CreationOptional<number | null>;
  declare checksTotal: CreationOptional<number | null>;
  declare timings?: unknown;
  declare supersedesId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;

  declare project?: NonAttribute<Project>;
  declare author?: NonAttribute<User>;
  declare supersedes?: NonAttribute<Run | null>;
  declare comments?: NonAttribute<Comment[]>;
  declare reviewEvents?: NonAttribute<ReviewEvent[]>;

  static initModel(sequelize: Sequelize): typeof Run {
    Run.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        projectId: { type: DataTypes.UUID, allowNull: false },
        authorId: { type: DataTypes.UUID, allowNull: false },
        title: { type: DataTypes.STRING(200), allowNull: false },
        netlist: { type: DataTypes.TEXT, allowNull: false },
        netlistHash: { type: DataTypes.STRING(64), allowNull: false },
        solverVersion: { type: DataTypes.STRING(40), allowNull: false },
        status: { type: DataTypes.ENUM(...RUN_STATUSES), allowNull: false },
        reviewState: { type: DataTypes.ENUM(...REVIEW_STATES), allowNull: false, defaultValue: "draft" },
        result: { type: DataTypes.JSON, allowNull: true },
        measures: { type: DataTypes.JSONB, allowNull: true },
        checks: { type: DataTypes.JSONB, allowNull: true },
        checksPassed: { type: DataTypes.INTEGER, allowNull: true },
        checksTotal: { type: DataTypes.INTEGER, allowNull: true },
        timings: { type: DataTypes.JSONB, allowNull: true },
        supersedesId: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      {
        sequelize,
        modelName: "Run",
        tableName: "runs",
        underscored: true,
        updatedAt: false,
        indexes: [{ fields: ["project_id", "created_at"] }, { fields: ["netlist_hash"] }],
      },
    );
    return Run;
  }
}
