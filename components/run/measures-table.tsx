import { PlainButton } from "@/components/ui/button";
import { cn } from "@/lib/utils";
import { formatQuantity } from "@/solver/format";
import type { MeasureResult } from "@/solver/types";

export interface MeasuresTableProps {
  measures: MeasureResult[];
  /** Makes frequency measures clickable (e.g. to focus the plot on them). */
  onSelectFrequency?: (frequencyHz: number) => void;
  className?: string;
}

/** The run's measures: name, value with SI prefix and unit, or the reason it has no value. */
export function MeasuresTable({ measures, onSelectFrequency, className }: MeasuresTableProps) {
  if (measures.length === 0) {
    return <p className={cn("text-ink-500 text-sm", className)}>No measures in this netlist.</p>;
  }
  return (
    <table className={cn("w-full border-collapse text-sm", className)}>
      <caption className="sr-only">Measures</caption>
      <thead>
        <tr className="border-paper-200 text-caption text-ink-500 border-b text-left uppercase">
          <th scope="col" className="py-1.5 pr-3 font-medium">
            Measure
          </th>
          <th scope="col" className="py-1.5 font-medium">
            Value
          </th>
        </tr>
      </thead>
      <tbody>
        {measures.map((m) => (
          <tr key={m.name} className="border-paper-100 border-b last:border-0">
            <th scope="row" className="text-ink-800 py-1.5 pr-3 text-left align-top font-mono font-medium">
              {m.name}
            </th>
            <td className="py-1.5 align-top">
              {m.value === null ? (
                <span className="text-signal-warn">
                  no value <span className="text-ink-500">— {m.reason ?? "not available"}</span>
                </span>
              ) : m.unit === "Hz" && onSelectFrequency ? (
                <PlainButton
                  type="button"
                  onClick={() => onSelectFrequency(m.value as number)}
                  className="text-board-700 decoration-board-200 hover:decoration-board-600 font-mono tabular-nums underline underline-offset-2"
                  title="Show this frequency on the plot"
                >
                  {formatQuantity(m.value, m.unit)}
                </PlainButton>
              ) : (
                <span className="text-ink-900 font-mono tabular-nums">{formatQuantity(m.value, m.unit)}</span>
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
