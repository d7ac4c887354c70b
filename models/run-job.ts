import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type Sequelize,
} from "sequelize";
import { RUN_STATUSES, type RunStatus } from "./run";

/**
 * The queue side of a run solved by a worker (one row per queued run; lib/run-lifecycle.ts is the
 * only writer). `state` always equals the run's `status`: both change in one transaction.
 */
export class RunJob extends Model<InferAttributes<RunJob>, InferCreationAttributes<RunJob>> {
  declare runId: string;
  declare jobId: CreationOptional<string | null>;
  declare state: CreationOptional<RunStatus>;
  declare progress: CreationOptional<number>;
  declare cancelRequested: CreationOptional<boolean>;
  declare attempts: CreationOptional<number>;
  declare error: CreationOptional<string | null>;
  declare worker: CreationOptional<string | null>;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof RunJob {
    RunJob.init(
      {
        runId: { type: DataTypes.UUID, primaryKey: true },
        jobId: { type: DataTypes.STRING(64), allowNull: true },
        state: { type: DataTypes.ENUM(...RUN_STATUSES), allowNull: false, defaultValue: "queued" },
        progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
        cancelRequested: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        error: { type: DataTypes.TEXT, allowNull: true },
        worker: { type: DataTypes.STRING(200), allowNull: true },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        finishedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "RunJob", tableName: "run_jobs", underscored: true },
    );
    return RunJob;
  }
}
