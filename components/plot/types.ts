/** A magnitude/phase series on its own frequency grid (null = no value at that point). */
export interface BodeSeries {
  name: string;
  frequencies: number[];
  magnitudeDb: (number | null)[];
  phaseDeg: (number | null)[];
}

/** An extra series drawn over the main traces (another run's trace, a difference trace). */
export interface BodeOverlay extends BodeSeries {
  /** Line style; another run's traces are dashed by default, a difference dotted. */
  dash?: "solid" | "dash" | "dot" | "dashdot" | "longdash";
  role?: "overlay" | "difference";
  color?: string;
}

/** A labelled frequency drawn as a vertical line across both rows (zero-phase, crossings, peaks). */
export interface BodeMarker {
  frequencyHz: number;
  label: string;
}

/** A comment pinned to a frequency, optionally on one trace. */
export interface BodePin {
  frequencyHz: number;
  trace?: string | null;
  label?: string;
}
