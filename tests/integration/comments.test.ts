import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { PATCH as patchComment } from "@/app/api/runs/[id]/comments/[commentId]/route";
import { GET as listCommentsRoute, POST as postComment } from "@/app/api/runs/[id]/comments/route";
import { Comment, OutboxEmail } from "@/lib/db";
import { call, insertRun, tokensFor, type Who } from "./runs-fixtures";
import { createFixtures, type Fixtures, useTestDb } from "./setup";

useTestDb();

let fx: Fixtures;
let tokens: Record<Who, string>;
let runId: string;

beforeAll(() => {
  process.env.OUTBOX_AUTODELIVER = "0";
});

beforeEach(async () => {
  fx = await createFixtures();
  tokens = await tokensFor(fx);
  runId = (await insertRun(fx.project.id, fx.users.designer.id, { title: "Low-pass fixture" })).id;
});

const post = (who: Who, body: unknown, id = runId) =>
  call(postComment, { token: tokens[who], params: { id }, body });

describe("POST /api/runs/:id/comments", () => {
  it("saves a comment pinned to a frequency on a trace and mails the run's author", async () => {
    const res = await post("reviewer", { body: "Corner looks right.", frequencyHz: 1000, trace: "H" });
    expect(res.status).toBe(201);
    expect(res.body.comment).toMatchObject({
      body: "Corner looks right.",
      frequencyHz: 1000,
      trace: "H",
      parentId: null,
      authorName: "Fixture reviewer",
      state: "open",
      settledAt: null,
    });
    const row = await Comment.findByPk(res.body.comment.id);
    expect(row?.frequencyHz).toBe(1000);
    const mails = await OutboxEmail.findAll();
    expect(mails.map((m) => m.to)).toEqual(["designer@fixture.test"]);
    expect(mails[0]?.subject).toBe('Fixture reviewer commented on "Low-pass fixture"');
    expect(mails[0]?.text).toContain("at 1 kHz on H");
    expect(mails[0]?.text).toContain(`/runs/${runId}`);
    expect(mails[0]?.status).toBe("pending");
  });

  it("rejects a pin outside the sweep or on an unknown trace with the field named, saving nothing", async () => {
    const outside = await post("reviewer", { body: "x", frequencyHz: 50_000 });
    expect(outside.status).toBe(400);
    expect(outside.body.error.details.fields.frequencyHz[0]).toContain(
      "inside the sweep (100 Hz to 10000 Hz)",
    );
    const trace = await post("reviewer", { body: "x", frequencyHz: 1000, trace: "nope" });
    expect(trace.status).toBe(400);
    expect(trace.body.error.details.fields.trace[0]).toBe('This run has no trace named "nope".');
    const empty = await post("reviewer", { body: "   " });
    expect(empty.status).toBe(400);
    expect(Object.keys(empty.body.error.details.fields)).toEqual(["body"]);
    expect(await Comment.count()).toBe(0);
    expect(await OutboxEmail.count()).toBe(0);
  });

  it("400 on malformed JSON", async () => {
    const res = await call(postComment, { token: tokens.reviewer, params: { id: runId }, rawBody: "{body:" });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("bad_request");
  });

  it("threads replies on the first comment and mails author and participants, never the commenter", async () => {
    const root = await post("reviewer", { body: "Why 10 nF?" });
    const reply1 = await post("designer", { body: "Stock value.", parentId: root.body.comment.id });
    expect(reply1.body.comment.parentId).toBe(root.body.comment.id);
    // A reply to a reply hangs off the same thread root.
    const reply2 = await post("owner", { body: "Fine by me.", parentId: reply1.body.comment.id });
    expect(reply2.status).toBe(201);
    expect(reply2.body.comment.parentId).toBe(root.body.comment.id);

    const byMail = async (subjectPart: string) =>
      (await OutboxEmail.findAll({ order: [["to", "ASC"]] }))
        .filter((m) => m.subject.includes(subjectPart))
        .map((m) => m.to);
    // reviewer's comment → the author (designer); designer's reply → reviewer (participant), not the designer;
    // owner's reply → designer (author) and reviewer (participant), not the owner.
    expect(await byMail("Fixture reviewer commented")).toEqual(["designer@fixture.test"]);
    expect(await byMail("Fixture designer replied")).toEqual(["reviewer@fixture.test"]);
    expect(await byMail("Fixture owner replied")).toEqual(["designer@fixture.test", "reviewer@fixture.test"]);
  });

  it("refuses a parent from another run", async () => {
    const other = await insertRun(fx.project.id, fx.users.designer.id);
    const foreign = await post("reviewer", { body: "elsewhere" }, other.id);
    const res = await post("reviewer", { body: "x", parentId: foreign.body.comment.id });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.parentId).toEqual(["Not a comment of this run."]);
  });

  it("viewer 403, outsider 404, nothing saved", async () => {
    expect((await post("viewer", { body: "hi" })).status).toBe(403);
    const out = await post("outsider", { body: "hi" });
    expect(out.status).toBe(404);
    expect(out.body.error.code).toBe("not_found");
    expect(await Comment.count()).toBe(0);
  });
});

describe("GET and PATCH comments", () => {
  it("lists oldest first, settles a thread and opens it again, naming who settled it", async () => {
    const a = await post("reviewer", { body: "first" });
    await post("designer", { body: "second" });
    const list = await call(listCommentsRoute, { token: tokens.viewer, params: { id: runId } });
    expect(list.status).toBe(200);
    expect(list.body.comments.map((c: { body: string }) => c.body)).toEqual(["first", "second"]);

    const id = a.body.comment.id;
    const settled = await call(patchComment, {
      token: tokens.designer,
      method: "PATCH",
      params: { id: runId, commentId: id },
      body: { state: "settled" },
    });
    expect(settled.status).toBe(200);
    expect(settled.body.comment).toMatchObject({ state: "settled", settledByName: "Fixture designer" });
    expect((await Comment.findByPk(id))?.settledById).toBe(fx.users.designer.id);

    // The old word is not accepted; the field is named.
    const oldWord = await call(patchComment, {
      token: tokens.designer,
      method: "PATCH",
      params: { id: runId, commentId: id },
      body: { resolved: true },
    });
    expect(oldWord.status).toBe(400);
    expect(Object.keys(oldWord.body.error.details.fields)).toEqual(["state"]);

    const reopened = await call(patchComment, {
      token: tokens.reviewer,
      method: "PATCH",
      params: { id: runId, commentId: id },
      body: { state: "open" },
    });
    expect(reopened.body.comment).toMatchObject({ state: "open", settledAt: null, settledByName: null });

    const viewer = await call(patchComment, {
      token: tokens.viewer,
      method: "PATCH",
      params: { id: runId, commentId: id },
      body: { state: "settled" },
    });
    expect(viewer.status).toBe(403);
    const wrongRun = await call(patchComment, {
      token: tokens.designer,
      method: "PATCH",
      params: { id: (await insertRun(fx.project.id, fx.users.designer.id)).id, commentId: id },
      body: { state: "settled" },
    });
    expect(wrongRun.status).toBe(404);
  });

  it("settling is for the comment's author, the run's author and reviewers/owners only", async () => {
    // A run the owner wrote; the reviewer comments on it. The designer is neither author.
    const ownersRun = (await insertRun(fx.project.id, fx.users.owner.id, { title: "Owner's run" })).id;
    const comment = await post("reviewer", { body: "check the corner" }, ownersRun);
    const settle = (who: Who, state: "settled" | "open") =>
      call(patchComment, {
        token: tokens[who],
        method: "PATCH",
        params: { id: ownersRun, commentId: comment.body.comment.id },
        body: { state },
      });
    const refused = await settle("designer", "settled");
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toContain("comment's author, the run's author");
    expect((await Comment.findByPk(comment.body.comment.id))?.settledAt).toBeNull();
    expect((await settle("reviewer", "settled")).status).toBe(200); // the comment's author (and a reviewer)
    expect((await settle("owner", "open")).status).toBe(200); // the run's author (and an owner)
    // The designer's own comment on the same run: its author may settle it.
    const own = await post("designer", { body: "mine" }, ownersRun);
    const mine = await call(patchComment, {
      token: tokens.designer,
      method: "PATCH",
      params: { id: ownersRun, commentId: own.body.comment.id },
      body: { state: "settled" },
    });
    expect(mine.status).toBe(200);
  });
});
