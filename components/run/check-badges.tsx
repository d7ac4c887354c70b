import { cn } from "@/lib/utils";
import type { CheckResult } from "@/solver/types";

export interface CheckBadgesProps {
  checks: CheckResult[];
  className?: string;
}

/** One badge per design check: pass or fail, the check as written, and why it failed. */
export function CheckBadges({ checks, className }: CheckBadgesProps) {
  if (checks.length === 0) {
    return <p className={cn("text-ink-500 text-sm", className)}>No checks in this netlist.</p>;
  }
  const passed = checks.filter((c) => c.pass).length;
  return (
    <div className={className}>
      <p className="text-ink-600 mb-2 text-sm">
        <span className="text-ink-900 font-semibold tabular-nums">
          {passed} of {checks.length}
        </span>{" "}
        checks pass
      </p>
      <ul className="flex flex-col gap-1.5">
        {checks.map((c, i) => (
          <li
            key={`${c.expression}-${i}`}
            className={cn(
              "flex flex-wrap items-baseline gap-x-2 gap-y-0.5 rounded-md border px-2.5 py-1.5 text-sm",
              c.pass
                ? "border-signal-ok/25 bg-signal-ok-soft text-signal-ok"
                : "border-signal-fault/25 bg-signal-fault-soft text-signal-fault",
            )}
          >
            <span className="text-caption font-semibold tracking-wide uppercase">
              {c.pass ? "pass" : "fail"}
            </span>
            <code className="text-ink-900 font-mono">{c.expression}</code>
            {!c.pass && c.reason ? <span className="text-ink-700 basis-full">{c.reason}</span> : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
