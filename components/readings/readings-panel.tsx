import { Panel, PanelHeader } from "@/components/ui/panel";
import type { ReadingView } from "@/lib/readings";
import type { MeasureResult, MeasureStats } from "@/solver/types";
import { BenchReadingForm } from "./reading-form";
import { ReadingsList } from "./readings-list";

/** "Bench readings" of the run page: what the built board showed, beside the prediction. */
export function ReadingsPanel({
  runId,
  readings,
  measures,
  monteCarlo,
  canRecord,
  error,
}: {
  runId: string;
  readings: ReadingView[];
  measures: MeasureResult[];
  monteCarlo?: MeasureStats[] | undefined;
  canRecord: boolean;
  /** Set when the readings could not be loaded; the rest of the page still shows. */
  error?: string | null;
}) {
  return (
    <Panel aria-labelledby="readings-h">
      <PanelHeader
        id="readings-h"
        title="Bench readings"
        description="What the built board showed, beside the prediction and its Monte Carlo spread."
      />
      <div className="space-y-6 p-4 sm:p-5">
        {error ? (
          <p role="alert" className="text-signal-fault text-sm">
            {error}
          </p>
        ) : (
          <ReadingsList runId={runId} readings={readings} canDelete={canRecord} />
        )}
        {canRecord ? (
          <div className="border-paper-200 border-t pt-5">
            <h3 className="text-ink-900 mb-3 font-semibold">Record a reading</h3>
            <BenchReadingForm runId={runId} measures={measures} monteCarlo={monteCarlo} />
          </div>
        ) : null}
      </div>
    </Panel>
  );
}
