"use client";

import Link from "next/link";
import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { requestResetAction, resetPasswordAction } from "@/lib/actions/auth";
import { initialFormState } from "@/lib/actions/state";
import { PASSWORD_MIN } from "@/lib/validations/auth";

/** "Forgot your password?": an address; the answer never says whether it has an account. */
export function ResetRequestForm() {
  const [state, action, pending] = useActionState(requestResetAction, initialFormState);
  return (
    <form action={action} noValidate className="space-y-4">
      <Field
        label="E-mail"
        name="email"
        type="email"
        autoComplete="email"
        required
        errors={state.errors?.email}
      />
      <div aria-live="polite">
        {state.message ? <Notice tone={state.ok ? "ok" : "warn"}>{state.message}</Notice> : null}
      </div>
      <Button type="submit" size="lg" className="w-full" disabled={pending}>
        {pending ? "Sending…" : "Send me a reset link"}
      </Button>
      <p className="text-ink-600 text-center text-sm">
        Remembered it?{" "}
        <Link href="/signin" className="text-board-700 font-medium underline">
          Sign in
        </Link>
      </p>
    </form>
  );
}

/** The new password, typed twice, for a valid reset link. */
export function ResetPasswordForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState(resetPasswordAction, initialFormState);
  if (state.ok) {
    return (
      <div className="space-y-4">
        <Notice tone="ok">{state.message}</Notice>
        <Link href="/signin" className="text-board-700 font-medium underline">
          Sign in
        </Link>
      </div>
    );
  }
  return (
    <form action={action} noValidate className="space-y-4">
      <input type="hidden" name="token" value={token} />
      <Field
        label="New password"
        name="password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        required
        errors={state.errors?.password}
      />
      <Field
        label="New password again"
        name="confirm"
        type="password"
        autoComplete="new-password"
        required
        errors={state.errors?.confirm}
      />
      <div aria-live="polite">{state.message ? <Notice tone="fault">{state.message}</Notice> : null}</div>
      <Button type="submit" size="lg" className="w-full" disabled={pending}>
        {pending ? "Saving…" : "Set the new password"}
      </Button>
    </form>
  );
}
