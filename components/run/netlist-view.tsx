import { TickedText } from "@/components/ui/ticked-text";
import { cn } from "@/lib/utils";
import type { NetlistError, Warning } from "@/solver/types";

export interface NetlistViewProps {
  netlist: string;
  errors?: NetlistError[];
  warnings?: Warning[];
  /** Prefix of the line anchors (`<prefix>-L12`), for links from WarningsList. Default "netlist". */
  idPrefix?: string;
  /** Lines to highlight, e.g. a comment's context. */
  highlightLines?: number[];
  className?: string;
}

export function netlistLineId(prefix: string, line: number): string {
  return `${prefix}-L${line}`;
}

/** Read-only netlist with line numbers; error lines red, warning lines amber, each with its message. */
export function NetlistView({
  netlist,
  errors = [],
  warnings = [],
  idPrefix = "netlist",
  highlightLines = [],
  className,
}: NetlistViewProps) {
  const lines = netlist.replace(/\r\n?/g, "\n").split("\n");
  if (lines.length > 1 && lines[lines.length - 1] === "") lines.pop();
  const errorsByLine = group(errors, (e) => e.line);
  const warningsByLine = group(warnings, (w) => w.line);
  const highlighted = new Set(highlightLines);
  return (
    <div className={cn("border-paper-200 bg-paper-50 overflow-x-auto rounded-md border", className)}>
      <table className="w-full border-collapse font-mono text-[0.8125rem] leading-5">
        <caption className="sr-only">Netlist</caption>
        <tbody>
          {lines.map((text, i) => {
            const n = i + 1;
            const errs = errorsByLine.get(n) ?? [];
            const warns = warningsByLine.get(n) ?? [];
            return (
              <tr
                key={n}
                id={netlistLineId(idPrefix, n)}
                className={cn(
                  "target:bg-copper-50 scroll-mt-24",
                  errs.length > 0 ? "bg-signal-fault-soft" : warns.length > 0 ? "bg-signal-warn-soft" : "",
                  highlighted.has(n) && "bg-copper-50",
                )}
              >
                <td className="border-paper-200 text-ink-500 w-10 border-r px-2 text-right align-top select-none">
                  {n}
                </td>
                <td className="text-ink-900 px-3 align-top whitespace-pre">
                  {text || " "}
                  {errs.map((e, k) => (
                    <span
                      key={`e${k}`}
                      className="text-signal-fault block font-sans text-xs whitespace-normal"
                    >
                      column {e.column}: <TickedText text={e.message} />
                      {e.hint ? (
                        <>
                          {" — "}
                          <TickedText text={e.hint} />
                        </>
                      ) : null}
                    </span>
                  ))}
                  {warns.map((w, k) => (
                    <span
                      key={`w${k}`}
                      className="text-signal-warn block font-sans text-xs whitespace-normal"
                    >
                      <TickedText text={w.message} />
                    </span>
                  ))}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

function group<T>(items: T[], key: (t: T) => number | null): Map<number, T[]> {
  const map = new Map<number, T[]>();
  for (const item of items) {
    const k = key(item);
    if (k === null) continue;
    const list = map.get(k) ?? [];
    list.push(item);
    map.set(k, list);
  }
  return map;
}
