import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { POST as reviewRoute } from "@/app/api/runs/[id]/review/route";
import { GET as getRunRoute } from "@/app/api/runs/[id]/route";
import { Membership, OutboxEmail, ReviewEvent, Run, User } from "@/lib/db";
import { call, insertRun, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

let fx: Fixtures;
let tokens: Record<Who, string>;

beforeAll(() => {
  process.env.OUTBOX_AUTODELIVER = "0";
});

beforeEach(async () => {
  fx = await createFixtures();
  tokens = await tokensFor(fx);
});

const review = (who: Who, id: string, body: unknown) =>
  call(reviewRoute, { token: tokens[who], params: { id }, body });

describe("POST /api/runs/:id/review", () => {
  it("walks draft → awaiting sign-off → sent back → awaiting sign-off → signed off, mailing the right people", async () => {
    // A second reviewer, so the ask for sign-off goes to both.
    const second = await User.create({
      email: "second-reviewer@fixture.test",
      name: "Second reviewer",
      passwordHash: "x",
    });
    await Membership.create({ teamId: fx.team.id, userId: second.id, role: "reviewer" });
    const run = await insertRun(fx.project.id, fx.users.designer.id, { title: "Notch rev 1" });

    const req = await review("designer", run.id, {
      action: "submit",
      note: "Please check the notch depth.",
    });
    expect(req.status).toBe(200);
    expect(req.body).toMatchObject({
      reviewState: "awaiting_signoff",
      emails: 2,
      event: { action: "submit" },
    });
    const requestMails = await OutboxEmail.findAll({ order: [["to", "ASC"]] });
    expect(requestMails.map((m) => m.to)).toEqual(["reviewer@fixture.test", "second-reviewer@fixture.test"]);
    expect(requestMails[0]?.subject).toBe('Sign-off asked: "Notch rev 1"');
    expect(requestMails[0]?.text).toContain(
      'asks you to sign off the run "Notch rev 1", or send it back with a note.',
    );
    expect(requestMails[0]?.text).toContain("> Please check the notch depth.");

    // The author may not judge their own run even as owner of a team; a designer may not judge at all.
    expect((await review("designer", run.id, { action: "sign_off" })).status).toBe(403);
    // Sending back needs a note.
    const noNote = await review("reviewer", run.id, { action: "send_back" });
    expect(noNote.status).toBe(400);
    expect(noNote.body.error.details.fields.note).toEqual([
      "Say what needs another look before sending the run back.",
    ]);

    const changes = await review("reviewer", run.id, {
      action: "send_back",
      note: "Deeper null, please.",
    });
    expect(changes.body.reviewState).toBe("sent_back");
    const verdict1 = await OutboxEmail.findAll({ where: { to: "designer@fixture.test" } });
    expect(verdict1.map((m) => m.subject)).toEqual(['Sent back: "Notch rev 1"']);

    // Signing off a run that is not awaiting sign-off is a conflict, in the new words.
    const early = await review("reviewer", run.id, { action: "sign_off" });
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe("conflict");
    expect(early.body.error.message).toBe('This run is sent back; it cannot take "sign_off".');

    expect((await review("designer", run.id, { action: "submit" })).body.reviewState).toBe(
      "awaiting_signoff",
    );
    const ok = await review("owner", run.id, { action: "sign_off", note: "Good." });
    expect(ok.status).toBe(200);
    expect(ok.body.reviewState).toBe("signed_off");
    expect((await Run.findByPk(run.id))?.reviewState).toBe("signed_off");

    const events = await ReviewEvent.findAll({ where: { runId: run.id }, order: [["createdAt", "ASC"]] });
    expect(events.map((e) => e.action)).toEqual(["submit", "send_back", "submit", "sign_off"]);
    const toAuthor = await OutboxEmail.findAll({
      where: { to: "designer@fixture.test" },
      order: [["createdAt", "ASC"]],
    });
    expect(toAuthor.map((m) => m.subject)).toEqual(['Sent back: "Notch rev 1"', 'Signed off: "Notch rev 1"']);

    // The run page's data shows the history with names.
    const page = await call(getRunRoute, { token: tokens.viewer, params: { id: run.id } });
    expect(page.body.run.reviewEvents.map((e: { actorName: string }) => e.actorName)).toEqual([
      "Fixture designer",
      "Fixture reviewer",
      "Fixture designer",
      "Fixture owner",
    ]);
    expect(page.body.run.permissions).toEqual({
      comment: false,
      review: false,
      askSignOff: false,
      createRun: false,
    });
  });

  it("viewer and reviewer may not ask for sign-off; viewer and designer may not sign off; outsider gets 404", async () => {
    const run = await insertRun(fx.project.id, fx.users.designer.id);
    expect((await review("viewer", run.id, { action: "submit" })).status).toBe(403);
    expect((await review("reviewer", run.id, { action: "submit" })).status).toBe(403);
    expect((await review("outsider", run.id, { action: "submit" })).status).toBe(404);
    const awaiting = await insertRun(fx.project.id, fx.users.owner.id, { reviewState: "awaiting_signoff" });
    expect((await review("viewer", awaiting.id, { action: "sign_off" })).status).toBe(403);
    expect((await review("designer", awaiting.id, { action: "sign_off" })).status).toBe(403);
    expect((await review("outsider", awaiting.id, { action: "sign_off" })).status).toBe(404);
    expect((await review("reviewer", awaiting.id, { action: "sign_off" })).status).toBe(200);
    expect(await ReviewEvent.count()).toBe(1);
  });

  it("rejects unknown actions with the field named", async () => {
    const run = await insertRun(fx.project.id, fx.users.designer.id);
    const res = await review("designer", run.id, { action: "merge" });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields)).toEqual(["action"]);
  });

  it("supersede links a later run of the same project and records the event on the older run", async () => {
    const older = await insertRun(fx.project.id, fx.users.designer.id, { title: "rev 1" });
    const sibling = await insertRun(fx.project.id, fx.users.designer.id, { title: "rev 1b" });
    const newer = await insertRun(fx.project.id, fx.users.designer.id, { title: "rev 2" });
    const elsewhere = await insertRun(fx.otherProject.id, fx.users.outsider.id);

    const backwards = await review("designer", newer.id, { action: "supersede", supersededBy: older.id });
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.details.fields.supersededBy).toEqual(["This run is older."]);
    const foreign = await review("designer", older.id, { action: "supersede", supersededBy: elsewhere.id });
    expect(foreign.status).toBe(400);
    const missing = await review("designer", older.id, { action: "supersede" });
    expect(missing.body.error.details.fields.supersededBy).toEqual([
      "Name the later run that supersedes this one.",
    ]);

    const ok = await review("designer", older.id, { action: "supersede", supersededBy: newer.id });
    expect(ok.status).toBe(200);
    expect(ok.body.event.action).toBe("supersede");
    expect((await Run.findByPk(newer.id))?.supersedesId).toBe(older.id);
    const page = await call(getRunRoute, { token: tokens.reviewer, params: { id: older.id } });
    expect(page.body.run.supersededBy).toEqual([{ id: newer.id, title: "rev 2" }]);
    expect((await review("reviewer", older.id, { action: "supersede", supersededBy: newer.id })).status).toBe(
      403,
    );
    // lib/supersede.ts: a link is made once, and a run supersedes at most one run.
    const again = await review("designer", older.id, { action: "supersede", supersededBy: newer.id });
    expect([again.status, again.body.error.code]).toEqual([409, "conflict"]);
    const another = await review("designer", sibling.id, { action: "supersede", supersededBy: newer.id });
    expect(another.body.error.code).toBe("conflict");
    expect(await ReviewEvent.count({ where: { runId: older.id, action: "supersede" } })).toBe(1);
  });
});

describe("waiting for my sign-off (lib/awaiting.ts)", () => {
  it("lists runs awaiting sign-off to those who may sign off, never to their author or a viewer", async () => {
    const { listAwaitingMySignOff } = await import("@/lib/awaiting");
    const asked = await insertRun(fx.project.id, fx.users.designer.id, { title: "Asked run" });
    await insertRun(fx.project.id, fx.users.designer.id, { title: "Draft run" });
    expect((await review("designer", asked.id, { action: "submit" })).status).toBe(200);

    const forReviewer = await listAwaitingMySignOff(fx.users.reviewer.id);
    expect(forReviewer.map((r) => r.title)).toEqual(["Asked run"]);
    expect(forReviewer[0]).toMatchObject({ projectId: fx.project.id, authorName: fx.users.designer.name });
    expect(Number.isNaN(Date.parse(forReviewer[0]!.askedAt))).toBe(false);
    expect((await listAwaitingMySignOff(fx.users.owner.id)).map((r) => r.title)).toEqual(["Asked run"]);
    expect(await listAwaitingMySignOff(fx.users.designer.id)).toEqual([]);
    expect(await listAwaitingMySignOff(fx.users.viewer.id)).toEqual([]);
    expect(await listAwaitingMySignOff(fx.users.outsider.id)).toEqual([]);

    // Signed off: off the list.
    expect((await review("reviewer", asked.id, { action: "sign_off" })).status).toBe(200);
    expect(await listAwaitingMySignOff(fx.users.reviewer.id)).toEqual([]);
  });
});
