import type { ReactNode } from "react";

/** A calm placeholder for a list with nothing in it yet. */
export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-panel border-paper-300 flex flex-col items-center border border-dashed px-6 py-10 text-center">
      <svg viewBox="0 0 48 24" className="text-board-300 mb-3 h-6 w-12" aria-hidden="true">
        <path
          d="M2 12 Q 8 2 14 12 T 26 12 T 38 12 T 46 12"
          fill="none"
          stroke="currentColor"
          strokeWidth="2"
        />
      </svg>
      <p className="text-ink-800 font-medium">{title}</p>
      {children ? <div className="text-ink-500 mt-1 max-w-md text-sm">{children}</div> : null}
    </div>
  );
}
