import type { Metadata } from "next";
import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeading } from "@/components/ui/panel";
import { RoleBadge } from "@/components/ui/role-badge";
import { requireUser } from "@/lib/session";
import { listTeamsForUser } from "@/lib/teams";

export const metadata: Metadata = { title: "Teams" };

export default async function TeamsPage() {
  const actor = await requireUser();
  const teams = await listTeamsForUser(actor.userId);
  return (
    <div className="mx-auto max-w-4xl px-4 py-10 sm:px-6">
      <PageHeading title="Teams" lead="The teams you belong to and your role in each." />
      {teams.length === 0 ? (
        <EmptyState title="No teams yet">An owner of a team can invite you by e-mail.</EmptyState>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2">
          {teams.map((t) => (
            <li key={t.id}>
              <Link
                href={`/teams/${t.id}`}
                className="rounded-panel border-paper-200 shadow-panel hover:border-board-300 block border bg-white p-5"
              >
                <span className="flex items-start justify-between gap-3">
                  <span className="text-ink-900 text-lead font-semibold">{t.name}</span>
                  <RoleBadge role={t.role} />
                </span>
                <span className="text-ink-500 mt-2 block text-sm">
                  {t.memberCount} member{t.memberCount === 1 ? "" : "s"}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
