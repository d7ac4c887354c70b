import type { ReactNode } from "react";
import { canReadRun, visibleOr404 } from "@/lib/page-access";
import { requireUser } from "@/lib/session";

/**
 * A run that is missing or belongs to another team answers 404 here, before the page streams behind
 * its loading skeleton (which sits inside this layout). The check reads the run's keys only.
 */
export default async function RunLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ runId: string }>;
}) {
  const actor = await requireUser();
  const { runId } = await params;
  await visibleOr404(() => canReadRun(actor.userId, runId));
  return children;
}
