// Every word list is declared once (lib/roles.ts, lib/review-states.ts, models/run.ts ...) and the models'
// ENUM columns derive from it; a migration keeps the words it was written with. This test compares
// each model's ENUM with the enum type the migrations built, so a word added to a list without a
// migration (or the other way round) fails here rather than as a database error in use.
import { describe, expect, it } from "vitest";
import { sequelize } from "@/lib/db";
import { useTestDb } from "./setup";

useTestDb({ truncate: "file" });

type EnumColumn = { table: string; field: string; values: readonly string[] };

function modelEnums(): EnumColumn[] {
  const columns: EnumColumn[] = [];
  for (const model of Object.values(sequelize.models)) {
    for (const attribute of Object.values(model.getAttributes())) {
      const values = (attribute as { values?: readonly string[] }).values;
      if (attribute.type instanceof Object && values && values.length > 0) {
        columns.push({ table: model.getTableName() as string, field: attribute.field ?? "", values });
      }
    }
  }
  return columns;
}

describe("model ENUM columns = the database's enum types", () => {
  it("finds the enum columns of every model that has one", () => {
    const names = modelEnums().map((c) => `${c.table}.${c.field}`);
    expect(names).toEqual(
      expect.arrayContaining([
        "memberships.role",
        "invitations.role",
        "runs.status",
        "runs.review_state",
        "review_events.action",
        "run_jobs.state",
        "outbox_emails.status",
      ]),
    );
  });

  it("has the same words (the order is the migration's: run_jobs.state lists them in queue order)", async () => {
    for (const column of modelEnums()) {
      const [rows] = await sequelize.query(
        `SELECT e.enumlabel AS label FROM pg_type t JOIN pg_enum e ON e.enumtypid = t.oid
          WHERE t.typname = :name ORDER BY e.enumsortorder`,
        { replacements: { name: `enum_${column.table}_${column.field}` } },
      );
      expect([column.table, column.field, (rows as { label: string }[]).map((r) => r.label).sort()]).toEqual([
        column.table,
        column.field,
        [...column.values].sort(),
      ]);
    }
  });
});
