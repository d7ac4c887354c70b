import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import type { Project } from "./project";
import type { User } from "./user";

/** Bench data as stored: parallel arrays of equal length `points`. */
export interface MeasurementData {
  frequencies: number[];
  magnitudeDb: number[];
  phaseDeg: number[];
}

/** A measured frequency response uploaded to a project, to overlay on runs. */
export class Measurement extends Model<InferAttributes<Measurement>, InferCreationAttributes<Measurement>> {
  declare id: CreationOptional<string>;
  declare projectId: string;
  declare uploadedById: string;
  declare name: string;
  declare data: MeasurementData;
  declare points: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare project?: NonAttribute<Project>;
  declare uploadedBy?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): typeof Measurement {
    Measurement.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        projectId: { type: DataTypes.UUID, allowNull: false },
        uploadedById: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.STRING(200), allowNull: false },
        data: { type: DataTypes.JSONB, allowNull: false },
        points: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, modelName: "Measurement", tableName: "measurements", underscored: true },
    );
    return Measurement;
  }
}
