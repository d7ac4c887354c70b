export function SiteFooter() {
  return (
    <footer className="border-paper-200 mt-16 border-t">
      <div className="text-caption text-ink-500 mx-auto flex max-w-[96rem] flex-wrap items-center justify-between gap-2 px-4 py-6 sm:px-6">
        <p>Phasewright — small-signal AC evidence for analog teams.</p>
        <p>Results are linear analysis around an operating point: confirm on the bench.</p>
      </div>
    </footer>
  );
}
