"use server";

import { revalidatePath } from "next/cache";
import { headers } from "next/headers";
import { type FormState, failureState, formValues, issuesToFields } from "@/lib/actions/state";
import { User } from "@/lib/db";
import { AppError, withDb } from "@/lib/errors";
import { requireUser } from "@/lib/session";
import { bumpSessionVersion } from "@/lib/session-version";
import { createApiToken, revokeApiToken } from "@/lib/tokens";
import { profileUpdateSchema } from "@/lib/validations/auth";
import { tokenCreateSchema } from "@/lib/validations/project";
import { resendVerification } from "@/lib/verification";

/** Form action: rename the signed-in user. */
export async function updateProfileAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const actor = await requireUser();
  const values = formValues(formData, ["name"]);
  const parsed = profileUpdateSchema.safeParse({ name: formData.get("name") });
  if (!parsed.success) return { ok: false, errors: issuesToFields(parsed.error.issues), values };
  try {
    await withDb(() => User.update({ name: parsed.data.name }, { where: { id: actor.userId } }));
  } catch (err) {
    return { ...failureState(err, "updateProfile"), values };
  }
  revalidatePath("/", "layout");
  return { ok: true, message: "Name saved." };
}

/** Form action: create an API token; its secret is returned once in `secret`. */
export async function createTokenAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const actor = await requireUser();
  const values = formValues(formData, ["name"]);
  if (/^Bearer\s/i.test((await headers()).get("authorization") ?? "")) {
    return { ok: false, message: "API tokens cannot create tokens. Sign in to create one.", values };
  }
  const parsed = tokenCreateSchema.safeParse({ name: formData.get("name") });
  if (!parsed.success) return { ok: false, errors: issuesToFields(parsed.error.issues), values };
  let secret: string;
  try {
    secret = (await createApiToken(actor.userId, parsed.data.name)).token;
  } catch (err) {
    return { ...failureState(err, "createToken"), values };
  }
  revalidatePath("/settings");
  return { ok: true, message: "Token created. Copy it now: it will not be shown again.", secret };
}

/** Form action: revoke one of the caller's own tokens. */
export async function revokeTokenAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const actor = await requireUser();
  try {
    await revokeApiToken(actor.userId, String(formData.get("tokenId") ?? ""));
  } catch (err) {
    return failureState(err, "revokeToken");
  }
  revalidatePath("/settings");
  return { ok: true, message: "Token revoked." };
}

/** Form action: end every session of the signed-in user, this one included (the client then signs out). */
export async function signOutEverywhereAction(_prev: FormState): Promise<FormState> {
  const actor = await requireUser();
  try {
    await withDb(() => bumpSessionVersion(actor.userId));
  } catch (err) {
    return failureState(err, "signOutEverywhere");
  }
  return { ok: true, message: "Every session has ended. Sign in again to continue." };
}

export type ResendState = { message: string | null };

/** Sends a new e-mail verification link to the signed-in user. */
export async function resendVerificationAction(_prev: ResendState): Promise<ResendState> {
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
