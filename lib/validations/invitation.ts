import { z } from "zod";
import { roleSchema } from "@/lib/validations/team";

/** `POST /api/teams/:id/invitations` (owner only). */
export const invitationCreateSchema = z.object({
  email: z
    .email("Enter an e-mail address.")
    .max(320)
    .transform((s) => s.toLowerCase()),
  role: roleSchema,
});
export type InvitationCreateInput = z.infer<typeof invitationCreateSchema>;

/** The invitation a revoke/resend form or route acts on. */
export const invitationRefSchema = z.object({
  teamId: z.uuid("Not a team id."),
  invitationId: z.uuid("Not an invitation id."),
});
