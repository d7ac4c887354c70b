import { describe, expect, it } from "vitest";
import { ACTIONS, type Action, can, isRole, isUuid, ROLES, type Role } from "@/lib/authz";

// The roles table of PRODUCT.md, written out cell by cell (Y = allowed):
// owner: everything; designer: create projects, runs, upload measurements, request review, comment;
// reviewer: read, comment, approve / request changes; viewer: read only.
const TABLE: Record<Action, Record<Role, boolean>> = {
  "team:read": { owner: true, designer: true, reviewer: true, viewer: true },
  "team:manage": { owner: true, designer: false, reviewer: false, viewer: false },
  "project:create": { owner: true, designer: true, reviewer: false, viewer: false },
  "project:delete": { owner: true, designer: false, reviewer: false, viewer: false },
  "project:read": { owner: true, designer: true, reviewer: true, viewer: true },
  "run:create": { owner: true, designer: true, reviewer: false, viewer: false },
  "run:read": { owner: true, designer: true, reviewer: true, viewer: true },
  "run:comment": { owner: true, designer: true, reviewer: true, viewer: false },
  "run:review": { owner: true, designer: false, reviewer: true, viewer: false },
  "run:request_review": { owner: true, designer: true, reviewer: false, viewer: false },
  "measurement:upload": { owner: true, designer: true, reviewer: false, viewer: false },
};

describe("can(role, action)", () => {
  it("covers every action of the contract", () => {
    expect([...ACTIONS].sort()).toEqual(Object.keys(TABLE).sort());
    expect(ACTIONS).toHaveLength(11);
    expect([...ROLES]).toEqual(["owner", "designer", "reviewer", "viewer"]);
  });

  for (const action of Object.keys(TABLE) as Action[]) {
    for (const role of ["owner", "designer", "reviewer", "viewer"] as Role[]) {
      const expected = TABLE[action][role];
      it(`${role} ${expected ? "may" : "may not"} ${action}`, () => {
        expect(can(role, action)).toBe(expected);
      });
    }
  }

  it("counts the allowed cells per role", () => {
    const count = (role: Role) => ACTIONS.filter((a) => can(role, a)).length;
    expect(count("owner")).toBe(11);
    expect(count("designer")).toBe(8);
    expect(count("reviewer")).toBe(5);
    expect(count("viewer")).toBe(3);
  });

  it("refuses an unknown role and an unknown action", () => {
    expect(can("admin" as Role, "run:read")).toBe(false);
    expect(can("owner", "team:delete" as Action)).toBe(false);
  });
});

describe("id and role guards", () => {
  it("accepts only UUIDs", () => {
    expect(isUuid("6f1c2a4e-0b7d-4c35-9a0e-2d3f4b5c6d7e")).toBe(true);
    expect(isUuid("6f1c2a4e-0b7d-4c35-9a0e-2d3f4b5c6d7")).toBe(false);
    expect(isUuid("1; drop table runs")).toBe(false);
    expect(isUuid(42)).toBe(false);
  });

  it("recognises the four roles only", () => {
    expect(isRole("reviewer")).toBe(true);
    expect(isRole("Reviewer")).toBe(false);
    expect(isRole(undefined)).toBe(false);
  });
});
