import { RoleBadge } from "@/components/ui/role-badge";
import type { TeamMember } from "@/lib/teams";
import { formatDate } from "@/lib/utils";
import { MemberControls } from "./member-controls";

/** Members of a team; owners get role and removal controls, everyone else a read-only list. */
export function MemberList({
  teamId,
  members,
  manage,
  selfId,
}: {
  teamId: string;
  members: TeamMember[];
  manage: boolean;
  selfId: string;
}) {
  const owners = members.filter((m) => m.role === "owner").length;
  return (
    <ul className="divide-paper-200 divide-y">
      {members.map((m) => (
        <li key={m.membershipId} className="flex flex-col gap-3 px-5 py-4 sm:flex-row sm:items-center">
          <div className="min-w-0 flex-1">
            <p className="text-ink-900 truncate font-medium">
              {m.name}
              {m.userId === selfId ? (
                <span className="text-ink-500 ml-2 text-sm font-normal">(you)</span>
              ) : null}
            </p>
            <p className="text-ink-500 truncate text-sm">
              {m.email} · joined {formatDate(m.joinedAt)}
            </p>
          </div>
          {manage ? (
            <MemberControls
              teamId={teamId}
              membershipId={m.membershipId}
              memberName={m.name || m.email}
              role={m.role}
              soleOwner={m.role === "owner" && owners <= 1}
            />
          ) : (
            <RoleBadge role={m.role} className="self-start sm:self-auto" />
          )}
        </li>
      ))}
    </ul>
  );
}
