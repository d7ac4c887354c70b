import {
  type CreationOptional,
  DataTypes,
  type InferAttributes,
  type InferCreationAttributes,
  Model,
  type NonAttribute,
  type Sequelize,
} from "sequelize";
import {
  READING_FORMS,
  READING_QUANTITIES,
  type ReadingForm,
  type ReadingQuantity,
} from "@/lib/reading-kinds";
import type { Run } from "./run";
import type { User } from "./user";

/** What the bench showed for a run, as it was read; an optional attachment lives in the object store. */
export class BenchReading extends Model<
  InferAttributes<BenchReading>,
  InferCreationAttributes<BenchReading>
> {
  declare id: CreationOptional<string>;
  declare runId: string;
  declare authorId: string;
  declare measureName: string | null;
  declare quantity: ReadingQuantity;
  declare inputForm: ReadingForm;
  declare value: number | null;
  declare divisions: number | null;
  declare perDivision: number | null;
  declare node: string | null;
  declare note: string | null;
  declare attachmentKey: string | null;
  declare attachmentType: string | null;
  declare attachmentSize: number | null;
  declare attachmentName: string | null;
  declare createdAt: CreationOptional<Date>;

  declare run?: NonAttribute<Run>;
  declare author?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): typeof BenchReading {
    BenchReading.init(
      {
        id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
        runId: { type: DataTypes.UUID, allowNull: false },
        authorId: { type: DataTypes.UUID, allowNull: false },
        measureName: { type: DataTypes.STRING(100), allowNull: true },
        quantity: { type: DataTypes.ENUM(...READING_QUANTITIES), allowNull: false },
        inputForm: { type: DataTypes.ENUM(...READING_FORMS), allowNull: false },
        value: { type: DataTypes.DOUBLE, allowNull: true },
        divisions: { type: DataTypes.DOUBLE, allowNull: true },
        perDivision: { type: DataTypes.DOUBLE, allowNull: true },
        node: { type: DataTypes.STRING(100), allowNull: true },
        note: { type: DataTypes.TEXT, allowNull: true },
        attachmentKey: { type: DataTypes.STRING(300), allowNull: true },
        attachmentType: { type: DataTypes.STRING(100), allowNull: true },
        attachmentSize: { type: DataTypes.INTEGER, allowNull: true },
        attachmentName: { type: DataTypes.STRING(255), allowNull: true },
        createdAt: DataTypes.DATE,
      },
      {
        sequelize,
        modelName: "BenchReading",
        tableName: "bench_readings",
        underscored: true,
        updatedAt: false,
      },
    );
    return BenchReading;
  }
}
