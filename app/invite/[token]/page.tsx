import type { Metadata } from "next";
import Link from "next/link";
import { ResendVerification } from "@/components/auth/resend-verification";
import { buttonClass } from "@/components/ui/button-class";
import { Notice } from "@/components/ui/notice";
import { Panel } from "@/components/ui/panel";
import { previewInvitation } from "@/lib/invitations";
import { getActor } from "@/lib/session";
import { formatDate } from "@/lib/utils";
import { isEmailVerified } from "@/lib/verification";
import { AcceptForm } from "./accept-form";

export const metadata: Metadata = { title: "Invitation" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const [invitation, actor] = await Promise.all([previewInvitation(token), getActor()]);
  const verified = actor ? await isEmailVerified(actor.userId) : false;
  const back = encodeURIComponent(`/invite/${token}`);
  return (
    <div className="mx-auto max-w-lg px-4 py-16 sm:px-6">
      <Panel className="p-6 sm:p-8">
        {!invitation ? (
          <>
            <h1 className="text-ink-950 text-title font-semibold">This invitation link is not valid</h1>
            <p className="text-ink-600 mt-2">
              Check that the whole link was copied, or ask the team owner for a new one.
            </p>
          </>
        ) : (
          <>
            <p className="text-caption text-copper-600 font-mono tracking-widest uppercase">
              Team invitation
            </p>
            <h1 className="text-ink-950 text-title mt-2 font-semibold">Join {invitation.teamName}</h1>
            <p className="text-ink-600 mt-2">
              {invitation.inviterName} invited{" "}
              <span className="text-ink-800 font-medium">{invitation.email}</span> as{" "}
              <span className="text-ink-800 font-medium">{invitation.role}</span>.
            </p>
            <div className="mt-6">
              {invitation.state === "accepted" ? (
                <Notice tone="info">This invitation was already used.</Notice>
              ) : invitation.state === "expired" ? (
                <Notice tone="warn">
                  This invitation expired on {formatDate(invitation.expiresAt)}. Ask for a new one.
                </Notice>
              ) : !actor ? (
                <div className="space-y-3">
                  <p className="text-ink-600 text-sm">
                    Sign in or create an account with {invitation.email} to accept.
                  </p>
                  <div className="flex flex-wrap gap-3">
                    <Link href={`/signin?callbackUrl=${back}`} className={buttonClass()}>
                      Sign in
                    </Link>
                    <Link
                      href={`/signup?callbackUrl=${back}`}
                      className={buttonClass({ variant: "secondary" })}
                    >
                      Create an account
                    </Link>
                  </div>
                </div>
              ) : actor.email.toLowerCase() !== invitation.email ? (
                <Notice tone="warn">
                  You are signed in as {actor.email}; this invitation is for {invitation.email}. Sign out and
                  sign in with that address.
                </Notice>
              ) : !verified ? (
                <ResendVerification
                  email={actor.email}
                  why="Confirm {email} before joining: open the link in the e-mail we sent when you created your account."
                />
              ) : (
                <AcceptForm token={token} teamName={invitation.teamName} />
              )}
            </div>
            {invitation.state === "pending" ? (
              <p className="text-caption text-ink-500 mt-6">
                The link works until {formatDate(invitation.expiresAt)}.
              </p>
            ) : null}
          </>
        )}
      </Panel>
    </div>
  );
}
