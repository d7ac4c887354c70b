import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { InvitationControls } from "@/components/team/invitation-controls";
import { InviteForm } from "@/components/team/invite-form";
import { MemberList } from "@/components/team/member-list";
import { PageHeading, Panel, PanelHeader } from "@/components/ui/panel";
import { RoleBadge } from "@/components/ui/role-badge";
import { can, isUuid } from "@/lib/authz";
import { NotFoundError } from "@/lib/errors";
import { listInvitations } from "@/lib/invitations";
import { teamPageMetadata } from "@/lib/page-titles";
import { isRole, ROLE_DUTIES, ROLES } from "@/lib/roles";
import { requireUser } from "@/lib/session";
import { getTeamForMember } from "@/lib/teams";
import { formatDate } from "@/lib/utils";

export function generateMetadata({ params }: { params: Promise<{ teamId: string }> }): Promise<Metadata> {
  return params.then(({ teamId }) => teamPageMetadata(teamId));
}

export default async function TeamPage({ params }: { params: Promise<{ teamId: string }> }) {
  const { teamId } = await params;
  const actor = await requireUser();
  if (!isUuid(teamId)) notFound();
  const data = await getTeamForMember(actor.userId, teamId).catch((err: unknown) => {
    if (err instanceof NotFoundError) notFound();
    throw err;
  });
  const manage = can(data.role, "team:manage");
  const invitations = manage ? await listInvitations(actor, teamId) : [];
  return (
    <div className="mx-auto max-w-4xl px-4 py-10 sm:px-6">
      <PageHeading
        title={data.team.name}
        lead={
          manage
            ? "You own this team: set roles and remove members here."
            : "Who is in this team and what each may do."
        }
        action={<RoleBadge role={data.role} />}
      />
      <Panel aria-labelledby="members-heading">
        <PanelHeader
          id="members-heading"
          title="Members"
          description={`${data.members.length} member${data.members.length === 1 ? "" : "s"}`}
        />
        <MemberList teamId={data.team.id} members={data.members} manage={manage} selfId={actor.userId} />
      </Panel>
      {manage ? (
        <Panel aria-labelledby="invite-heading" className="mt-8">
          <PanelHeader
            id="invite-heading"
            title="Invite someone"
            description="They get an e-mail with a link that works for seven days."
          />
          <div className="space-y-4 p-5">
            <InviteForm teamId={data.team.id} />
            {invitations.length > 0 ? (
              <div>
                <h3 className="text-ink-800 mb-2 text-sm font-semibold">Waiting for an answer</h3>
                <ul className="divide-paper-200 border-paper-200 divide-y rounded-md border">
                  {invitations.map((i) => (
                    <li key={i.id} className="flex flex-wrap items-center gap-2 px-4 py-2.5 text-sm">
                      <span className="text-ink-800 min-w-0 flex-1 truncate">{i.email}</span>
                      {isRole(i.role) ? <RoleBadge role={i.role} /> : null}
                      <span className="text-caption text-ink-600">until {formatDate(i.expiresAt)}</span>
                      <InvitationControls teamId={data.team.id} invitationId={i.id} email={i.email} />
                    </li>
                  ))}
                </ul>
              </div>
            ) : null}
          </div>
        </Panel>
      ) : null}
      <dl className="mt-8 grid gap-3 text-sm sm:grid-cols-2">
        {ROLES.map((role) => (
          <div key={role} className="border-paper-200 rounded-md border bg-white p-3">
            <dt>
              <RoleBadge role={role} />
            </dt>
            <dd className="text-ink-600 mt-1">{ROLE_DUTIES[role]}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
