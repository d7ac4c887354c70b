/** The heading of one analysis inside the panel. */
export function SectionTitle({ id, title, note }: { id: string; title: string; note?: string }) {
  return (
    <div className="flex flex-wrap items-baseline justify-between gap-2">
      <h3 id={id} className="text-ink-900 text-lead font-semibold">
        {title}
      </h3>
      {note ? <p className="text-caption text-ink-500">{note}</p> : null}
    </div>
  );
}
