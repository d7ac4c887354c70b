"use server";

import { headers } from "next/headers";
import { type FormState, failureState } from "@/lib/actions/state";
import { registerUser } from "@/lib/auth";
import { clientAddress, signUpLimiter } from "@/lib/rate-limit";
import { issuesToFields } from "@/lib/utils";
import { signUpSchema } from "@/lib/validations/auth";

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
