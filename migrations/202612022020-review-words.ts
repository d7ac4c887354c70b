import type { QueryInterface } from "sequelize";
import type { MigrationFn } from "umzug";

/**
 * The review in the words of a hardware design review. Renames the enum values in place, so every
 * existing run and review event keeps its meaning (an approved run is now signed off, and so on),
 * and comment threads are settled rather than resolved. One transaction each way.
 */
const STATE_RENAMES: [string, string][] = [
  ["in_review", "awaiting_signoff"],
  ["approved", "signed_off"],
  ["changes_requested", "sent_back"],
];
const ACTION_RENAMES: [string, string][] = [
  ["request", "submit"],
  ["approve", "sign_off"],
  ["request_changes", "send_back"],
];
const COLUMN_RENAMES: [string, string][] = [
  ["resolved_at", "settled_at"],
  ["resolved_by_id", "settled_by_id"],
];

async function apply(qi: QueryInterface, backwards: boolean): Promise<void> {
  const flip = (pairs: [string, string][]) => pairs.map(([a, b]) => (backwards ? [b, a] : [a, b]));
  await qi.sequelize.transaction(async (transaction) => {
    for (const [from, to] of flip(STATE_RENAMES)) {
      await qi.sequelize.query(`ALTER TYPE "enum_runs_review_state" RENAME VALUE '${from}' TO '${to}'`, {
        transaction,
      });
    }
    for (const [from, to] of flip(ACTION_RENAMES)) {
      await qi.sequelize.query(`ALTER TYPE "enum_review_events_action" RENAME VALUE '${from}' TO '${to}'`, {
        transaction,
      });
    }
    for (const [from, to] of flip(COLUMN_RENAMES)) {
      await qi.renameColumn("comments", from as string, to as string, { transaction });
    }
  });
}

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => apply(qi, false);
export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => apply(qi, true);
