/**
 * Bench readings in a comparison of two runs: every reading of either run set beside both runs'
 * predictions, so a reviewer sees whether the later design explains what the board showed. Pure.
 */
import { type Comparison, compareReading, deriveReading, type Prediction } from "@/lib/reading-math";
import type { ReadingView } from "@/lib/readings";

export type ReadingCompareRow = {
  reading: ReadingView;
  /** The run the reading was recorded on. */
  of: "a" | "b";
  /** The same reading against run A's and run B's prediction of its measure. */
  against: { a: Comparison; b: Comparison };
};

export function compareReadings(
  readings: { a: ReadingView[]; b: ReadingView[] },
  predictions: { a: Prediction; b: Prediction },
): ReadingCompareRow[] {
  const rows: ReadingCompareRow[] = [];
  for (const side of ["a", "b"] as const) {
    for (const reading of readings[side]) {
      const d = deriveReading(reading);
      if (!d) continue;
      const against = (p: Prediction) => compareReading(d, reading.measureName, p.measures, p.monteCarlo);
      rows.push({ reading, of: side, against: { a: against(predictions.a), b: against(predictions.b) } });
    }
  }
  return rows;
}
