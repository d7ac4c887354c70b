import type { Metadata } from "next";
import Link from "next/link";
import { ResetPasswordForm } from "@/components/auth/reset-forms";
import { resetTokenEmail } from "@/lib/password-reset";

export const metadata: Metadata = { title: "Choose a new password" };
export const dynamic = "force-dynamic";

/** Opened from the reset e-mail: a form for the new password while the link is valid. */
export default async function ResetPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const email = await resetTokenEmail(token);
  if (!email) {
    return (
      <>
        <h1 className="text-ink-950 text-title font-semibold">This reset link is not valid</h1>
        <p className="text-ink-600 mt-2 text-sm">
          It was used already, replaced by a newer one, or is more than an hour old.{" "}
          <Link href="/forgot" className="text-board-700 font-medium underline">
            Ask for a new link
          </Link>
          .
        </p>
      </>
    );
  }
  return (
    <>
      <h1 className="text-ink-950 text-title font-semibold">Choose a new password</h1>
      <p className="text-ink-600 mt-1 mb-6 text-sm">
        For {email}. Every other session of this account is signed out.
      </p>
      <ResetPasswordForm token={token} />
    </>
  );
}
