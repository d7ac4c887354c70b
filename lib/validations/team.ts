import { z } from "zod";

export const roleSchema = z.enum(["owner", "designer", "reviewer", "viewer"], {
  error: "Choose one of owner, designer, reviewer or viewer.",
});

const uuid = (what: string) => z.uuid({ error: `Not a valid ${what} id.` });

export const memberRoleUpdateSchema = z.object({
  teamId: uuid("team"),
  membershipId: uuid("membership"),
  role: roleSchema,
});

export const memberRemoveSchema = z.object({
  teamId: uuid("team"),
  membershipId: uuid("membership"),
});

export type MemberRoleUpdateInput = z.infer<typeof memberRoleUpdateSchema>;
