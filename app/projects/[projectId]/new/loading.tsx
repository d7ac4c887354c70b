/** Skeleton of the editor page while the project is checked. */
export default function Loading() {
  return (
    <div className="mx-auto max-w-[96rem] animate-pulse px-4 py-6 sm:px-6" aria-busy="true">
      <span className="sr-only">Loading the editor…</span>
      <div className="bg-paper-200 mb-4 h-8 w-48 rounded" />
      <div className="grid gap-5 lg:grid-cols-2">
        <div className="rounded-panel bg-paper-100 h-[55vh]" />
        <div className="rounded-panel bg-paper-100 h-[55vh]" />
      </div>
    </div>
  );
}
