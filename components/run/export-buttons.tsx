"use client";

import { useState } from "react";
import { downloadPlotPng } from "@/components/plot/plot-registry";
import { PlainButton } from "@/components/ui/button";
import { buttonClass } from "@/components/ui/button-class";
import { cn } from "@/lib/utils";

export interface ExportButtonsProps {
  runId: string;
  /** The `plotId` given to the BodePlot on the same page, for the PNG export. */
  plotId: string;
  /** File name (without extension) for the PNG. */
  fileName?: string;
  className?: string;
}

/** CSV download of the run's sweep and a PNG of its plot. */
export function ExportButtons({ runId, plotId, fileName = `run-${runId}`, className }: ExportButtonsProps) {
  const [message, setMessage] = useState<string | null>(null);
  return (
    <div className={cn("flex flex-wrap items-center gap-2", className)}>
      <a
        href={`/api/runs/${encodeURIComponent(runId)}/export.csv`}
        download
        className={buttonClass({ variant: "secondary", size: "sm" })}
      >
        Download CSV
      </a>
      <PlainButton
        type="button"
        className={buttonClass({ variant: "secondary", size: "sm" })}
        onClick={async () => {
          setMessage(null);
          const ok = await downloadPlotPng(plotId, fileName).catch(() => false);
          if (!ok) setMessage("The plot is still loading — try again in a moment.");
        }}
      >
        Download PNG
      </PlainButton>
      <span role="status" aria-live="polite" className="text-caption text-signal-warn">
        {message}
      </span>
    </div>
  );
}
