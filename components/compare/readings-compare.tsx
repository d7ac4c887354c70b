import {
  stackBody,
  stackCell,
  stackHead,
  stackRow,
  stackTable,
  stackTitle,
} from "@/components/ui/stacked-table";
import type { ReadingCompareRow } from "@/lib/compare-readings";
import { QUANTITY_LABEL } from "@/lib/reading-kinds";
import type { Comparison } from "@/lib/reading-math";
import { cn } from "@/lib/utils";
import { formatPercent, formatQuantity } from "@/solver/format";

/** One run's prediction of a reading: value, deviation and, with Monte Carlo, inside/outside p1…p99. */
function Against({ c }: { c: Comparison }) {
  if (c.predicted === null || c.unit === null) {
    return <span className="text-ink-500 font-sans text-xs">{c.reason ?? "no prediction"}</span>;
  }
  return (
    <span>
      {formatQuantity(c.predicted, c.unit, 4)}{" "}
      <span className="text-ink-600">({formatPercent(c.deviationPct, 3)})</span>
      {c.spread ? (
        <span
          className={cn("block font-sans text-xs", c.spread.inside ? "text-signal-ok" : "text-signal-fault")}
        >
          {c.spread.inside ? "inside p1…p99" : "outside p1…p99"}
        </span>
      ) : null}
    </span>
  );
}

/** Bench readings of either run beside both runs' predictions of the same measure. */
export function ReadingsCompare({ rows }: { rows: ReadingCompareRow[] }) {
  if (rows.length === 0) {
    return <p className="text-ink-500 text-sm">Neither run has bench readings.</p>;
  }
  return (
    <div className="sm:overflow-x-auto">
      <table className={cn("w-full border-collapse text-sm sm:min-w-[40rem]", stackTable)}>
        <caption className="sr-only">Bench readings against both runs' predictions</caption>
        <thead className={stackHead}>
          <tr className="border-paper-200 text-caption text-ink-500 border-b text-left uppercase">
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Reading
            </th>
            <th scope="col" className="py-1.5 pr-3 text-right font-medium">
              Measured
            </th>
            <th scope="col" className="py-1.5 pr-3 text-right font-medium">
              A predicts
            </th>
            <th scope="col" className="py-1.5 text-right font-medium">
              B predicts
            </th>
          </tr>
        </thead>
        <tbody className={cn("font-mono tabular-nums", stackBody)}>
          {rows.map(({ reading: r, of, against }) => (
            <tr key={r.id} className={cn("border-paper-100 border-b align-top sm:last:border-0", stackRow)}>
              <th
                scope="row"
                className={cn("text-ink-900 py-1.5 pr-3 text-left font-sans font-normal", stackTitle)}
              >
                <span className="font-medium">{QUANTITY_LABEL[r.quantity]}</span>
                {r.measureName ? ` vs ${r.measureName}` : ""} · on run {of.toUpperCase()}
                <span className="text-ink-600 block font-mono text-xs">{r.steps}</span>
                {r.note ? <span className="text-ink-500 block text-xs">{r.note}</span> : null}
              </th>
              <td data-label="Measured" className={cn("py-1.5 pr-3 text-right", stackCell)}>
                {against.a.unit ? formatQuantity(against.a.measured, against.a.unit, 4) : "—"}
              </td>
              <td data-label="A predicts" className={cn("py-1.5 pr-3 text-right", stackCell)}>
                <Against c={against.a} />
              </td>
              <td data-label="B predicts" className={cn("py-1.5 text-right", stackCell)}>
                <Against c={against.b} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
