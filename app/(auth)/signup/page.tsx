import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { SignUpForm } from "@/components/auth/sign-up-form";
import { env } from "@/lib/env";
import { safeCallback } from "@/lib/safe-callback";
import { getActor } from "@/lib/session";

export const metadata: Metadata = { title: "Create account" };

export default async function SignUpPage({
  searchParams,
}: {
  searchParams: Promise<{ callbackUrl?: string }>;
}) {
  const { callbackUrl } = await searchParams;
  const target = safeCallback(callbackUrl, { origin: env.NEXTAUTH_URL });
  if (await getActor()) redirect(target);
  return (
    <>
      <h1 className="text-ink-950 text-title font-semibold">Create your account</h1>
      <p className="text-ink-600 mt-1 mb-6 text-sm">
        You get a workbench team of your own; teammates can invite you to theirs.
      </p>
      <SignUpForm callbackUrl={target} />
    </>
  );
}
