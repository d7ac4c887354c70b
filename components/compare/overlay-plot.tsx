"use client";

import { useMemo, useState } from "react";
import { BodePlot } from "@/components/plot/bode-plot";
import { plotColors } from "@/components/plot/palette";
import type { BodeMarker, BodeOverlay, BodeSeries } from "@/components/plot/types";
import type { TraceComparison } from "@/lib/compare";

export interface CompareOverlayPlotProps {
  /** From `compareRuns(...).traces`: both runs' traces on the second run's grid, with b − a. */
  traces: TraceComparison[];
  labelA?: string;
  labelB?: string;
  /** Short names of the sides in the legend (default A and B). */
  letterA?: string;
  letterB?: string;
  /** Frequency markers (e.g. the second run's zero-phase), optional. */
  markers?: BodeMarker[];
  /** Bench measurements to draw as points. */
  measurements?: BodeSeries[];
  plotId?: string;
  exportName?: string;
}

/**
 * The second run's traces solid, the first run's dashed, and b − a dotted on its own Δ axes (dB and
 * degrees, right-hand side), so a small difference is not flattened by the response's scale. Legend
 * entries name the side by its letter ("H · A"); the titles are in the plot's stamp and on the page.
 */
export function CompareOverlayPlot({
  traces,
  labelA = "before",
  labelB = "after",
  letterA = "A",
  letterB = "B",
  markers,
  measurements,
  plotId = "compare-overlay",
  exportName = "phasewright-compare",
}: CompareOverlayPlotProps) {
  const [showDiff, setShowDiff] = useState(true);
  const stamp = useMemo(() => ({ title: `${labelB} against ${labelA}` }), [labelA, labelB]);
  const frequencies = traces[0]?.frequencies ?? [];
  const main = useMemo(
    () => traces.map((t) => ({ name: `${t.name} · ${letterB}`, magnitudeDb: t.bDb, phaseDeg: t.bDeg })),
    [traces, letterB],
  );
  const overlays = useMemo<BodeOverlay[]>(() => {
    const out: BodeOverlay[] = traces.map((t) => ({
      name: `${t.name} · ${letterA}`,
      frequencies: t.frequencies,
      magnitudeDb: t.aDb,
      phaseDeg: t.aDeg,
      dash: "dash",
      role: "overlay",
    }));
    if (showDiff) {
      traces.forEach((t, i) => {
        out.push({
          name: `${t.name} Δ (${letterB} − ${letterA})`,
          color: plotColors.differences[i % plotColors.differences.length],
          frequencies: t.frequencies,
          magnitudeDb: t.diffDb,
          phaseDeg: t.diffDeg,
          role: "difference",
        });
      });
    }
    return out;
  }, [traces, letterA, letterB, showDiff]);

  if (traces.length === 0) {
    return (
      <p className="text-ink-500 text-sm">The runs share no trace name, so there is nothing to overlay.</p>
    );
  }
  return (
    <div>
      <label className="text-ink-700 mb-1 flex items-center gap-2 text-sm">
        <input type="checkbox" checked={showDiff} onChange={(e) => setShowDiff(e.target.checked)} />
        Show the difference {letterB} − {letterA} (dB and degrees, on its own axes at the right)
      </label>
      <BodePlot
        frequencies={frequencies}
        traces={main}
        overlays={overlays}
        markers={markers}
        measurements={measurements}
        plotId={plotId}
        exportName={exportName}
        label={`Bode plot comparing ${labelA} and ${labelB}`}
        stamp={stamp}
      />
      {traces.some((t) => t.interpolated) ? (
        <p className="text-caption text-ink-500 mt-1">
          The sweeps differ: {labelA} is interpolated (in log frequency) onto the frequencies of {labelB}.
        </p>
      ) : null}
    </div>
  );
}
