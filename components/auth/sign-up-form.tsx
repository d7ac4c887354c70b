"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { type FormEvent, useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { buttonClass } from "@/components/ui/button-class";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { useHydrated } from "@/components/ui/use-hydrated";
import { signUp } from "@/lib/actions/auth";
import type { FormState } from "@/lib/actions/state";
import { issuesToFields } from "@/lib/utils";
import { PASSWORD_MIN, signUpSchema } from "@/lib/validations/auth";

type Errors = NonNullable<FormState["errors"]>;

export function SignUpForm({ callbackUrl }: { callbackUrl: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string | null>(null);
  /** The address the verification link went to, once the account exists. */
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [pending, startTransition] = useTransition();
  // Marks the form as interactive (browser checks wait for it before submitting).
  const hydrated = useHydrated();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const input = {
      name: String(data.get("name") ?? ""),
      email: String(data.get("email") ?? ""),
      password: String(data.get("password") ?? ""),
    };
    const parsed = signUpSchema.safeParse(input);
    if (!parsed.success) {
      setErrors(issuesToFields(parsed.error.issues));
      setMessage("Check the highlighted fields.");
      return;
    }
    setErrors({});
    setMessage(null);
    startTransition(async () => {
      const result = await signUp(input);
      if (!result.ok) {
        setErrors(result.errors ?? {});
        setMessage(result.message ?? null);
        return;
      }
      const res = await signIn("credentials", {
        email: parsed.data.email,
        password: input.password,
        redirect: false,
        callbackUrl,
      });
      if (res?.error) {
        router.push("/signin");
        return;
      }
      // Signed in: say where the verification link went before moving on. No refresh here: the page
      // would send a signed-in visitor on at once, before this could be read.
      setSentTo(parsed.data.email);
    });
  }

  if (sentTo) {
    return (
      <div role="status" className="space-y-4" data-testid="signup-check-mail">
        <h2 className="text-ink-950 text-lead font-semibold">Check your mail</h2>
        <p className="text-ink-800 text-sm">
          Your account is ready. We sent a link to <strong className="break-all">{sentTo}</strong>: open it to
          confirm your address. Until then you can work in your own workbench, but you cannot send or accept
          team invitations. The link works for two days; no mail after a few minutes? Look in your spam
          folder.
        </p>
        {/* A full page load, so that the header shows the signed-in account. */}
        <a href={callbackUrl} className={buttonClass({ size: "lg", className: "w-full" })}>
          Continue to your projects
        </a>
      </div>
    );
  }

  return (
    <form
      data-hydrated={hydrated || undefined}
      method="post"
      onSubmit={onSubmit}
      noValidate
      className="space-y-5"
    >
      <Field label="Your name" name="name" autoComplete="name" required errors={errors.name} />
      <Field
        label="Work e-mail"
        name="email"
        type="email"
        autoComplete="email"
        inputMode="email"
        required
        errors={errors.email}
      />
      <Field
        label="Password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        minLength={PASSWORD_MIN}
        hint={`At least ${PASSWORD_MIN} characters. A short sentence works well.`}
        errors={errors.password}
      />
      <div aria-live="assertive">{message ? <Notice tone="fault">{message}</Notice> : null}</div>
      <Button type="submit" size="lg" className="w-full" disabled={pending}>
        {pending ? "Creating your account…" : "Create account"}
      </Button>
      <p className="text-ink-600 text-center text-sm">
        Already have an account?{" "}
        <Link
          href={`/signin?callbackUrl=${encodeURIComponent(callbackUrl)}`}
          className="text-board-700 font-medium underline"
        >
          Sign in
        </Link>
      </p>
    </form>
  );
}
