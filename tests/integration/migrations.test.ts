import { readdirSync } from "node:fs";
import path from "node:path";
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
  "bench_readings",
  "comments",
  "invitations",
  "measurements",
  "memberships",
  "outbox_emails",
  "projects",
  "review_events",
  "run_bench_overlays",
  "run_jobs",
  "runs",
  "teams",
  "users",
];

/** The migration that creates each table added after the first three (the rest exist from the start). */
const CREATED_BY: Record<string, string> = {
  run_jobs: "202612021130-create-run-jobs",
  run_bench_overlays: "202612030400-run-bench-overlays",
  bench_readings: "202612030440-bench-readings",
};

/** The tables that exist with every migration before `name` applied (and `name` itself reverted). */
const tablesBefore = (name: string) => ALL_TABLES.filter((t) => (CREATED_BY[t] ?? "") < name);

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
    // Every file in migrations/ ran, in the order of its timestamp (helpers such as _columns.ts aside).
    const files = readdirSync(path.join(import.meta.dirname, "../../migrations"))
      .filter((f) => /^\d{12}-.+\.ts$/.test(f))
      .map((f) => f.replace(/\.ts$/, ""))
      .sort();
    expect(files.slice(0, 7)).toEqual([
      "202612021045-create-accounts",
      "202612021046-create-projects-runs",
      "202612021047-create-outbox-emails",
      "202612021130-create-run-jobs",
      "202612021400-run-result-json-lz4",
      "202612022010-netlist-probe-names",
      "202612022020-review-words",
    ]);
    expect(files).toContain("202612030300-email-verification");
    expect((await migrator.executed()).map((m) => m.name)).toEqual(files);
  });

  it("set the foreign keys with cascades where a child cannot outlive its parent", async () => {
    expect(await foreignKeys("run_bench_overlays")).toEqual({
      run_id: "runs CASCADE",
      measurement_id: "measurements CASCADE",
    });
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
      settled_by_id: "users SET NULL",
    });
    expect(await foreignKeys("review_events")).toEqual({
      run_id: "runs CASCADE",
      actor_id: "users RESTRICT",
    });
    expect(await foreignKeys("bench_readings")).toEqual({
      run_id: "runs CASCADE",
      author_id: "users RESTRICT",
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

  /** Reverts every migration from `name` on (newest first) and returns the reverted names. */
  async function downTo(name: string): Promise<string[]> {
    const all = (await migrator.executed()).map((m) => m.name);
    const reverted = await migrator.down({ to: name });
    expect(reverted.map((m) => m.name)).toEqual(all.slice(all.indexOf(name)).reverse());
    return reverted.map((m) => m.name);
  }

  it("take the result back to jsonb going down past the lz4 step (later steps revert first), and to json, lz4 going up", async () => {
    const resultColumn = async () => {
      const [rows] = await sequelize.query(
        `SELECT format_type(a.atttypid, a.atttypmod) AS type, a.attcompression AS compression
           FROM pg_attribute a WHERE a.attrelid = 'runs'::regclass AND a.attname = 'result'`,
      );
      return rows[0] as { type: string; compression: string };
    };
    // lz4 when the server was built with it (Debian's is); 'l' is lz4 in pg_attribute.
    expect(await resultColumn()).toEqual({ type: "json", compression: "l" });
    const reverted = await downTo("202612021400-run-result-json-lz4");
    expect(await resultColumn()).toEqual({ type: "jsonb", compression: "" });
    expect((await migrator.pending()).map((m) => m.name)).toEqual(reverted.reverse());

    await migrator.up();
    expect(await resultColumn()).toEqual({ type: "json", compression: "l" });
  });

  it("drop the job table and its enum going down past it, and create them again going up", async () => {
    await downTo("202612021130-create-run-jobs");
    expect(await tables()).toEqual(tablesBefore("202612021130-create-run-jobs"));
    const [types] = await sequelize.query("SELECT 1 FROM pg_type WHERE typname = 'enum_run_jobs_state'");
    expect(types).toHaveLength(0);

    await migrator.up();
    expect(await tables()).toEqual(ALL_TABLES);
  });

  it("rename the review words of existing rows going up, and back going down", async () => {
    const [[user]] = (await sequelize.query(
      `INSERT INTO users (id, email, name, password_hash, created_at, updated_at)
       VALUES (gen_random_uuid(), 'words@migration.test', 'Words', 'x', now(), now()) RETURNING id`,
    )) as [{ id: string }[], unknown];
    const [[team]] = (await sequelize.query(
      `INSERT INTO teams (id, name, slug, created_at, updated_at)
       VALUES (gen_random_uuid(), 'Words', 'words-migration', now(), now()) RETURNING id`,
    )) as [{ id: string }[], unknown];
    const [[project]] = (await sequelize.query(
      `INSERT INTO projects (id, team_id, name, created_by_id, created_at, updated_at)
       VALUES (gen_random_uuid(), :team, 'Words', :user, now(), now()) RETURNING id`,
      { replacements: { team: team?.id, user: user?.id } },
    )) as [{ id: string }[], unknown];
    const words = async () => {
      const [rows] = await sequelize.query(
        `SELECT r.review_state AS state, e.action, c.* FROM runs r
           JOIN review_events e ON e.run_id = r.id JOIN comments c ON c.run_id = r.id
          WHERE r.project_id = :project ORDER BY r.title, e.created_at`,
        { replacements: { project: project?.id } },
      );
      return (rows as Record<string, unknown>[]).map((r) => ({
        state: r.state,
        action: r.action,
        settled: r.settled_at !== undefined ? r.settled_at !== null : undefined,
        resolved: r.resolved_at !== undefined ? r.resolved_at !== null : undefined,
      }));
    };
    try {
      await downTo("202612022020-review-words");
      const insertRun = `INSERT INTO runs (id, project_id, author_id, title, netlist, netlist_hash, solver_version,
          status, review_state, created_at)
        VALUES (gen_random_uuid(), :project, :user, :title, 'x', 'h', 't', 'ok', :state, now()) RETURNING id`;
      for (const [title, state, action] of [
        ["a", "in_review", "request"],
        ["b", "approved", "approve"],
        ["c", "changes_requested", "request_changes"],
      ] as const) {
        const [[run]] = (await sequelize.query(insertRun, {
          replacements: { project: project?.id, user: user?.id, title, state },
        })) as [{ id: string }[], unknown];
        await sequelize.query(
          `INSERT INTO review_events (id, run_id, actor_id, action, created_at)
           VALUES (gen_random_uuid(), :run, :user, :action, now())`,
          { replacements: { run: run?.id, user: user?.id, action } },
        );
        await sequelize.query(
          `INSERT INTO comments (id, run_id, author_id, body, resolved_at, resolved_by_id, created_at, updated_at)
           VALUES (gen_random_uuid(), :run, :user, 'c', :at, :by, now(), now())`,
          {
            replacements: {
              run: run?.id,
              user: user?.id,
              at: title === "b" ? new Date() : null,
              by: title === "b" ? user?.id : null,
            },
          },
        );
      }
      const before = [
        { state: "in_review", action: "request", settled: undefined, resolved: false },
        { state: "approved", action: "approve", settled: undefined, resolved: true },
        { state: "changes_requested", action: "request_changes", settled: undefined, resolved: false },
      ];
      expect(await words()).toEqual(before);

      await migrator.up();
      expect(await words()).toEqual([
        { state: "awaiting_signoff", action: "submit", settled: false, resolved: undefined },
        { state: "signed_off", action: "sign_off", settled: true, resolved: undefined },
        { state: "sent_back", action: "send_back", settled: false, resolved: undefined },
      ]);
      expect((await foreignKeys("comments")).settled_by_id).toBe("users SET NULL");

      await downTo("202612022020-review-words");
      expect(await words()).toEqual(before);
    } finally {
      await migrator.up();
      // The team's projects, runs, comments and events go with it (cascades).
      await sequelize.query("DELETE FROM teams WHERE id = :id", { replacements: { id: team?.id } });
      await sequelize.query("DELETE FROM users WHERE id = :id", { replacements: { id: user?.id } });
    }
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
