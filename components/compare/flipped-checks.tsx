import type { CheckComparison } from "@/lib/compare";
import { cn } from "@/lib/utils";

export interface FlippedChecksProps {
  checks: CheckComparison[];
  labelA?: string;
  labelB?: string;
  className?: string;
}

function verdict(pass: boolean | null): string {
  return pass === null ? "absent" : pass ? "pass" : "fail";
}

/** Checks whose result changed between the runs, first; then a count of the unchanged ones. */
export function FlippedChecks({
  checks,
  labelA = "before",
  labelB = "after",
  className,
}: FlippedChecksProps) {
  const flipped = checks.filter((c) => c.flipped);
  const other = checks.length - flipped.length;
  return (
    <div className={cn("text-sm", className)}>
      {flipped.length === 0 ? (
        <p className="text-ink-500">No check changed its result.</p>
      ) : (
        <ul className="flex flex-col gap-1.5">
          {flipped.map((c) => (
            <li
              key={`${c.name}-${c.expression}`}
              className={cn(
                "rounded-md border px-2.5 py-1.5",
                c.b ? "border-signal-ok/25 bg-signal-ok-soft" : "border-signal-fault/25 bg-signal-fault-soft",
              )}
            >
              <code className="text-ink-900 font-mono">{c.expression}</code>{" "}
              <span className={c.b ? "text-signal-ok font-semibold" : "text-signal-fault font-semibold"}>
                {verdict(c.a)} → {verdict(c.b)}
              </span>
              <span className="sr-only">
                {" "}
                ({labelA} to {labelB})
              </span>
              {!c.b && c.reasonB ? <span className="text-ink-700 block">{c.reasonB}</span> : null}
            </li>
          ))}
        </ul>
      )}
      {other > 0 ? (
        <p className="text-ink-500 mt-2">
          {other} other {other === 1 ? "check" : "checks"} unchanged or in one run only.
        </p>
      ) : null}
    </div>
  );
}
