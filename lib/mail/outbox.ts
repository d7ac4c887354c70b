import { Op, type Transaction } from "sequelize";
import { OutboxEmail, sequelize } from "@/lib/db";
import { type MailMessage, type MailSender, smtpSender } from "@/lib/mail/transport";

/** After this many failed attempts a message is marked failed and left for a person to look at. */
export const MAX_ATTEMPTS = 8;
/** First retry after 30 s, doubling each time, never more than an hour apart. */
export const BASE_BACKOFF_MS = 30_000;
export const MAX_BACKOFF_MS = 3_600_000;
/** How long a claimed message stays invisible to other workers while it is being sent. */
const CLAIM_MS = 120_000;

/** Delay before the next attempt after `attempts` failures (1, 2, …). */
export function backoffMs(attempts: number): number {
  return Math.min(MAX_BACKOFF_MS, BASE_BACKOFF_MS * 2 ** Math.max(0, attempts - 1));
}

/**
 * Writes messages to the outbox inside the caller's transaction, so an e-mail exists if and only if
 * the change it reports was committed. Delivery happens later (`deliverPending`).
 */
export async function enqueueEmails(messages: MailMessage[], transaction: Transaction): Promise<number> {
  const rows = dedupe(messages).map((m) => ({
    to: m.to,
    subject: m.subject,
    text: m.text,
    html: m.html ?? null,
  }));
  if (rows.length === 0) return 0;
  await OutboxEmail.bulkCreate(rows, { transaction });
  return rows.length;
}

function dedupe(messages: MailMessage[]): MailMessage[] {
  const seen = new Set<string>();
  return messages.filter((m) => {
    const key = `${m.to.toLowerCase()}\n${m.subject}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

export type DeliveryReport = { sent: number; failed: number; retrying: number };

/**
 * Sends due messages (pending, nextAttemptAt ≤ now). Rows are claimed with FOR UPDATE SKIP LOCKED and
 * pushed forward by a lease, so several processes can pump the same outbox without sending twice.
 * A failure records attempts, lastError and the next attempt (exponential backoff).
 */
export async function deliverPending(
  opts: { send?: MailSender; limit?: number; now?: Date } = {},
): Promise<DeliveryReport> {
  const send = opts.send ?? smtpSender();
  const now = opts.now ?? new Date();
  const limit = opts.limit ?? 50;
  const claimed = await sequelize.transaction(async (transaction) => {
    const due = await OutboxEmail.findAll({
      where: { status: "pending", nextAttemptAt: { [Op.lte]: now } },
      order: [["nextAttemptAt", "ASC"]],
      limit,
      lock: transaction.LOCK.UPDATE,
      skipLocked: true,
      transaction,
    });
    if (due.length === 0) return [];
    await OutboxEmail.update(
      { nextAttemptAt: new Date(now.getTime() + CLAIM_MS) },
      { where: { id: due.map((d) => d.id) }, transaction },
    );
    return due;
  });
  const report: DeliveryReport = { sent: 0, failed: 0, retrying: 0 };
  for (const row of claimed) {
    const attempts = row.attempts + 1;
    try {
      await send({ to: row.to, subject: row.subject, text: row.text, html: row.html });
      // Past the local mail fake, the e-mail keeps the only copy of a token: the stored row drops it.
      const text = outboxVisible() ? row.text : redactSecretLinks(row.text);
      await row.update({ status: "sent", attempts, sentAt: new Date(), lastError: null, text });
      report.sent++;
    } catch (err) {
      const lastError = (err instanceof Error ? err.message : String(err)).slice(0, 2000);
      const giveUp = attempts >= MAX_ATTEMPTS;
      await row.update({
        status: giveUp ? "failed" : "pending",
        attempts,
        lastError,
        nextAttemptAt: new Date(now.getTime() + backoffMs(attempts)),
      });
      if (giveUp) report.failed++;
      else report.retrying++;
    }
  }
  return report;
}

/** Fire-and-forget delivery after a commit; errors are logged, the rows stay pending for the pump. */
export function deliverSoon(): void {
  // Tests drive delivery themselves; OUTBOX_AUTODELIVER=0 leaves rows for an explicit deliverPending().
  if (process.env.OUTBOX_AUTODELIVER === "0") return;
  deliverPending().catch((err) => console.error("[mail] delivery pass failed:", err));
}

let pump: NodeJS.Timeout | null = null;

/** Starts the periodic delivery pass (server process or worker). Idempotent. */
export function startOutboxPump(intervalMs = 15_000): void {
  if (pump) return;
  pump = setInterval(deliverSoon, intervalMs);
  pump.unref?.();
}

export function stopOutboxPump(): void {
  if (pump) clearInterval(pump);
  pump = null;
}

export type OutboxEntry = {
  id: string;
  to: string;
  subject: string;
  text: string;
  status: string;
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string;
  sentAt: string | null;
  createdAt: string;
};

/**
 * The latest messages addressed to one e-mail address, newest first (for /dev/outbox: a signed-in
 * person sees only their own mail, never another person's invitation or verification link).
 */
export async function listOutbox(to: string, limit = 100): Promise<OutboxEntry[]> {
  const rows = await OutboxEmail.findAll({
    where: { to: { [Op.iLike]: to.trim() } },
    order: [["createdAt", "DESC"]],
    limit,
  });
  return rows.map((r) => ({
    id: r.id,
    to: r.to,
    subject: r.subject,
    text: r.text,
    status: r.status,
    attempts: r.attempts,
    lastError: r.lastError,
    nextAttemptAt: r.nextAttemptAt.toISOString(),
    sentAt: r.sentAt ? r.sentAt.toISOString() : null,
    createdAt: r.createdAt.toISOString(),
  }));
}

/** Hosts of the local mail fake (scripts/smtp-sink.ts): mail sent there never leaves the machine. */
const LOOPBACK_HOSTS = new Set(["127.0.0.1", "localhost", "[::1]", "::1"]);

/**
 * The outbox viewer is a development and test tool: it exists only while mail goes to the local mail
 * fake on loopback, and only outside production (unless APP_ENV says test/development).
 */
export function outboxVisible(): boolean {
  const envOk =
    process.env.NODE_ENV !== "production" ||
    process.env.APP_ENV === "test" ||
    process.env.APP_ENV === "development";
  if (!envOk) return false;
  try {
    const url = new URL(process.env.SMTP_URL || "smtp://127.0.0.1:2526");
    return LOOPBACK_HOSTS.has(url.hostname);
  } catch {
    return false;
  }
}

/** Links that act on their own (an invitation or a verification token): kept out of stored mail once sent. */
const SECRET_LINK = /\/(invite|verify)\/[A-Za-z0-9_-]{20,}/g;

/** The text with secret links replaced, for rows already delivered to a real mail service. */
export function redactSecretLinks(text: string): string {
  return text.replace(SECRET_LINK, "/$1/(link sent by e-mail)");
}
