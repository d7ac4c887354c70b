import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sequelize } from "@/lib/db";
import { createMigrator } from "../../scripts/lib/migrator";

const migrator = createMigrator(sequelize);

async function tables(): Promise<string[]> {
  const [rows] = await sequelize.query(
    "SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename",
  );
  return (rows as { tablename: string }[]).map((r) => r.tablename);
}

/** Constraints of a table as "type:name" plus, for foreign keys, the ON DELETE rule. */
async function foreignKeys(table: string): Promise<Record<string, string>> {
  const [rows] = await sequelize.query(
    `SELECT kcu.column_name AS col, ccu.table_name AS target, rc.delete_rule AS rule
       FROM information_schema.referential_constraints rc
       JOIN information_schema.key_column_usage kcu ON kcu.constraint_name = rc.constraint_name
       JOIN information_schema.constraint_column_usage ccu ON ccu.constraint_name = rc.constraint_name
      WHERE kcu.table_name = :table`,
    { replacements: { table } },
  );
  return Object.fromEntries(
    (rows as { col: string; target: string; rule: string }[]).map((r) => [r.col, `${r.target} ${r.rule}`]),
  );
}

async function indexDefs(table: string): Promise<string[]> {
  const [rows] = await sequelize.query("SELECT indexdef FROM pg_indexes WHERE tablename = :table", {
    replacements: { table },
  });
  return (rows as { indexdef: string }[]).map((r) => r.indexdef.replace(/ ON public\.\w+ USING btree/, ""));
}

const ALL_TABLES = [
  "SequelizeMeta",
  "api_tokens",
  "comments",
  "invitations",
  "measurements",
  "memberships",
  "outbox_emails",
  "projects",
  "review_events",
  "run_jobs",
  "runs",
  "teams",
  "users",
];

describe("migrations", () => {
  beforeAll(async () => {
    await migrator.up();
  });
  afterAll(async () => {
    await migrator.up();
    await sequelize.close();
  });

  it("create every table with nothing pending", async () => {
    expect(await tables()).toEqual(ALL_TABLES);
    expect(await migrator.pending()).toEqual([]);
    expect((await migrator.executed()).map((m) => m.name)).toEqual([
      "202612021045-create-accounts",
      "202612021046-create-projects-runs",
      "202612021047-create-outbox-emails",
      "202612021130-create-run-jobs",
      "202612021400-run-result-json-lz4",
      "202612022010-netlist-probe-names",
    ]);
  });

  it("set the foreign keys with cascades where a child cannot outlive its parent", async () => {
    expect(await foreignKeys("memberships")).toEqual({ team_id: "teams CASCADE", user_id: "users CASCADE" });
    expect(await foreignKeys("runs")).toEqual({
      project_id: "projects CASCADE",
      author_id: "users RESTRICT",
      supersedes_id: "runs SET NULL",
    });
    expect(await foreignKeys("comments")).toEqual({
      run_id: "runs CASCADE",
      author_id: "users RESTRICT",
      parent_id: "comments CASCADE",
      resolved_by_id: "users SET NULL",
    });
    expect(await foreignKeys("review_events")).toEqual({
      run_id: "runs CASCADE",
      actor_id: "users RESTRICT",
    });
  });

  it("create the unique constraints and indexes of the contract", async () => {
    expect(await indexDefs("memberships")).toContain(
      "CREATE UNIQUE INDEX memberships_team_id_user_id (team_id, user_id)",
    );
    expect(await indexDefs("projects")).toContain(
      "CREATE UNIQUE INDEX projects_team_id_name (team_id, name)",
    );
    expect(await indexDefs("runs")).toEqual(
      expect.arrayContaining([
        "CREATE INDEX runs_project_id_created_at (project_id, created_at)",
        "CREATE INDEX runs_netlist_hash (netlist_hash)",
      ]),
    );
    expect(await indexDefs("comments")).toContain(
      "CREATE INDEX comments_run_id_created_at (run_id, created_at)",
    );
    expect(await indexDefs("outbox_emails")).toContain(
      "CREATE INDEX outbox_emails_status_next_attempt_at (status, next_attempt_at)",
    );
    expect((await indexDefs("users")).some((d) => /UNIQUE INDEX .*\(email\)/.test(d))).toBe(true);
    expect((await indexDefs("api_tokens")).some((d) => /UNIQUE INDEX .*\(token_hash\)/.test(d))).toBe(true);
    expect((await indexDefs("invitations")).some((d) => /UNIQUE INDEX .*\(token_hash\)/.test(d))).toBe(true);
  });

  it("give runs no updated_at and a draft review state by default", async () => {
    const [rows] = await sequelize.query(
      `SELECT column_name, column_default FROM information_schema.columns WHERE table_name = 'runs'`,
    );
    const columns = Object.fromEntries(
      (rows as { column_name: string; column_default: string | null }[]).map((r) => [
        r.column_name,
        r.column_default,
      ]),
    );
    expect(columns).not.toHaveProperty("updated_at");
    expect(columns.review_state).toBe("'draft'::enum_runs_review_state");
    expect(columns.id).toBe("gen_random_uuid()");
  });

  it("go down to the result's storage (back to jsonb, the netlist rewrite a no-op) and up again (json, lz4)", async () => {
    const resultColumn = async () => {
      const [rows] = await sequelize.query(
        `SELECT format_type(a.atttypid, a.atttypmod) AS type, a.attcompression AS compression
           FROM pg_attribute a WHERE a.attrelid = 'runs'::regclass AND a.attname = 'result'`,
      );
      return rows[0] as { type: string; compression: string };
    };
    // lz4 when the server was built with it (Debian's is); 'l' is lz4 in pg_attribute.
    expect(await resultColumn()).toEqual({ type: "json", compression: "l" });
    const reverted = await migrator.down({ to: "202612021400-run-result-json-lz4" });
    const both = ["202612021400-run-result-json-lz4", "202612022010-netlist-probe-names"];
    expect(reverted.map((m) => m.name)).toEqual([...both].reverse());
    expect(await resultColumn()).toEqual({ type: "jsonb", compression: "" });
    expect((await migrator.pending()).map((m) => m.name)).toEqual(both);

    const applied = await migrator.up();
    expect(applied.map((m) => m.name)).toEqual(both);
    expect(await resultColumn()).toEqual({ type: "json", compression: "l" });
  });

  it("go down to the job table (dropping it and its enum) and up again", async () => {
    const reverted = await migrator.down({ to: "202612021130-create-run-jobs" });
    expect(reverted.map((m) => m.name)).toEqual([
      "202612022010-netlist-probe-names",
      "202612021400-run-result-json-lz4",
      "202612021130-create-run-jobs",
    ]);
    expect(await tables()).toEqual(ALL_TABLES.filter((t) => t !== "run_jobs"));
    const [types] = await sequelize.query("SELECT 1 FROM pg_type WHERE typname = 'enum_run_jobs_state'");
    expect(types).toHaveLength(0);

    const applied = await migrator.up();
    expect(applied.map((m) => m.name)).toEqual([
      "202612021130-create-run-jobs",
      "202612021400-run-result-json-lz4",
      "202612022010-netlist-probe-names",
    ]);
    expect(await tables()).toEqual(ALL_TABLES);
  });

  it("revert every migration down to an empty schema, then apply them all again", async () => {
    const all = (await migrator.executed()).map((m) => m.name);
    const reverted = await migrator.down({ to: 0 });
    expect(reverted.map((m) => m.name)).toEqual([...all].reverse());
    expect(await tables()).toEqual(["SequelizeMeta"]);
    const [types] = await sequelize.query("SELECT typname FROM pg_type WHERE typname LIKE 'enum_%'");
    expect(types).toEqual([]);

    await migrator.up();
    expect(await tables()).toEqual(ALL_TABLES);
    const [defaults] = await sequelize.query(
      `INSERT INTO outbox_emails ("to", subject, text) VALUES ('a@b.test', 's', 't')
       RETURNING status, attempts`,
    );
    expect(defaults).toEqual([{ status: "pending", attempts: 0 }]);
    await sequelize.query("DELETE FROM outbox_emails WHERE \"to\" = 'a@b.test'");
  });
});
