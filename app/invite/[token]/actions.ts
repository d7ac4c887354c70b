"use server";

import { redirect } from "next/navigation";
import { AppError } from "@/lib/errors";
import { acceptInvitation } from "@/lib/invitations";
import { requireUser } from "@/lib/session";
import { resendVerification } from "@/lib/verification";

export type AcceptState = { message: string | null };

/** Accepts the invitation for the signed-in user, then opens their projects. */
export async function acceptInvitationAction(token: string, _prev: AcceptState): Promise<AcceptState> {
  const actor = await requireUser();
  try {
    await acceptInvitation(actor, token);
  } catch (err) {
    if (err instanceof AppError && err.status < 500) return { message: err.message };
    return { message: "The invitation could not be accepted just now. Try again in a moment." };
  }
  redirect("/projects");
}

/** Sends a new e-mail verification link to the signed-in user. */
export async function resendVerificationAction(_prev: AcceptState): Promise<AcceptState> {
  const actor = await requireUser();
  try {
    const sent = await resendVerification(actor.userId);
    return {
      message: sent ? `A new link is on its way to ${actor.email}.` : "Your address is already confirmed.",
    };
  } catch (err) {
    if (err instanceof AppError && err.status < 500) return { message: err.message };
    return { message: "The link could not be sent just now. Try again in a moment." };
  }
}
