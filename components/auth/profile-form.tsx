"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { updateProfileAction } from "@/lib/actions/settings";
import { initialFormState } from "@/lib/actions/state";

export function ProfileForm({ name, email }: { name: string; email: string }) {
  const [state, action, pending] = useActionState(updateProfileAction, initialFormState);
  return (
    <form action={action} noValidate className="space-y-4">
      <Field
        label="Name"
        name="name"
        defaultValue={state.values?.name ?? name}
        required
        maxLength={80}
        errors={state.errors?.name}
      />
      <div className="space-y-1.5">
        <p className="text-ink-800 text-sm font-medium">E-mail</p>
        <p className="text-ink-600 font-mono text-sm">{email}</p>
      </div>
      <div aria-live="polite">
        {state.message ? <Notice tone={state.ok ? "ok" : "fault"}>{state.message}</Notice> : null}
      </div>
      <Button type="submit" disabled={pending}>
        {pending ? "Saving…" : "Save name"}
      </Button>
    </form>
  );
}
