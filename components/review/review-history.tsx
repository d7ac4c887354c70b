import { REVIEW_ACTION_PAST, type ReviewAction } from "@/lib/review-states";
import type { ReviewEventView } from "@/lib/run-types";
import { formatDate } from "@/lib/utils";

const verb = (action: string) => REVIEW_ACTION_PAST[action as ReviewAction] ?? action;

/** The run's review events, oldest first. */
export function ReviewHistory({ events }: { events: ReviewEventView[] }) {
  if (events.length === 0) return <p className="text-ink-500 text-sm">No review steps yet.</p>;
  return (
    <ol className="border-paper-300 space-y-3 border-l pl-4 text-sm" aria-label="Review history">
      {events.map((e) => (
        <li key={e.id} className="relative">
          <span
            aria-hidden="true"
            className="bg-board-400 absolute top-1.5 -left-[21px] size-2.5 rotate-45"
          />
          <p>
            <span className="text-ink-800 font-medium">{e.actorName}</span> {verb(e.action)}
            <span className="text-ink-500"> · {formatDate(e.createdAt)}</span>
          </p>
          {e.note ? <p className="text-ink-600 mt-0.5 whitespace-pre-wrap">{e.note}</p> : null}
        </li>
      ))}
    </ol>
  );
}
