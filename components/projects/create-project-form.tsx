"use client";

import { useActionState, useEffect, useRef } from "react";
import { Button } from "@/components/ui/button";
import { Field, FieldErrors, inputClass } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { createProjectAction } from "@/lib/actions/projects";
import { initialFormState } from "@/lib/actions/state";

export function CreateProjectForm({ teamId, teamName }: { teamId: string; teamName: string }) {
  const [state, action, pending] = useActionState(createProjectAction, initialFormState);
  const form = useRef<HTMLFormElement>(null);
  const prefix = `new-project-${teamId.slice(0, 8)}`;

  useEffect(() => {
    if (state.ok) form.current?.reset();
  }, [state]);

  return (
    <form
      ref={form}
      action={action}
      noValidate
      className="space-y-4"
      aria-label={`New project in ${teamName}`}
    >
      <input type="hidden" name="teamId" value={teamId} />
      <Field
        id={`${prefix}-name`}
        label="Project name"
        name="name"
        required
        maxLength={120}
        placeholder="e.g. Bridge oscillator, rev B"
        defaultValue={state.values?.name}
        errors={state.errors?.name}
      />
      <div className="space-y-1.5">
        <label htmlFor={`${prefix}-description`} className="text-ink-800 block text-sm font-medium">
          Description <span className="text-ink-500 font-normal">(optional)</span>
        </label>
        <textarea
          id={`${prefix}-description`}
          name="description"
          rows={2}
          maxLength={2000}
          defaultValue={state.values?.description}
          aria-describedby={`${prefix}-description-error`}
          className={inputClass}
        />
        <FieldErrors id={`${prefix}-description-error`} errors={state.errors?.description} />
      </div>
      <FieldErrors id={`${prefix}-team-error`} errors={state.errors?.teamId} />
      <div aria-live="polite">
        {state.message ? <Notice tone={state.ok ? "ok" : "fault"}>{state.message}</Notice> : null}
      </div>
      <Button type="submit" disabled={pending}>
        {pending ? "Creating…" : "Create project"}
      </Button>
    </form>
  );
}
