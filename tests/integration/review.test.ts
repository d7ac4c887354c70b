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
  it("walks draft → in review → changes requested → in review → approved, mailing the right people", async () => {
    // A second reviewer, so the request goes to both.
    const second = await User.create({
      email: "second-reviewer@fixture.test",
      name: "Second reviewer",
      passwordHash: "x",
    });
    await Membership.create({ teamId: fx.team.id, userId: second.id, role: "reviewer" });
    const run = await insertRun(fx.project.id, fx.users.designer.id, { title: "Notch rev 1" });

    const req = await review("designer", run.id, {
      action: "request",
      note: "Please check the notch depth.",
    });
    expect(req.status).toBe(200);
    expect(req.body).toMatchObject({ reviewState: "in_review", emails: 2, event: { action: "request" } });
    const requestMails = await OutboxEmail.findAll({ order: [["to", "ASC"]] });
    expect(requestMails.map((m) => m.to)).toEqual(["reviewer@fixture.test", "second-reviewer@fixture.test"]);
    expect(requestMails[0]?.subject).toBe('Review requested: "Notch rev 1"');
    expect(requestMails[0]?.text).toContain("> Please check the notch depth.");

    // The author may not judge their own run even as owner of a team; a designer may not judge at all.
    expect((await review("designer", run.id, { action: "approve" })).status).toBe(403);
    // Changes need a note.
    const noNote = await review("reviewer", run.id, { action: "request_changes" });
    expect(noNote.status).toBe(400);
    expect(noNote.body.error.details.fields.note).toEqual(["Say what should change."]);

    const changes = await review("reviewer", run.id, {
      action: "request_changes",
      note: "Deeper null, please.",
    });
    expect(changes.body.reviewState).toBe("changes_requested");
    const verdict1 = await OutboxEmail.findAll({ where: { to: "designer@fixture.test" } });
    expect(verdict1.map((m) => m.subject)).toEqual(['Changes requested: "Notch rev 1"']);

    // Approving a run that is not in review is a conflict.
    const early = await review("reviewer", run.id, { action: "approve" });
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe("conflict");

    expect((await review("designer", run.id, { action: "request" })).body.reviewState).toBe("in_review");
    const ok = await review("owner", run.id, { action: "approve", note: "Good." });
    expect(ok.status).toBe(200);
    expect(ok.body.reviewState).toBe("approved");
    expect((await Run.findByPk(run.id))?.reviewState).toBe("approved");

    const events = await ReviewEvent.findAll({ where: { runId: run.id }, order: [["createdAt", "ASC"]] });
    expect(events.map((e) => e.action)).toEqual(["request", "request_changes", "request", "approve"]);
    const toAuthor = await OutboxEmail.findAll({
      where: { to: "designer@fixture.test" },
      order: [["createdAt", "ASC"]],
    });
    expect(toAuthor.map((m) => m.subject)).toEqual([
      'Changes requested: "Notch rev 1"',
      'Approved: "Notch rev 1"',
    ]);

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
      requestReview: false,
      createRun: false,
    });
  });

  it("viewer and reviewer may not request review; viewer and designer may not approve; outsider gets 404", async () => {
    const run = await insertRun(fx.project.id, fx.users.designer.id);
    expect((await review("viewer", run.id, { action: "request" })).status).toBe(403);
    expect((await review("reviewer", run.id, { action: "request" })).status).toBe(403);
    expect((await review("outsider", run.id, { action: "request" })).status).toBe(404);
    const inReview = await insertRun(fx.project.id, fx.users.owner.id, { reviewState: "in_review" });
    expect((await review("viewer", inReview.id, { action: "approve" })).status).toBe(403);
    expect((await review("designer", inReview.id, { action: "approve" })).status).toBe(403);
    expect((await review("outsider", inReview.id, { action: "approve" })).status).toBe(404);
    expect((await review("reviewer", inReview.id, { action: "approve" })).status).toBe(200);
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
  });
});
