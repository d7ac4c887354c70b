"use server";

import { redirect } from "next/navigation";
import { AppError } from "@/lib/errors";
import { acceptInvitation } from "@/lib/invitations";
import { requireUser } from "@/lib/session";

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
