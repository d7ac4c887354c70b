import { describe, expect, it } from "vitest";
import { type SupersedeSide, supersedeError, supersedeProblem } from "@/lib/supersede";

const P = "11111111-1111-4111-8111-111111111111";
const older: SupersedeSide = {
  id: "aaaaaaaa-0000-4000-8000-000000000001",
  projectId: P,
  createdAt: new Date("2026-03-01T10:00:00Z"),
  supersedesId: null,
};
const newer: SupersedeSide = {
  id: "aaaaaaaa-0000-4000-8000-000000000002",
  projectId: P,
  createdAt: new Date("2026-03-01T10:05:00Z"),
  supersedesId: null,
};

describe("supersedeProblem: the one set of rules for the review step and for saving a revision", () => {
  it("allows a later run of the same project that supersedes nothing yet", () => {
    expect(supersedeProblem(older, newer)).toBeNull();
  });

  it("names each broken rule", () => {
    expect(supersedeProblem(null, newer)).toBe("missing");
    expect(supersedeProblem(older, null)).toBe("missing");
    expect(supersedeProblem(older, { ...newer, projectId: "22222222-2222-4222-8222-222222222222" })).toBe(
      "other_project",
    );
    expect(supersedeProblem(older, older)).toBe("same_run");
    expect(supersedeProblem(newer, older)).toBe("not_later");
    expect(supersedeProblem(older, { ...newer, createdAt: older.createdAt })).toBe("not_later");
    expect(supersedeProblem(older, { ...newer, supersedesId: older.id })).toBe("already_linked");
    expect(supersedeProblem(older, { ...newer, supersedesId: "aaaaaaaa-0000-4000-8000-000000000009" })).toBe(
      "supersedes_another",
    );
  });

  it("checks the project before the dates, so a foreign run is never described by its age", () => {
    const foreignAndOlder = {
      ...newer,
      projectId: "33333333-3333-4333-8333-333333333333",
      createdAt: new Date(0),
    };
    expect(supersedeProblem(older, foreignAndOlder)).toBe("other_project");
  });
});

describe("supersedeError: a 400 naming the request's field, or a 409 for an existing link", () => {
  it("names supersededBy on the review step and supersedesId on a revision", () => {
    const review = supersedeError("not_later", "supersededBy");
    expect([review.status, review.details]).toEqual([
      400,
      { fields: { supersededBy: ["This run is older."] } },
    ]);
    const revision = supersedeError("other_project", "supersedesId");
    expect([revision.status, revision.message, revision.details]).toEqual([
      400,
      "The run to supersede is not in this project.",
      { fields: { supersedesId: ["Not a run of this project."] } },
    ]);
  });

  it("answers 409 conflict when the later run already supersedes a run", () => {
    for (const problem of ["already_linked", "supersedes_another"] as const) {
      const e = supersedeError(problem, "supersededBy");
      expect([e.status, e.code]).toEqual([409, "conflict"]);
    }
  });
});
