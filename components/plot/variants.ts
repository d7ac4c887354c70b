import type { DrawnResult } from "@/lib/drawn-result";
import { formatSiCompact } from "@/solver/format";
import { traceColor } from "./palette";
import type { BodeOverlay } from "./types";

const DASHES = ["dot", "dash", "dashdot", "longdash"] as const;

/**
 * The traces of each `vary` value as overlays on the run's grid, named "h (Cl=4.7n)": each keeps its
 * trace's colour, and the values differ by line pattern.
 */
export function variantOverlays(result: Pick<DrawnResult, "frequencies" | "variants">): BodeOverlay[] {
  return (result.variants ?? []).flatMap((v, vi) =>
    v.traces.map((t, ti) => ({
      name: `${t.name} (${v.name}=${formatSiCompact(v.value)})`,
      frequencies: result.frequencies,
      magnitudeDb: t.magnitudeDb,
      phaseDeg: t.phaseDeg,
      dash: DASHES[vi % DASHES.length],
      color: traceColor(ti),
      role: "overlay" as const,
    })),
  );
}
