"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { type FormEvent, useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { useHydrated } from "@/components/ui/use-hydrated";
import { issuesToFields } from "@/lib/utils";
import { signInSchema } from "@/lib/validations/auth";

type Errors = Record<string, string[]>;

const WRONG = "E-mail or password is wrong.";
const LIMITED = "Too many sign-in attempts. Wait a minute, then try again.";

export function SignInForm({ callbackUrl, initialError }: { callbackUrl: string; initialError?: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string | null>(
    initialError === "rate_limited" ? LIMITED : initialError ? WRONG : null,
  );
  const [pending, startTransition] = useTransition();
  // Marks the form as interactive (browser checks wait for it before submitting).
  const hydrated = useHydrated();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    const parsed = signInSchema.safeParse({ email: data.get("email"), password: data.get("password") });
    if (!parsed.success) {
      setErrors(issuesToFields(parsed.error.issues));
      setMessage(null);
      return;
    }
    setErrors({});
    setMessage(null);
    startTransition(async () => {
      const res = await signIn("credentials", { ...parsed.data, redirect: false, callbackUrl });
      if (!res || res.status === 429 || res.error === "rate_limited") {
        setMessage(res?.status === 429 ? LIMITED : "Could not reach the server. Try again.");
        return;
      }
      if (res.error) {
        setMessage(WRONG);
        return;
      }
      router.push(callbackUrl);
      router.refresh();
    });
  }

  return (
    <form
      data-hydrated={hydrated || undefined}
      method="post"
      onSubmit={onSubmit}
      noValidate
      className="space-y-5"
      aria-describedby="signin-status"
    >
      <Field
        label="E-mail"
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
        autoComplete="current-password"
        required
        errors={errors.password}
      />
      <div id="signin-status" aria-live="assertive">
        {message ? <Notice tone={message === LIMITED ? "warn" : "fault"}>{message}</Notice> : null}
      </div>
      <Button type="submit" size="lg" className="w-full" disabled={pending}>
        {pending ? "Signing in…" : "Sign in"}
      </Button>
      <p className="text-ink-600 text-center text-sm">
        <Link href="/forgot" className="text-board-700 font-medium underline">
          Forgot your password?
        </Link>
      </p>
      <p className="text-ink-600 text-center text-sm">
        New here?{" "}
        <Link
          href={`/signup?callbackUrl=${encodeURIComponent(callbackUrl)}`}
          className="text-board-700 font-medium underline"
        >
          Create an account
        </Link>
      </p>
    </form>
  );
}
