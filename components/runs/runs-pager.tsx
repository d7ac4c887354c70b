import { PlainButton } from "@/components/ui/button";
import { buttonClass } from "@/components/ui/button-class";
import type { RunsQueryState } from "./runs-filters";

/** Previous / next page and the page size of the runs table (the choice goes into the URL). */
export function RunsPager(props: {
  page: number;
  pages: number;
  pageSize: number;
  onGo: (q: Partial<RunsQueryState>) => void;
}) {
  const { page, pages, pageSize, onGo } = props;
  return (
    <nav aria-label="Pages of runs" className="flex flex-wrap items-center justify-between gap-3 text-sm">
      <div className="flex items-center gap-2">
        <PlainButton
          type="button"
          className={buttonClass({ variant: "secondary", size: "sm" })}
          disabled={page <= 1}
          onClick={() => onGo({ page: page - 1 })}
        >
          Previous
        </PlainButton>
        <span className="text-ink-600">
          Page {page} of {pages}
        </span>
        <PlainButton
          type="button"
          className={buttonClass({ variant: "secondary", size: "sm" })}
          disabled={page >= pages}
          onClick={() => onGo({ page: page + 1 })}
        >
          Next
        </PlainButton>
      </div>
      <label className="text-ink-600 flex items-center gap-2">
        Rows per page
        <select
          className="border-paper-300 rounded-md border bg-white px-2 py-1"
          value={pageSize}
          onChange={(e) => onGo({ pageSize: Number(e.target.value), page: 1 })}
        >
          {[10, 20, 50, 100].map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </label>
    </nav>
  );
}
