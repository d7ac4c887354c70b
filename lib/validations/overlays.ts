import { z } from "zod";

/** `PUT /api/runs/:id/overlays`: the bench data sets to draw on the run's plot (replaces the list). */
export const overlaysSchema = z.object({
  measurementIds: z.array(z.uuid("Not a measurement id."), "A list of measurement ids.").max(50),
});
