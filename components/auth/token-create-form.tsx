"use client";

import { useActionState, useEffect, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { createTokenAction } from "@/lib/actions/settings";
import { initialFormState } from "@/lib/actions/state";

/** Creates an API token and shows its secret once, with a copy button. */
export function TokenCreateForm() {
  const [state, action, pending] = useActionState(createTokenAction, initialFormState);
  const [copied, setCopied] = useState(false);
  const form = useRef<HTMLFormElement>(null);

  useEffect(() => {
    if (state.ok) form.current?.reset();
    setCopied(false);
  }, [state]);

  return (
    <div className="space-y-4">
      <form ref={form} action={action} noValidate className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <Field
          label="Token name"
          name="name"
          placeholder="e.g. nightly regression script"
          defaultValue={state.values?.name}
          maxLength={80}
          required
          className="flex-1"
          errors={state.errors?.name}
        />
        <Button type="submit" disabled={pending} className="sm:mt-7">
          {pending ? "Creating…" : "Create token"}
        </Button>
      </form>
      <div aria-live="polite">
        {state.secret ? (
          <Notice tone="ok" title={state.message}>
            <div className="mt-2 flex flex-wrap items-center gap-2">
              <code className="text-ink-900 ring-paper-300 rounded bg-white px-2 py-1 font-mono text-sm break-all ring-1">
                {state.secret}
              </code>
              <Button
                size="sm"
                variant="secondary"
                onClick={() => navigator.clipboard?.writeText(state.secret ?? "").then(() => setCopied(true))}
              >
                {copied ? "Copied" : "Copy"}
              </Button>
            </div>
            <p className="text-ink-700 mt-2">
              Send it as <code className="font-mono">Authorization: Bearer &lt;token&gt;</code>.
            </p>
          </Notice>
        ) : state.message ? (
          <Notice tone="fault">{state.message}</Notice>
        ) : null}
      </div>
    </div>
  );
}
