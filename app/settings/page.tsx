import type { Metadata } from "next";
import Link from "next/link";
import { ProfileForm } from "@/components/auth/profile-form";
import { SignOutEverywhere } from "@/components/auth/sign-out-everywhere";
import { TokenCreateForm } from "@/components/auth/token-create-form";
import { TokenList } from "@/components/auth/token-list";
import { PageHeading, Panel, PanelHeader } from "@/components/ui/panel";
import { getUserProfile, requireUser } from "@/lib/session";
import { listApiTokens } from "@/lib/tokens";

export const metadata: Metadata = { title: "Settings" };

export default async function SettingsPage() {
  const actor = await requireUser();
  const [profile, tokens] = await Promise.all([getUserProfile(actor.userId), listApiTokens(actor.userId)]);
  return (
    <div className="mx-auto max-w-3xl space-y-8 px-4 py-10 sm:px-6">
      <PageHeading title="Settings" lead="Your profile and the tokens your scripts use to call the API." />
      <Panel aria-labelledby="profile-heading">
        <PanelHeader id="profile-heading" title="Profile" />
        <div className="p-5">
          <ProfileForm name={profile?.name ?? actor.name} email={profile?.email ?? actor.email} />
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
