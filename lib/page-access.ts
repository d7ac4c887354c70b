import { notFound } from "next/navigation";
import { authorizeProject, authorizeRun } from "@/lib/authz";
import { NotFoundError } from "@/lib/errors";

/**
 * For pages: runs an access check and turns "not found or not visible" into the framework's 404.
 * Called before anything streams (in a segment's layout, or above a page's Suspense boundary), so the
 * answer carries HTTP status 404, not a 200 with the not-found screen. Other errors go on to the
 * error page.
 */
export async function visibleOr404<T>(check: () => Promise<T>): Promise<T> {
  try {
    return await check();
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
}

/**
 * Read access to a run or a project. A segment's layout, the page's tab title (generateMetadata) and
 * the page's loaders ask the same question; lib/authz.ts looks it up once per request.
 */
export const canReadRun = (userId: string, runId: string) => authorizeRun(userId, runId, "run:read");
export const canReadProject = (userId: string, projectId: string) =>
  authorizeProject(userId, projectId, "project:read");
