import type { QueryInterface, Transaction } from "sequelize";
import type { MigrationFn } from "umzug";
import { sha256Hex } from "../lib/hash";
import { rewriteLegacyNetlist } from "../solver/lang/rewrite";

/**
 * The language's probes became `volts(…)`/`amps(…)` and ground `gnd` only (NETLIST.md); the earlier
 * spellings are errors now. Every stored run's netlist is rewritten with the solver's tested
 * `rewriteLegacyNetlist` (only those words change, byte for byte otherwise, so comment line numbers
 * stay right) and its `netlist_hash` recomputed with the app's own hash (lib/hash.ts).
 *
 * Results keep their numbers. Trace names inside them ARE rewritten: a `show` without a name is
 * named by its probe text, so a stored trace "v(out)" beside a netlist that now reads `volts(out)`
 * would show two names for one thing on the run page, in legends and in CSV headers; rewriting the
 * name (as the probe text of a `show`, the same function) keeps them consistent, and a re-solve gives
 * the same name. The one engine warning that quotes a probe is rewritten the same way. Named traces
 * (`show H = …`, loops) are unchanged.
 *
 * Down is a no-op: the new spellings are what the solver reads; an old netlist cannot be recovered
 * exactly from the new one (a netlist may mix both), and the forward rewrite is idempotent.
 */

interface StoredTraceName {
  name?: unknown;
}
interface StoredResultNames {
  traces?: StoredTraceName[];
  variants?: { traces?: StoredTraceName[] }[];
  warnings?: { message?: unknown }[];
}

/** A trace named by its probe text, in today's spelling (the name as `show` would give it). */
function traceName(name: string): string {
  const rewritten = rewriteLegacyNetlist(`show ${name}`);
  return rewritten.startsWith("show ") ? rewritten.slice(5) : name;
}

const PROBE_WARNING = /^the circuit has no independent source: shows are read/;

/** Rename in place; true when anything changed. */
function renameInResult(result: StoredResultNames): boolean {
  let changed = false;
  const rename = (t: StoredTraceName) => {
    if (typeof t.name !== "string") return;
    const next = traceName(t.name);
    if (next !== t.name) {
      t.name = next;
      changed = true;
    }
  };
  result.traces?.forEach(rename);
  for (const v of result.variants ?? []) v.traces?.forEach(rename);
  for (const w of result.warnings ?? []) {
    if (typeof w.message !== "string" || !PROBE_WARNING.test(w.message)) continue;
    const next = w.message.replace(/\bv\(/g, "volts(");
    if (next !== w.message) {
      w.message = next;
      changed = true;
    }
  }
  return changed;
}

async function rewriteRun(qi: QueryInterface, id: string, netlist: string, transaction: Transaction) {
  const next = rewriteLegacyNetlist(netlist);
  if (next === netlist) return;
  const [rows] = await qi.sequelize.query("SELECT result::text AS result FROM runs WHERE id = :id", {
    replacements: { id },
    transaction,
  });
  const text = (rows as { result: string | null }[])[0]?.result ?? null;
  const result = text === null ? null : (JSON.parse(text) as StoredResultNames | null);
  const renamed = result !== null && typeof result === "object" && renameInResult(result);
  await qi.sequelize.query(
    `UPDATE runs SET netlist = :netlist, netlist_hash = :hash${renamed ? ", result = CAST(:result AS json)" : ""}
      WHERE id = :id`,
    {
      replacements: {
        id,
        netlist: next,
        hash: sha256Hex(next),
        result: renamed ? JSON.stringify(result) : null,
      },
      transaction,
    },
  );
}

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    // Only netlists that can hold an earlier spelling are read whole (a probe word or a lone 0).
    const [rows] = await qi.sequelize.query(
      "SELECT id, netlist FROM runs WHERE netlist ~ '(^|[^A-Za-z0-9_.])([vi][[:space:]]*\\(|0([^A-Za-z0-9_.]|$))' ORDER BY id",
      { transaction },
    );
    for (const row of rows as { id: string; netlist: string }[])
      await rewriteRun(qi, row.id, row.netlist, transaction);
  });
};

export const down: MigrationFn<QueryInterface> = async () => {
  // No-op by design (see above).
};
