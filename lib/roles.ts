/**
 * The team roles, declared once (client-safe: no imports). The database enums (models/membership.ts,
 * models/invitation.ts), the zod schemas (lib/validations/team.ts, invitation.ts), the permission
 * table (lib/authz.ts) and every label and select on screen derive from these lists; a `Record<Role, …>`
 * makes the compiler name any place a new role is missing from. (A migration keeps the list it was
 * written with: a new role is a new migration.)
 */
export const ROLES = ["owner", "designer", "reviewer", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

export const ROLE_LABELS: Record<Role, string> = {
  owner: "Owner",
  designer: "Designer",
  reviewer: "Reviewer",
  viewer: "Viewer",
};

/** What each role may do, in a line (the team page; the rules themselves are lib/authz.ts). */
export const ROLE_DUTIES: Record<Role, string> = {
  owner: "everything, plus members, roles and deleting projects",
  designer: "creates projects and runs, uploads measurements, asks for review",
  reviewer: "reads, comments, signs off or sends back runs",
  viewer: "reads only",
};

/** The role an invitation offers unless the owner picks another. */
export const DEFAULT_INVITE_ROLE: Role = "designer";

/** The message of a role field that holds something else. */
export const ROLE_CHOICE_MESSAGE = `Choose one of ${ROLES.slice(0, -1).join(", ")} or ${ROLES[ROLES.length - 1]}.`;
