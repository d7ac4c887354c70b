import { DataTypes, Sequelize } from "sequelize";

// Column helpers shared by the migrations. Files starting with "_" are not migrations.

export const uuidPk = {
  type: DataTypes.UUID,
  primaryKey: true,
  allowNull: false,
  defaultValue: Sequelize.literal("gen_random_uuid()"),
};

export const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
  updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
};

export const createdAtOnly = {
  created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal("now()") },
};

type OnDelete = "CASCADE" | "SET NULL" | "RESTRICT";

/** A UUID foreign key column. */
export function fk(table: string, onDelete: OnDelete, allowNull = false) {
  return {
    type: DataTypes.UUID,
    allowNull,
    references: { model: table, key: "id" },
    onUpdate: "CASCADE",
    onDelete,
  };
}
