"use client";

import { useRouter } from "next/navigation";
import { useActionState, useEffect } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";
import { signOutEverywhereAction } from "@/lib/actions/settings";
import { initialFormState } from "@/lib/actions/state";

/** Ends every session of the user (other browsers and this one) through the server-side session version. */
export function SignOutEverywhere() {
  const [state, action, pending] = useActionState(signOutEverywhereAction, initialFormState);
  const router = useRouter();
  useEffect(() => {
    if (state.ok) router.push("/signin");
  }, [state.ok, router]);
  return (
    <form action={action} className="space-y-3">
      <p className="text-ink-600 text-sm">
        Signs you out on every device and browser, this one included, for example after using a shared
        computer. API tokens keep working; revoke them below.
      </p>
      <Button type="submit" variant="secondary" disabled={pending}>
        {pending ? "Signing out…" : "Sign out everywhere"}
      </Button>
      <div aria-live="polite">
        {state.message ? <Notice tone={state.ok ? "ok" : "fault"}>{state.message}</Notice> : null}
      </div>
    </form>
  );
}
