import { cn } from "@/lib/utils";

/** The Phasewright mark: a phasor sweeping out its angle inside a board-green tile. */
export function Mark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={cn("h-8 w-8", className)} aria-hidden="true">
      <rect width="32" height="32" rx="7" className="fill-board-700" />
      <circle cx="16" cy="16" r="9.5" fill="none" className="stroke-board-300" strokeWidth="1.5" />
      <path d="M16 16 L 23.2 9.8" className="stroke-copper-300" strokeWidth="2.4" strokeLinecap="round" />
      <path d="M21 16 A 5 5 0 0 0 19.3 12.3" fill="none" className="stroke-paper-50" strokeWidth="1.6" />
      <circle cx="16" cy="16" r="1.8" className="fill-paper-50" />
    </svg>
  );
}

export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={cn("inline-flex items-center gap-2.5", className)}>
      <Mark />
      <span className="text-ink-950 text-[1.0625rem] font-semibold tracking-tight">Phasewright</span>
    </span>
  );
}
