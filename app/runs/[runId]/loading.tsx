/** Skeleton of the run page while the run loads. */
export default function Loading() {
  return (
    <div className="mx-auto max-w-6xl animate-pulse px-4 py-8 sm:px-6" aria-busy="true" aria-live="polite">
      <span className="sr-only">Loading the run…</span>
      <div className="bg-paper-200 mb-2 h-4 w-40 rounded" />
      <div className="bg-paper-200 mb-6 h-9 w-96 max-w-full rounded" />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="rounded-panel bg-paper-100 h-[520px]" />
        <div className="rounded-panel bg-paper-100 h-64" />
      </div>
    </div>
  );
}
