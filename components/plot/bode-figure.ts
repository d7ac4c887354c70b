/**
 * Data and layout of a two-row Bode plot (magnitude above phase, one log frequency axis): the
 * traces come from bode-traces.ts, the axes and vertical lines from bode-layout.ts.
 */
import type { Data, Layout } from "plotly.js";
import { type BodeFrameInput, bodeLayout } from "./bode-layout";
import { benchTraces, pinTrace, seriesTraces } from "./bode-traces";
import type { BodePin, BodeSeries } from "./types";

export interface BodeFigureInput extends BodeFrameInput {
  /** Bench data sets, drawn as open symbols. */
  measurements: BodeSeries[];
  /** Comment pins, drawn on their trace's magnitude. */
  pins: BodePin[];
}

/** Data and layout of a two-row Bode plot: magnitude (dB) above phase (deg), one log frequency axis. */
export function buildBodeFigure(input: BodeFigureInput): { data: Data[]; layout: Partial<Layout> } {
  const data = [...seriesTraces(input.series, input.overlays), ...benchTraces(input.measurements)];
  const pins = pinTrace(input.series, input.pins);
  if (pins) data.push(pins);
  return { data, layout: bodeLayout(input) };
}
