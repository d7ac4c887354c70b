"use client";

import type { SolveSuccess } from "@/solver/types";
import { oscillatorVerdict } from "./analysis-math";
import { JobProgress } from "./job-progress";
import { MonteCarloView } from "./monte-carlo-view";
import { OscillatorVerdictCard } from "./oscillator-verdict";
import { PoleMap } from "./pole-map";
import { SensitivityChart } from "./sensitivity-chart";
import { VariantsView } from "./variants-view";

export interface AnalysesPanelProps {
  /** The run's result JSON (null while it is queued or when the solve failed). */
  result: SolveSuccess | null;
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
  const pending = status === "queued" || status === "running";
  const sections: React.ReactNode[] = [];
  if (pending && runId) {
    sections.push(<JobProgress key="job" runId={runId} initialState={status} canCancel={canCancel} />);
  }
  if (result?.ok) {
    // The verdict is about oscillators: shown for a circuit with a loop cut or a growing pole.
    const hasLoop = result.traces.some((t) => t.kind === "loop");
    const growing = (result.poles ?? []).some((p) => p.re > 0);
    const verdict = hasLoop || growing ? oscillatorVerdict(result) : null;
    if (verdict && (verdict.pole || verdict.loop))
      sections.push(<OscillatorVerdictCard key="verdict" verdict={verdict} />);
    if (result.poles && result.poles.length > 0) sections.push(<PoleMap key="poles" poles={result.poles} />);
    if (result.variants && result.variants.length > 0) {
      sections.push(
        <VariantsView
          key="variants"
          frequencies={result.frequencies}
          variants={result.variants}
          measures={result.measures}
        />,
      );
    }
    if (result.monteCarlo)
      sections.push(<MonteCarloView key="mc" mc={result.monteCarlo} measures={result.measures} />);
    if (result.sensitivity && result.sensitivity.length > 0) {
      sections.push(<SensitivityChart key="sens" rows={result.sensitivity} />);
    }
  }
  if (sections.length === 0) return null;
  return (
    <div className="space-y-8" data-testid="analyses-panel">
      {sections}
    </div>
  );
}
