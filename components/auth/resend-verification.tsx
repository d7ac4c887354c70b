"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { type ResendState, resendVerificationAction } from "@/lib/actions/settings";

/**
 * Shown to a signed-in user whose address is not confirmed yet (an invitation, Settings): says why it
 * matters there, and sends the link again.
 */
export function ResendVerification({ email, why }: { email: string; why: string }) {
  const [state, action, pending] = useActionState<ResendState>(resendVerificationAction, { message: null });
  return (
    <form action={action} className="space-y-3">
      <Notice tone="warn">{why.replace("{email}", email)}</Notice>
      <Button type="submit" variant="secondary" disabled={pending}>
        {pending ? "Sending…" : "Send the link again"}
      </Button>
      <div aria-live="polite">{state.message ? <Notice tone="info">{state.message}</Notice> : null}</div>
    </form>
  );
}
