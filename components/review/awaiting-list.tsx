import Link from "next/link";
import type { AwaitingRun } from "@/lib/awaiting";
import { formatDate } from "@/lib/utils";

/** "Waiting for your sign-off": runs of every team that a reviewer or owner is asked to decide. */
export function AwaitingList({ runs }: { runs: AwaitingRun[] }) {
  if (runs.length === 0) return null;
  return (
    <section
      aria-labelledby="awaiting-h"
      className="rounded-panel border-copper-300 bg-copper-50 mb-8 border px-5 py-4"
    >
      <h2 id="awaiting-h" className="text-ink-900 text-lead font-semibold">
        Waiting for your sign-off <span className="text-ink-600 tabular-nums">({runs.length})</span>
      </h2>
      <ul className="divide-copper-200 mt-2 divide-y">
        {runs.map((r) => (
          <li key={r.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 py-2">
            <span className="min-w-0">
              <Link
                href={`/runs/${r.id}`}
                className="text-board-800 font-medium underline-offset-2 hover:underline"
              >
                {r.title}
              </Link>{" "}
              <span className="text-ink-600 text-sm">
                · {r.projectName} ({r.teamName}) · by {r.authorName}
              </span>
            </span>
            <span className="text-ink-600 text-sm">
              asked <time dateTime={r.askedAt}>{formatDate(r.askedAt)}</time>
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
