/** Skeleton of the compare page while both runs load and their traces are matched. */
export function CompareSkeleton() {
  return (
    <div className="mx-auto max-w-6xl animate-pulse px-4 py-8 sm:px-6" aria-busy="true" aria-live="polite">
      <span className="sr-only">Comparing the runs…</span>
      <div className="bg-paper-200 mb-6 h-9 w-64 rounded" />
      <div className="mb-6 grid gap-4 sm:grid-cols-2">
        <div className="rounded-panel bg-paper-100 h-24" />
        <div className="rounded-panel bg-paper-100 h-24" />
      </div>
      <div className="rounded-panel bg-paper-100 h-[520px]" />
    </div>
  );
}
