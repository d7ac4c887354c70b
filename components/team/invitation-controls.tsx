"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialFormState } from "@/lib/actions/state";
import { invitationAction } from "@/lib/actions/team";

/** The owner's controls on a pending invitation: send it again (new link) or withdraw it. */
export function InvitationControls({
  teamId,
  invitationId,
  email,
}: {
  teamId: string;
  invitationId: string;
  email: string;
}) {
  const [state, action, pending] = useActionState(invitationAction, initialFormState);
  return (
    <form action={action} className="flex flex-wrap items-center gap-2">
      <input type="hidden" name="teamId" value={teamId} />
      <input type="hidden" name="invitationId" value={invitationId} />
      <Button
        type="submit"
        name="intent"
        value="resend"
        variant="secondary"
        size="sm"
        disabled={pending}
        aria-label={`Send the invitation to ${email} again`}
      >
        Send again
      </Button>
      <Button
        type="submit"
        name="intent"
        value="revoke"
        variant="danger"
        size="sm"
        disabled={pending}
        aria-label={`Withdraw the invitation to ${email}`}
      >
        Withdraw
      </Button>
      <span
        role="status"
        aria-live="polite"
        className={state.ok ? "text-ink-600 text-caption" : "text-signal-fault text-caption"}
      >
        {state.message ?? ""}
      </span>
    </form>
  );
}
