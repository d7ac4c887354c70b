import type { Metadata } from "next";
import Link from "next/link";
import { ProfileForm } from "@/components/auth/profile-form";
import { ResendVerification } from "@/components/auth/resend-verification";
import { SignOutEverywhere } from "@/components/auth/sign-out-everywhere";
import { TokenCreateForm } from "@/components/auth/token-create-form";
import { TokenList } from "@/components/auth/token-list";
import { PageHeading, Panel, PanelHeader } from "@/components/ui/panel";
import { getUserProfile, requireUser } from "@/lib/session";
import { listApiTokens } from "@/lib/tokens";
import { isEmailVerified } from "@/lib/verification";

export const metadata: Metadata = { title: "Settings" };

export default async function SettingsPage() {
  const actor = await requireUser();
  const [profile, tokens, verified] = await Promise.all([
    getUserProfile(actor.userId),
    listApiTokens(actor.userId),
    isEmailVerified(actor.userId),
  ]);
  const email = profile?.email ?? actor.email;
  return (
    <div className="mx-auto max-w-3xl space-y-8 px-4 py-10 sm:px-6">
      <PageHeading title="Settings" lead="Your profile and the tokens your scripts use to call the API." />
      <Panel aria-labelledby="profile-heading">
        <PanelHeader id="profile-heading" title="Profile" />
        <div className="space-y-5 p-5">
          <ProfileForm name={profile?.name ?? actor.name} email={email} />
          {verified ? (
            <p className="text-ink-600 text-sm" data-testid="email-state">
              <span className="text-signal-ok font-medium">Address confirmed.</span> Invitations to {email}{" "}
              can be accepted.
            </p>
          ) : (
            <div data-testid="email-state">
              <ResendVerification
                email={email}
                why="{email} is not confirmed yet: open the link in the e-mail we sent when you created your account. Until then you cannot join a team by invitation."
              />
            </div>
          )}
        </div>
      </Panel>
      <Panel aria-labelledby="sessions-heading">
        <PanelHeader id="sessions-heading" title="Sessions" />
        <div className="p-5">
          <SignOutEverywhere />
        </div>
      </Panel>
      <Panel aria-labelledby="tokens-heading">
        <PanelHeader
          id="tokens-heading"
          title="API tokens"
          description="A token acts as you in every team you belong to. Only its first characters are kept visible."
          action={
            <Link href="/settings/api" className="text-board-700 text-sm font-medium underline">
              API description and examples
            </Link>
          }
        />
        <div className="space-y-6 p-5">
          <TokenCreateForm />
          <TokenList tokens={tokens} />
        </div>
      </Panel>
    </div>
  );
}
