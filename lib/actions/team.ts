"use server";

import { revalidatePath } from "next/cache";
import { type FormState, failureState, formValues, issuesToFields } from "@/lib/actions/state";
import { createInvitation, resendInvitation, revokeInvitation } from "@/lib/invitations";
import { requireUser } from "@/lib/session";
import { changeMemberRole, removeMember } from "@/lib/teams";
import { invitationCreateSchema, invitationRefSchema } from "@/lib/validations/invitation";
import { memberRemoveSchema, memberRoleUpdateSchema } from "@/lib/validations/team";

/** Form action (owner only, checked in lib/teams through lib/authz): change a member's role. */
export async function changeRoleAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const actor = await requireUser();
  const parsed = memberRoleUpdateSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success)
    return { ok: false, message: "That change is not valid.", errors: issuesToFields(parsed.error.issues) };
  const { teamId, membershipId, role } = parsed.data;
  try {
    await changeMemberRole(actor.userId, teamId, membershipId, role);
  } catch (err) {
    return failureState(err, "changeRole");
  }
  revalidatePath(`/teams/${teamId}`);
  return { ok: true, message: `Role set to ${role}.` };
}

/** Form action (owner only): remove a member from the team. */
export async function removeMemberAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const actor = await requireUser();
  const parsed = memberRemoveSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success)
    return { ok: false, message: "That change is not valid.", errors: issuesToFields(parsed.error.issues) };
  const { teamId, membershipId } = parsed.data;
  try {
    await removeMember(actor.userId, teamId, membershipId);
  } catch (err) {
    return failureState(err, "removeMember");
  }
  revalidatePath(`/teams/${teamId}`);
  return { ok: true, message: "Member removed." };
}

/** Form action (owner only, checked in lib/invitations): invite an e-mail address with a role. */
export async function inviteMemberAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const actor = await requireUser();
  const teamId = String(formData.get("teamId") ?? "");
  const values = formValues(formData, ["email", "role"]);
  const parsed = invitationCreateSchema.safeParse({
    email: formData.get("email"),
    role: formData.get("role"),
  });
  if (!parsed.success) return { ok: false, errors: issuesToFields(parsed.error.issues), values };
  try {
    await createInvitation(actor, teamId, parsed.data);
  } catch (err) {
    return { ...failureState(err, "inviteMember"), values };
  }
  revalidatePath(`/teams/${teamId}`);
  return { ok: true, message: `Invitation sent to ${parsed.data.email}.` };
}

/** Form action (owner only, checked in lib/invitations): withdraw or send again a pending invitation. */
export async function invitationAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const actor = await requireUser();
  const parsed = invitationRefSchema.safeParse(Object.fromEntries(formData));
  const intent = formData.get("intent");
  if (!parsed.success || (intent !== "revoke" && intent !== "resend"))
    return { ok: false, message: "That invitation is not valid." };
  const { teamId, invitationId } = parsed.data;
  try {
    if (intent === "revoke") await revokeInvitation(actor, teamId, invitationId);
    else await resendInvitation(actor, teamId, invitationId);
  } catch (err) {
    return failureState(err, intent === "revoke" ? "revokeInvitation" : "resendInvitation");
  }
  revalidatePath(`/teams/${teamId}`);
  return {
    ok: true,
    message: intent === "revoke" ? "Invitation withdrawn." : "Invitation sent again with a new link.",
  };
}
