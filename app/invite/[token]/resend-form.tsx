"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { type AcceptState, resendVerificationAction } from "./actions";

/** Shown to a signed-in invitee whose address is not confirmed yet: explains why, and resends the link. */
export function ResendForm({ email }: { email: string }) {
  const [state, action, pending] = useActionState<AcceptState>(resendVerificationAction, { message: null });
  return (
    <form action={action} className="space-y-3">
      <Notice tone="warn">
        Confirm {email} before joining: open the link in the e-mail we sent when you created your account.
      </Notice>
      <Button type="submit" variant="secondary" disabled={pending}>
        {pending ? "Sending…" : "Send the link again"}
      </Button>
      <div aria-live="polite">{state.message ? <Notice tone="info">{state.message}</Notice> : null}</div>
    </form>
  );
}
