import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button-class";
import { Panel } from "@/components/ui/panel";
import { verifyEmail } from "@/lib/verification";

export const metadata: Metadata = { title: "Confirm your e-mail" };
export const dynamic = "force-dynamic";

/** Opened from the sign-up e-mail: the token (single use) marks the address as verified. */
export default async function VerifyPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const verified = await verifyEmail(token);
  return (
    <div className="mx-auto max-w-lg px-4 py-16 sm:px-6">
      <Panel className="p-6 sm:p-8">
        {verified ? (
          <>
            <h1 className="text-ink-950 text-title font-semibold">Address confirmed</h1>
            <p className="text-ink-600 mt-2">
              {verified.email} is confirmed. Invitations sent to it can now be accepted.
            </p>
            <Link href="/projects" className={buttonClass({ className: "mt-6" })}>
              Open your projects
            </Link>
          </>
        ) : (
          <>
            <h1 className="text-ink-950 text-title font-semibold">This confirmation link is not valid</h1>
            <p className="text-ink-600 mt-2">
              It was used already, replaced by a newer one, or is more than two days old. Sign in and ask for
              a new link from an invitation page.
            </p>
          </>
        )}
      </Panel>
    </div>
  );
}
