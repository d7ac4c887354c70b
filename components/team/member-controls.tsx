"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialFormState } from "@/lib/actions/state";
import { changeRoleAction, removeMemberAction } from "@/lib/actions/team";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/roles";
import { cn } from "@/lib/utils";

const ROLE_OPTIONS = ROLES.map((value) => ({ value, label: ROLE_LABELS[value] }));

type Props = { teamId: string; membershipId: string; memberName: string; role: Role; soleOwner: boolean };

/** The owner's controls on one member row: change role, remove. Results are announced. */
export function MemberControls({ teamId, membershipId, memberName, role, soleOwner }: Props) {
  const [roleState, roleAction, rolePending] = useActionState(changeRoleAction, initialFormState);
  const [removeState, removeAction, removePending] = useActionState(removeMemberAction, initialFormState);
  const selectId = `role-${membershipId}`;
  const last = removeState.message ? removeState : roleState;
  return (
    <div className="flex flex-col items-stretch gap-2 sm:items-end">
      <div className="flex flex-wrap items-center gap-2">
        <form action={roleAction} className="flex items-center gap-2">
          <input type="hidden" name="teamId" value={teamId} />
          <input type="hidden" name="membershipId" value={membershipId} />
          <label htmlFor={selectId} className="sr-only">
            Role of {memberName}
          </label>
          <select
            id={selectId}
            name="role"
            defaultValue={role}
            className="border-paper-300 hover:border-ink-300 h-8 rounded-md border bg-white px-2 text-sm"
          >
            {ROLE_OPTIONS.map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </select>
          <Button
            type="submit"
            size="sm"
            variant="secondary"
            disabled={rolePending}
            aria-label={`Save the role of ${memberName}`}
          >
            {rolePending ? "Saving…" : "Save"}
          </Button>
        </form>
        <form
          action={removeAction}
          onSubmit={(e) => {
            if (!window.confirm(`Remove ${memberName} from the team?`)) e.preventDefault();
          }}
        >
          <input type="hidden" name="teamId" value={teamId} />
          <input type="hidden" name="membershipId" value={membershipId} />
          <Button
            type="submit"
            size="sm"
            variant="danger"
            disabled={removePending || soleOwner}
            title={soleOwner ? "The only owner cannot be removed" : undefined}
            aria-label={`Remove ${memberName}`}
          >
            Remove
          </Button>
        </form>
      </div>
      <p
        aria-live="polite"
        className={cn("text-caption min-h-4", last.ok ? "text-signal-ok" : "text-signal-fault")}
      >
        {last.message ?? ""}
      </p>
    </div>
  );
}
