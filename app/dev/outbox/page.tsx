import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeading } from "@/components/ui/panel";
import { listOutbox, outboxVisible } from "@/lib/mail/outbox";
import { requireUser } from "@/lib/session";
import { cn } from "@/lib/utils";

export const metadata: Metadata = { title: "Outbox (development)" };
export const dynamic = "force-dynamic";

const STATUS: Record<string, string> = {
  sent: "bg-signal-ok-soft text-signal-ok",
  pending: "bg-signal-warn-soft text-signal-warn",
  failed: "bg-signal-fault-soft text-signal-fault",
};

/**
 * Development and tests only (the local mail fake): the e-mails the app wrote to the signed-in person,
 * never anyone else's.
 */
export default async function OutboxPage() {
  if (!outboxVisible()) notFound();
  const actor = await requireUser();
  const emails = await listOutbox(actor.email, 100);
  return (
    <div className="mx-auto max-w-5xl px-4 py-8 sm:px-6">
      <PageHeading
        title="Outbox"
        lead={`Development only: the e-mails the app wrote to ${actor.email}, newest first, with their delivery state. Nothing here leaves this machine.`}
      />
      {emails.length === 0 ? (
        <EmptyState title="No e-mails yet">
          Comments, review steps and invitations put their e-mails here.
        </EmptyState>
      ) : (
        <ul className="space-y-3">
          {emails.map((m) => (
            <li key={m.id}>
              <details className="group rounded-panel border-paper-200 shadow-panel border bg-white">
                <summary className="flex cursor-pointer flex-wrap items-center gap-x-3 gap-y-1 px-4 py-3">
                  <span className={cn("text-caption rounded-full px-2 py-0.5 font-medium", STATUS[m.status])}>
                    {m.status}
                  </span>
                  <span className="text-ink-900 min-w-0 flex-1 basis-52 font-medium">{m.subject}</span>
                  <span className="text-ink-600 text-sm">to {m.to}</span>
                  <time className="text-caption text-ink-500 font-mono" dateTime={m.createdAt}>
                    {m.createdAt.replace("T", " ").slice(0, 19)} UTC
                  </time>
                </summary>
                <div className="border-paper-200 border-t px-4 py-3">
                  <p className="text-caption text-ink-500 mb-2">
                    attempts {m.attempts}
                    {m.sentAt ? ` · sent ${m.sentAt.replace("T", " ").slice(0, 19)} UTC` : ""}
                    {m.lastError ? ` · last error: ${m.lastError}` : ""}
                  </p>
                  <pre className="text-ink-800 font-mono text-sm break-words whitespace-pre-wrap">
                    {m.text}
                  </pre>
                </div>
              </details>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
