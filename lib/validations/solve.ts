import { z } from "zod";

/** Body of `POST /api/solve`: a netlist to solve without saving. Its size is checked in bytes by the route. */
export const solveRequestSchema = z.object({
  netlist: z.string({ error: "netlist must be the netlist text" }),
});
