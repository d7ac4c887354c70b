import { previewPlan } from "@/lib/jobs";
import { MAX_PREVIEW_POINTS } from "@/lib/limits";
import { solvePreview } from "@/lib/preview-pool";
import { type PreviewResult, type PreviewStage, studiesInWords } from "@/lib/preview-stages";

/**
 * A live preview, as `POST /api/solve` answers it and the editor page solves its first netlist (server
 * only): priced first (lib/jobs.ts `previewPlan`: over the inline budget the nominal sweep only, with
 * `deferred` saying why), then solved on the preview pool.
 *
 * `stage: "sweep"` answers the nominal sweep alone when the preview has studies to solve beyond it,
 * naming them in `pending` (lib/preview-stages.ts); measures that read a study still to come are
 * `null` with the reason. Without studies it is the whole preview, as `"all"` answers it. A sweep
 * answer waits ahead of whole previews on the pool; `signal` drops a preview whose caller is gone.
 */
export async function solveLivePreview(
  netlist: string,
  stage: PreviewStage = "all",
  signal?: AbortSignal,
): Promise<PreviewResult> {
  const plan = previewPlan(netlist, MAX_PREVIEW_POINTS);
  const urgent = stage === "sweep";
  if (!urgent || plan.studies.length === 0) return solvePreview(netlist, plan.options, { urgent, signal });
  const still = `still solving ${studiesInWords(plan.studies)}`;
  const first = await solvePreview(netlist, { ...plan.options, nominalOnly: still }, { urgent, signal });
  if (!first.ok) return first;
  const { deferred: _still, ...sweep } = first;
  return { ...sweep, pending: plan.studies };
}
