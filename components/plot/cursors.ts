import type { Annotation, Shape } from "plotly.js";
import { sampleTrace } from "@/lib/trace-math";
import { plotColors } from "./palette";
import type { BodeSeries } from "./types";

/** A cursor placed on the plot: "A" or "B" at a frequency. */
export interface BodeCursor {
  id: "A" | "B";
  frequencyHz: number;
}

/** What a cursor reads on one trace; null values where the trace has none there. */
export interface CursorReading {
  id: "A" | "B";
  frequencyHz: number;
  db: number | null;
  deg: number | null;
}

export const CURSOR_COLORS: Record<BodeCursor["id"], string> = {
  A: plotColors.cursorA,
  B: plotColors.cursorB,
};

/**
 * The trace's magnitude and phase at the cursor's frequency (interpolated on the trace's own grid,
 * as comment pins are); null outside the sweep.
 */
export function readCursor(series: BodeSeries | undefined, cursor: BodeCursor): CursorReading {
  const sample = series
    ? sampleTrace(
        series.frequencies,
        series.magnitudeDb as number[],
        series.phaseDeg as number[],
        cursor.frequencyHz,
      )
    : null;
  return { id: cursor.id, frequencyHz: cursor.frequencyHz, db: sample?.db ?? null, deg: sample?.deg ?? null };
}

/** B − A of two readings (frequency, dB, degrees wrapped to (−180, 180]); null parts where either is missing. */
export function cursorDelta(
  a: CursorReading,
  b: CursorReading,
): { hz: number; db: number | null; deg: number | null } {
  const wrap = (d: number) => {
    const w = ((((d + 180) % 360) + 360) % 360) - 180;
    return w === -180 ? 180 : w;
  };
  return {
    hz: b.frequencyHz - a.frequencyHz,
    db: a.db !== null && b.db !== null ? b.db - a.db : null,
    deg: a.deg !== null && b.deg !== null ? wrap(b.deg - a.deg) : null,
  };
}

/** Solid vertical lines across both rows, each tagged with its letter at the top. */
export function cursorShapes(cursors: readonly BodeCursor[]): {
  shapes: Partial<Shape>[];
  annotations: Partial<Annotation>[];
} {
  const shapes: Partial<Shape>[] = [];
  const annotations: Partial<Annotation>[] = [];
  for (const c of cursors) {
    if (!(c.frequencyHz > 0)) continue;
    const color = CURSOR_COLORS[c.id];
    shapes.push({
      type: "line",
      xref: "x",
      yref: "paper",
      x0: c.frequencyHz,
      x1: c.frequencyHz,
      y0: 0,
      y1: 1,
      line: { color, width: 1.5 },
    });
    annotations.push({
      xref: "x",
      yref: "paper",
      x: Math.log10(c.frequencyHz),
      y: 1,
      yanchor: "top",
      showarrow: false,
      text: `<b>${c.id}</b>`,
      bgcolor: color,
      borderpad: 2,
      font: { size: 11, color: "#ffffff", family: '"JetBrains Mono", ui-monospace, monospace' },
    });
  }
  return { shapes, annotations };
}
