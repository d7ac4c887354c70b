import { DataTypes, type QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";
import { createdAtOnly, fk, timestamps, uuidPk } from "./_columns";

/** Projects, runs, comments, review events and measurements. */
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.createTable(
      "projects",
      {
        id: uuidPk,
        team_id: fk("teams", "CASCADE"),
        name: { type: DataTypes.STRING(120), allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: true },
        created_by_id: fk("users", "RESTRICT"),
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex("projects", ["team_id", "name"], {
      unique: true,
      name: "projects_team_id_name",
      transaction,
    });

    await qi.createTable(
      "runs",
      {
        id: uuidPk,
        project_id: fk("projects", "CASCADE"),
        author_id: fk("users", "RESTRICT"),
        title: { type: DataTypes.STRING(200), allowNull: false },
        netlist: { type: DataTypes.TEXT, allowNull: false },
        netlist_hash: { type: DataTypes.STRING(64), allowNull: false },
        solver_version: { type: DataTypes.STRING(40), allowNull: false },
        status: {
          type: DataTypes.ENUM("ok", "failed", "queued", "running", "cancelled"),
          allowNull: false,
        },
        review_state: {
          type: DataTypes.ENUM("draft", "in_review", "approved", "changes_requested"),
          allowNull: false,
          defaultValue: "draft",
        },
        result: { type: DataTypes.JSONB, allowNull: true },
        measures: { type: DataTypes.JSONB, allowNull: true },
        checks: { type: DataTypes.JSONB, allowNull: true },
        checks_passed: { type: DataTypes.INTEGER, allowNull: true },
        checks_total: { type: DataTypes.INTEGER, allowNull: true },
        timings: { type: DataTypes.JSONB, allowNull: true },
        supersedes_id: fk("runs", "SET NULL", true),
        ...createdAtOnly,
      },
      { transaction },
    );
    await qi.addIndex("runs", ["project_id", "created_at"], {
      name: "runs_project_id_created_at",
      transaction,
    });
    await qi.addIndex("runs", ["netlist_hash"], { name: "runs_netlist_hash", transaction });

    await qi.createTable(
      "comments",
      {
        id: uuidPk,
        run_id: fk("runs", "CASCADE"),
        author_id: fk("users", "RESTRICT"),
        parent_id: fk("comments", "CASCADE", true),
        body: { type: DataTypes.TEXT, allowNull: false },
        frequency_hz: { type: DataTypes.DOUBLE, allowNull: true },
        trace: { type: DataTypes.STRING(120), allowNull: true },
        resolved_at: { type: DataTypes.DATE, allowNull: true },
        resolved_by_id: fk("users", "SET NULL", true),
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex("comments", ["run_id", "created_at"], {
      name: "comments_run_id_created_at",
      transaction,
    });

    await qi.createTable(
      "review_events",
      {
        id: uuidPk,
        run_id: fk("runs", "CASCADE"),
        actor_id: fk("users", "RESTRICT"),
        action: {
          type: DataTypes.ENUM("request", "approve", "request_changes", "supersede"),
          allowNull: false,
        },
        note: { type: DataTypes.TEXT, allowNull: true },
        ...createdAtOnly,
      },
      { transaction },
    );
    await qi.addIndex("review_events", ["run_id", "created_at"], {
      name: "review_events_run_id_created_at",
      transaction,
    });

    await qi.createTable(
      "measurements",
      {
        id: uuidPk,
        project_id: fk("projects", "CASCADE"),
        uploaded_by_id: fk("users", "RESTRICT"),
        name: { type: DataTypes.STRING(200), allowNull: false },
        data: { type: DataTypes.JSONB, allowNull: false },
        points: { type: DataTypes.INTEGER, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await qi.addIndex("measurements", ["project_id"], { name: "measurements_project_id", transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    for (const table of ["measurements", "review_events", "comments", "runs", "projects"]) {
      await qi.dropTable(table, { transaction });
    }
    await qi.sequelize.query(
      'DROP TYPE IF EXISTS "enum_runs_status", "enum_runs_review_state", "enum_review_events_action"',
      { transaction },
    );
  });
};
