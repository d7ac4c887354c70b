export default function Loading() {
  return (
    <div className="mx-auto max-w-6xl px-4 py-10 sm:px-6" aria-busy="true" aria-live="polite">
      <span className="sr-only">Loading…</span>
      <div className="bg-paper-200 h-8 w-56 animate-pulse rounded-md" />
      <div className="bg-paper-200 mt-3 h-4 w-96 max-w-full animate-pulse rounded" />
      <div className="mt-10 grid gap-4 sm:grid-cols-2">
        <div className="rounded-panel bg-paper-200 h-32 animate-pulse" />
        <div className="rounded-panel bg-paper-200 h-32 animate-pulse" />
      </div>
    </div>
  );
}
