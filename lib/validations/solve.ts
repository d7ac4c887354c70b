import { z } from "zod";
import { PREVIEW_STAGES } from "@/lib/preview-stages";

/**
 * Body of `POST /api/solve`: a netlist to solve without saving. Its size is checked in bytes by the
 * route. `stage: "sweep"` asks for the nominal sweep first (lib/preview-stages.ts); default `"all"`.
 */
export const solveRequestSchema = z.object({
  netlist: z.string({ error: "netlist must be the netlist text" }),
  stage: z
    .enum(PREVIEW_STAGES, { error: 'stage must be "sweep" (the nominal sweep first) or "all"' })
    .default("all"),
});
