/** Skeleton of the project page while its runs load. */
export default function Loading() {
  return (
    <div className="mx-auto max-w-6xl animate-pulse px-4 py-8 sm:px-6" aria-busy="true" aria-live="polite">
      <span className="sr-only">Loading the project…</span>
      <div className="bg-paper-200 mb-8 h-9 w-72 rounded" />
      <div className="rounded-panel border-paper-200 space-y-2 border bg-white p-5">
        {["a", "b", "c", "d", "e"].map((k) => (
          <div key={k} className="bg-paper-100 h-8 rounded" />
        ))}
      </div>
    </div>
  );
}
