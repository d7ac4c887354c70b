/** A small diamond, the same shape as the comment pins on the plot. */
export function PinIcon() {
  return (
    <svg viewBox="0 0 10 10" className="inline size-2.5 align-[-1px]" aria-hidden="true">
      <path d="M5 0.5 9.5 5 5 9.5 0.5 5Z" fill="currentColor" />
    </svg>
  );
}
