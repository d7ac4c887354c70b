import type { ReactNode } from "react";
import { cn } from "@/lib/utils";

const TONES = {
  info: "border-board-200 bg-board-50 text-board-900",
  ok: "border-signal-ok/30 bg-signal-ok-soft text-signal-ok",
  warn: "border-signal-warn/30 bg-signal-warn-soft text-signal-warn",
  fault: "border-signal-fault/30 bg-signal-fault-soft text-signal-fault",
} as const;

/** A short message block. `live` makes screen readers announce changes. */
export function Notice({
  tone = "info",
  title,
  children,
  live,
  className,
}: {
  tone?: keyof typeof TONES;
  title?: ReactNode;
  children?: ReactNode;
  live?: boolean;
  className?: string;
}) {
  return (
    <div
      role={tone === "fault" ? "alert" : "status"}
      aria-live={live ? "polite" : undefined}
      className={cn("rounded-md border px-4 py-3 text-sm", TONES[tone], className)}
    >
      {title ? <p className="font-semibold">{title}</p> : null}
      {children ? <div className={cn(title && "mt-0.5")}>{children}</div> : null}
    </div>
  );
}
