"use client";

import { useActionState, useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";
import { Field, FieldErrors } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { initialFormState } from "@/lib/actions/state";
import { inviteMemberAction } from "@/lib/actions/team";
import { DEFAULT_INVITE_ROLE, ROLE_LABELS, ROLES } from "@/lib/roles";

/** Owner's form: invite someone by e-mail with a role; the link goes out by e-mail. */
export function InviteForm({ teamId }: { teamId: string }) {
  const [state, action, pending] = useActionState(inviteMemberAction, initialFormState);
  const form = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (state.ok) form.current?.reset();
  }, [state]);
  return (
    <form ref={form} action={action} noValidate className="space-y-3">
      <input type="hidden" name="teamId" value={teamId} />
      <div className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <Field
          label="E-mail"
          name="email"
          id="invite-email"
          type="email"
          autoComplete="off"
          defaultValue={state.values?.email}
          required
          className="flex-1"
          errors={state.errors?.email}
        />
        <div className="space-y-1.5">
          <label htmlFor="invite-role" className="text-ink-800 block text-sm font-medium">
            Role
          </label>
          <select
            id="invite-role"
            name="role"
            defaultValue={state.values?.role ?? DEFAULT_INVITE_ROLE}
            aria-describedby="invite-role-error"
            className="border-paper-300 block h-[2.625rem] rounded-md border bg-white px-2 text-sm"
          >
            {ROLES.map((role) => (
              <option key={role} value={role}>
                {ROLE_LABELS[role]}
              </option>
            ))}
          </select>
          <FieldErrors id="invite-role-error" errors={state.errors?.role} />
        </div>
        <Button type="submit" disabled={pending} className="sm:mt-7">
          {pending ? "Sending…" : "Send invitation"}
        </Button>
      </div>
      <div aria-live="polite">
        {state.message ? <Notice tone={state.ok ? "ok" : "fault"}>{state.message}</Notice> : null}
      </div>
    </form>
  );
}
