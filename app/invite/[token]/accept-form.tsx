"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { type AcceptState, acceptInvitationAction } from "./actions";

export function AcceptForm({ token, teamName }: { token: string; teamName: string }) {
  const [state, action, pending] = useActionState<AcceptState>(acceptInvitationAction.bind(null, token), {
    message: null,
  });
  return (
    <form action={action} className="space-y-3">
      <Button type="submit" size="lg" disabled={pending}>
        {pending ? "Joining…" : `Join ${teamName}`}
      </Button>
      <div aria-live="polite">{state.message ? <Notice tone="fault">{state.message}</Notice> : null}</div>
    </form>
  );
}
