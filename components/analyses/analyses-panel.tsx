"use client";

import type { DrawnResult } from "@/lib/drawn-result";
import { analysisSections } from "./analysis-math";
import { JobProgress } from "./job-progress";
import { MonteCarloView } from "./monte-carlo-view";
import { NoiseView } from "./noise-view";
import { oscillatorVerdict } from "./oscillator-grade";
import { OscillatorVerdictCard } from "./oscillator-verdict";
import { PoleMap } from "./pole-map";
import { SensitivityChart } from "./sensitivity-chart";
import { SteadyView } from "./steady-view";
import { VariantsView } from "./variants-view";

export interface AnalysesPanelProps {
  /** The run's result JSON (null while it is queued or when the solve failed). */
  result: DrawnResult | null;
  /** The run id: needed for the progress bar of a queued or running solve. */
  runId?: string;
  /** The run's status ('ok', 'failed', 'queued', 'running', 'cancelled'). */
  status?: string;
  /** Whether the viewer may cancel the solve (run:create); default true — the route checks anyway. */
  canCancel?: boolean;
}

/**
 * Everything beyond one sweep that a result holds: the solve's progress (queued/running runs),
 * the oscillator verdict, poles, the vary family, Monte Carlo statistics and sensitivities.
 * Renders nothing when there is nothing to show.
 */
export function AnalysesPanel({ result, runId, status, canCancel = true }: AnalysesPanelProps) {
  const sections: React.ReactNode[] = [];
  for (const section of analysisSections(result, status ?? "ok")) {
    if (section === "job" && runId && status) {
      sections.push(<JobProgress key="job" runId={runId} initialState={status} canCancel={canCancel} />);
    }
    if (!result?.ok) continue;
    if (section === "verdict") {
      const verdict = oscillatorVerdict(result);
      if (verdict) sections.push(<OscillatorVerdictCard key="verdict" verdict={verdict} />);
    }
    if (section === "steady" && result.steady)
      sections.push(<SteadyView key="steady" steady={result.steady} />);
    if (section === "poles")
      sections.push(<PoleMap key="poles" poles={result.poles ?? []} zeros={result.zeros ?? []} />);
    if (section === "noise")
      for (const n of result.noise ?? [])
        sections.push(<NoiseView key={`noise-${n.name}`} noise={n} frequencies={result.frequencies} />);

    if (section === "variants" && result.variants) {
      sections.push(
        <VariantsView
          key="variants"
          frequencies={result.frequencies}
          variants={result.variants}
          measures={result.measures}
        />,
      );
    }
    if (section === "monteCarlo" && result.monteCarlo)
      sections.push(<MonteCarloView key="mc" mc={result.monteCarlo} measures={result.measures} />);
    if (section === "sensitivity" && result.sensitivity)
      sections.push(<SensitivityChart key="sens" rows={result.sensitivity} />);
  }
  if (sections.length === 0) return null;
  return (
    <div className="space-y-8" data-testid="analyses-panel">
      {sections}
    </div>
  );
}
