import {
  stackBody,
  stackCell,
  stackHead,
  stackRow,
  stackTable,
  stackTitle,
} from "@/components/ui/stacked-table";
import type { MeasureComparison } from "@/lib/compare";
import { cn } from "@/lib/utils";
import { formatDelta, formatPercent, formatQuantity } from "@/solver/format";

export interface MeasuresCompareProps {
  measures: MeasureComparison[];
  labelA?: string;
  labelB?: string;
  className?: string;
}

/** Every measure of both runs side by side with Δ = b − a and Δ% = Δ / |a|; one card per measure on a phone. */
export function MeasuresCompare({
  measures,
  labelA = "before",
  labelB = "after",
  className,
}: MeasuresCompareProps) {
  if (measures.length === 0) {
    return <p className={cn("text-ink-500 text-sm", className)}>Neither run has measures.</p>;
  }
  return (
    <div className={cn("sm:overflow-x-auto", className)}>
      <table className={cn("w-full border-collapse text-sm", stackTable)}>
        <caption className="sr-only">Measures side by side</caption>
        <thead className={stackHead}>
          <tr className="border-paper-200 text-caption text-ink-500 border-b text-left uppercase">
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Measure
            </th>
            <th scope="col" className="py-1.5 pr-3 text-right font-medium">
              {labelA}
            </th>
            <th scope="col" className="py-1.5 pr-3 text-right font-medium">
              {labelB}
            </th>
            <th scope="col" className="py-1.5 pr-3 text-right font-medium">
              Δ
            </th>
            <th scope="col" className="py-1.5 text-right font-medium">
              Δ%
            </th>
          </tr>
        </thead>
        <tbody className={cn("font-mono tabular-nums", stackBody)}>
          {measures.map((m) => (
            <tr key={m.name} className={cn("border-paper-100 border-b align-top sm:last:border-0", stackRow)}>
              <th scope="row" className={cn("text-ink-900 py-1.5 pr-3 text-left font-medium", stackTitle)}>
                {m.name}
              </th>
              <td
                data-label={labelA}
                className={cn("text-ink-700 py-1.5 pr-3 text-right", stackCell)}
                title={m.a === null ? (m.reasonA ?? undefined) : undefined}
              >
                {m.a === null ? <NoValue reason={m.reasonA} /> : formatQuantity(m.a, m.unit)}
              </td>
              <td
                data-label={labelB}
                className={cn("text-ink-900 py-1.5 pr-3 text-right", stackCell)}
                title={m.b === null ? (m.reasonB ?? undefined) : undefined}
              >
                {m.b === null ? <NoValue reason={m.reasonB} /> : formatQuantity(m.b, m.unit)}
              </td>
              <td
                data-label="Δ"
                className={cn("py-1.5 pr-3 text-right whitespace-nowrap", stackCell, tone(m.delta))}
              >
                {formatDelta(m.delta, m.unit)}
              </td>
              <td
                data-label="Δ%"
                className={cn("py-1.5 text-right whitespace-nowrap", stackCell, tone(m.deltaPct))}
              >
                {formatPercent(m.deltaPct)}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function NoValue({ reason }: { reason: string | null }) {
  return (
    <span className="text-signal-warn font-sans text-xs">
      no value
      {reason ? <span className="text-ink-500 block">{reason}</span> : null}
    </span>
  );
}

function tone(v: number | null): string {
  if (v === null || v === 0) return "text-ink-500";
  return "text-ink-900";
}
