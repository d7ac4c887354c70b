import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { env } from "@/lib/env";
import { safeCallback } from "@/lib/safe-callback";
import { getActor } from "@/lib/session";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<{ callbackUrl?: string; error?: string }>;
}) {
  const { callbackUrl, error } = await searchParams;
  const target = safeCallback(callbackUrl, { origin: env.NEXTAUTH_URL });
  if (await getActor()) redirect(target);
  return (
    <>
      <h1 className="text-ink-950 text-title font-semibold">Sign in</h1>
      <p className="text-ink-600 mt-1 mb-6 text-sm">
        Welcome back. Your team's runs are where you left them.
      </p>
      <SignInForm callbackUrl={target} initialError={error} />
    </>
  );
}
