import { z } from "zod";

/** JSON form of a bench-data upload; the CSV itself is checked line by line in lib/measurements.ts. */
export const measurementUploadSchema = z.object({
  name: z.string().trim().min(1, "Give the measurement a name.").max(200),
  csv: z.string().min(1, "The CSV is empty."),
});
