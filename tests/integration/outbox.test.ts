import { createServer } from "node:net";
import { SMTPServer } from "smtp-server";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { GET as outboxRoute } from "@/app/api/dev/outbox/route";
import { POST as postComment } from "@/app/api/runs/[id]/comments/route";
import { Comment, OutboxEmail, sequelize } from "@/lib/db";
import {
  BASE_BACKOFF_MS,
  backoffMs,
  deliverPending,
  enqueueEmails,
  MAX_ATTEMPTS,
  MAX_BACKOFF_MS,
} from "@/lib/mail/outbox";
import { smtpSender } from "@/lib/mail/transport";
import { call, insertRun, tokensFor } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

type Received = { from: string; to: string[]; raw: string };
const received: Received[] = [];
let sink: SMTPServer;
let sinkPort = 0;

/** The Subject header of a raw message, unfolded and with RFC 2047 Q-encoded words decoded. */
function subjectOf(raw: string): string {
  const head = raw.split(/\r?\n\r?\n/)[0] ?? "";
  const line = /^Subject: (.*(?:\r?\n[ \t].*)*)/m.exec(head)?.[1] ?? "";
  return line
    .replace(/\?=\r?\n[ \t]+=\?/g, "?==?")
    .replace(/=\?UTF-8\?Q\?(.*?)\?=/gi, (_, q: string) =>
      Buffer.from(
        q
          .replace(/_/g, " ")
          .replace(/=([0-9A-F]{2})/gi, (_m, h: string) => String.fromCharCode(Number.parseInt(h, 16))),
        "latin1",
      ).toString("utf8"),
    )
    .replace(/\?==\?/g, "");
}

/** A port nothing listens on: bind one, note it, close it. */
async function deadPort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, "127.0.0.1", () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

beforeAll(async () => {
  process.env.OUTBOX_AUTODELIVER = "0";
  // A real SMTP server of our own on a free loopback port, recording what arrives.
  sink = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    onData(stream, session, done) {
      let raw = "";
      stream.on("data", (chunk: Buffer) => {
        raw += chunk.toString("utf8");
      });
      stream.on("end", () => {
        received.push({
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : "",
          to: session.envelope.rcptTo.map((r) => r.address),
          raw,
        });
        done();
      });
    },
  });
  await new Promise<void>((resolve) => sink.listen(0, "127.0.0.1", () => resolve()));
  sinkPort = (sink.server.address() as { port: number }).port;
});

afterAll(async () => {
  await new Promise<void>((resolve) => sink.close(() => resolve()));
});

let fx: Fixtures;
beforeEach(async () => {
  received.length = 0;
  fx = await createFixtures();
});

describe("outbox", () => {
  it("backs off exponentially: 30 s, 60 s, 120 s … capped at one hour", () => {
    expect(BASE_BACKOFF_MS).toBe(30_000);
    expect([1, 2, 3, 4].map(backoffMs)).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(backoffMs(20)).toBe(MAX_BACKOFF_MS);
  });

  it("writes the e-mail in the same transaction as the change: a rollback leaves neither", async () => {
    const run = await insertRun(fx.project.id, fx.users.designer.id);
    await expect(
      sequelize.transaction(async (transaction) => {
        await Comment.create(
          { runId: run.id, authorId: fx.users.reviewer.id, body: "lost" },
          { transaction },
        );
        await enqueueEmails([{ to: "designer@fixture.test", subject: "s", text: "t" }], transaction);
        expect(await OutboxEmail.count({ transaction })).toBe(1);
        throw new Error("abort after the e-mail was queued");
      }),
    ).rejects.toThrow("abort after the e-mail was queued");
    expect(await Comment.count()).toBe(0);
    expect(await OutboxEmail.count()).toBe(0);
  });

  it("a comment through the API queues its e-mail, and deliverPending sends it to the SMTP server", async () => {
    const tokens = await tokensFor(fx);
    const run = await insertRun(fx.project.id, fx.users.designer.id, { title: "Bridge rev C" });
    const res = await call(postComment, {
      token: tokens.reviewer,
      params: { id: run.id },
      body: { body: "Looks stable." },
    });
    expect(res.status).toBe(201);
    const [queued] = await OutboxEmail.findAll();
    expect(queued?.status).toBe("pending");
    expect(queued?.attempts).toBe(0);

    const report = await deliverPending({ send: smtpSender(`smtp://127.0.0.1:${sinkPort}`) });
    expect(report).toEqual({ sent: 1, failed: 0, retrying: 0 });
    const sent = await OutboxEmail.findByPk(queued?.id);
    expect(sent?.status).toBe("sent");
    expect(sent?.attempts).toBe(1);
    expect(sent?.sentAt).toBeInstanceOf(Date);
    expect(received).toHaveLength(1);
    expect(received[0]?.to).toEqual(["designer@fixture.test"]);
    expect(subjectOf(received[0]?.raw ?? "")).toBe('Fixture reviewer commented on "Bridge rev C"');
    expect(received[0]?.raw).toContain("Looks stable.");

    // Nothing is sent twice.
    expect(await deliverPending({ send: smtpSender(`smtp://127.0.0.1:${sinkPort}`) })).toEqual({
      sent: 0,
      failed: 0,
      retrying: 0,
    });
    expect(received).toHaveLength(1);
  });

  it("keeps a message pending with lastError while SMTP is down, retries on schedule, then delivers", async () => {
    await sequelize.transaction((t) =>
      enqueueEmails([{ to: "someone@fixture.test", subject: "Hello", text: "Body" }], t).then(
        () => undefined,
      ),
    );
    const down = smtpSender(`smtp://127.0.0.1:${await deadPort()}`);
    const t0 = new Date();
    expect(await deliverPending({ send: down, now: t0 })).toEqual({ sent: 0, failed: 0, retrying: 1 });
    let row = await OutboxEmail.findOne();
    expect(row?.status).toBe("pending");
    expect(row?.attempts).toBe(1);
    expect(row?.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(row?.nextAttemptAt.getTime()).toBe(t0.getTime() + 30_000);

    // Not due yet: nothing is tried.
    expect(await deliverPending({ send: down, now: new Date(t0.getTime() + 29_000) })).toEqual({
      sent: 0,
      failed: 0,
      retrying: 0,
    });
    const t1 = new Date(t0.getTime() + 31_000);
    await deliverPending({ send: down, now: t1 });
    row = await OutboxEmail.findOne();
    expect(row?.attempts).toBe(2);
    expect(row?.nextAttemptAt.getTime()).toBe(t1.getTime() + 60_000);

    // The server is back: the next due pass delivers it.
    const t2 = new Date(t1.getTime() + 61_000);
    expect(await deliverPending({ send: smtpSender(`smtp://127.0.0.1:${sinkPort}`), now: t2 })).toEqual({
      sent: 1,
      failed: 0,
      retrying: 0,
    });
    row = await OutboxEmail.findOne();
    expect(row?.status).toBe("sent");
    expect(row?.attempts).toBe(3);
    expect(row?.lastError).toBeNull();
    expect(received[0]?.to).toEqual(["someone@fixture.test"]);
  });

  it(`gives up after ${MAX_ATTEMPTS} attempts and marks the message failed`, async () => {
    await sequelize.transaction((t) =>
      enqueueEmails([{ to: "x@fixture.test", subject: "S", text: "T" }], t).then(() => undefined),
    );
    const failing = async () => {
      throw new Error("550 mailbox unavailable");
    };
    let now = Date.now();
    for (let i = 0; i < MAX_ATTEMPTS; i++) {
      await deliverPending({ send: failing, now: new Date(now) });
      now += MAX_BACKOFF_MS + 1;
    }
    const row = await OutboxEmail.findOne();
    expect(row?.status).toBe("failed");
    expect(row?.attempts).toBe(MAX_ATTEMPTS);
    expect(row?.lastError).toBe("550 mailbox unavailable");
  });

  it("GET /api/dev/outbox: only the caller's own mail, only with the local mail fake, never anonymous", async () => {
    const token = (await tokensFor(fx)).viewer;
    await sequelize.transaction((t) =>
      enqueueEmails(
        [
          { to: "viewer@fixture.test", subject: "First", text: "1" },
          { to: "owner@fixture.test", subject: "Not yours", text: "2" },
        ],
        t,
      ).then(() => undefined),
    );
    expect((await call(outboxRoute, {})).status).toBe(401);
    const res = await call(outboxRoute, { token });
    expect(res.status).toBe(200);
    expect(res.body.emails.map((e: { subject: string }) => e.subject)).toEqual(["First"]);
    vi.stubEnv("NODE_ENV", "production");
    vi.stubEnv("APP_ENV", "production");
    try {
      expect((await call(outboxRoute, { token })).status).toBe(404);
      vi.stubEnv("APP_ENV", "test");
      expect((await call(outboxRoute, { token })).status).toBe(200);
      // A real mail service configured: no viewer, even in tests.
      vi.stubEnv("SMTP_URL", "smtp://mail.example.test:587");
      expect((await call(outboxRoute, { token })).status).toBe(404);
    } finally {
      vi.unstubAllEnvs();
    }
  });
});
