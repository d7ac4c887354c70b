import { z } from "zod";
import { ROLE_CHOICE_MESSAGE, ROLES } from "@/lib/roles";

export const roleSchema = z.enum(ROLES, { error: ROLE_CHOICE_MESSAGE });

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
