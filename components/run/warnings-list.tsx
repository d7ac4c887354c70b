import { PlainButton } from "@/components/ui/button";
import { TickedText } from "@/components/ui/ticked-text";
import { cn } from "@/lib/utils";
import type { Warning } from "@/solver/types";
import { netlistLineId } from "./netlist-view";

export interface WarningsListProps {
  warnings: Warning[];
  /** Called when a line reference is clicked; without it, line references link to NetlistView's rows. */
  onLineClick?: (line: number) => void;
  /** The `idPrefix` of the NetlistView on the same page (default "netlist"). */
  netlistIdPrefix?: string;
  className?: string;
}

/** The solver's warnings, each with a link to its netlist line. Renders nothing when there are none. */
export function WarningsList({
  warnings,
  onLineClick,
  netlistIdPrefix = "netlist",
  className,
}: WarningsListProps) {
  if (warnings.length === 0) return null;
  return (
    <ul className={cn("flex flex-col gap-1.5 text-sm", className)} aria-label="Warnings">
      {warnings.map((w, i) => (
        <li
          key={`${w.line}-${i}`}
          className="border-signal-warn/25 bg-signal-warn-soft flex gap-2 rounded-md border px-2.5 py-1.5"
        >
          <span className="text-signal-warn shrink-0 font-semibold">
            {w.line === null ? (
              "note"
            ) : onLineClick ? (
              <PlainButton
                type="button"
                onClick={() => onLineClick(w.line as number)}
                className="underline underline-offset-2"
              >
                line {w.line}
              </PlainButton>
            ) : (
              <a href={`#${netlistLineId(netlistIdPrefix, w.line)}`} className="underline underline-offset-2">
                line {w.line}
              </a>
            )}
          </span>
          <span className="text-ink-800">
            <TickedText text={w.message} />
          </span>
        </li>
      ))}
    </ul>
  );
}
