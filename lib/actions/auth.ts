"use server";

import { headers } from "next/headers";
import { type FormState, failureState } from "@/lib/actions/state";
import { registerUser } from "@/lib/auth";
import { requestPasswordReset, resetPassword } from "@/lib/password-reset";
import { clientAddress, forgetAccountFailures, resetLimiter, signUpLimiter } from "@/lib/rate-limit";
import { issuesToFields } from "@/lib/utils";
import { resetPasswordSchema, resetRequestSchema, signUpSchema } from "@/lib/validations/auth";

/** Creates the account and a personal team the new user owns. The client signs in afterwards. */
export async function signUp(input: { name: string; email: string; password: string }): Promise<FormState> {
  const parsed = signUpSchema.safeParse(input);
  if (!parsed.success) {
    return {
      ok: false,
      errors: issuesToFields(parsed.error.issues),
      message: "Check the highlighted fields.",
    };
  }
  if (!signUpLimiter.hit(clientAddress(await headers())).ok) {
    return {
      ok: false,
      message: "Too many new accounts from this address. Wait a few minutes and try again.",
    };
  }
  try {
    await registerUser(parsed.data);
    return { ok: true };
  } catch (err) {
    return failureState(err, "signUp");
  }
}

/** "Forgot your password?": the same answer whether or not the address has an account. */
export async function requestResetAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const parsed = resetRequestSchema.safeParse({ email: formData.get("email") });
  if (!parsed.success) return { ok: false, errors: issuesToFields(parsed.error.issues) };
  if (!resetLimiter.hit(clientAddress(await headers())).ok) {
    return {
      ok: false,
      message: "Too many reset requests from this address. Wait a few minutes and try again.",
    };
  }
  try {
    await requestPasswordReset(parsed.data.email);
  } catch (err) {
    return failureState(err, "requestReset");
  }
  return {
    ok: true,
    message: `If ${parsed.data.email} has an account, a link to choose a new password is on its way. It works for one hour.`,
  };
}

/** Sets the new password from a reset link; the account's failed sign-ins are forgotten. */
export async function resetPasswordAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const parsed = resetPasswordSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return { ok: false, errors: issuesToFields(parsed.error.issues) };
  try {
    const done = await resetPassword(parsed.data.token, parsed.data.password);
    if (!done) {
      return {
        ok: false,
        message:
          "This reset link is not valid any more (used, replaced or over an hour old). Ask for a new one.",
      };
    }
    forgetAccountFailures(done.email);
    return {
      ok: true,
      message: `New password set for ${done.email}. Sign in with it; other sessions were signed out.`,
    };
  } catch (err) {
    return failureState(err, "resetPassword");
  }
}
