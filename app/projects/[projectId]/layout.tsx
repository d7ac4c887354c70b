import type { ReactNode } from "react";
import { canReadProject, visibleOr404 } from "@/lib/page-access";
import { requireUser } from "@/lib/session";

/**
 * A project that is missing or belongs to another team answers 404 here (for the project page and
 * its editor), before either page streams behind its loading skeleton.
 */
export default async function ProjectLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ projectId: string }>;
}) {
  const actor = await requireUser();
  const { projectId } = await params;
  await visibleOr404(() => canReadProject(actor.userId, projectId));
  return children;
}
