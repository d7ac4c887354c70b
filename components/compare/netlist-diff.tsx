import type { DiffLine } from "@/lib/compare";
import { cn } from "@/lib/utils";

export interface NetlistDiffProps {
  diff: DiffLine[];
  /** Unchanged lines kept around each change; longer unchanged stretches fold away. Default 3. */
  context?: number;
  labelA?: string;
  labelB?: string;
  className?: string;
}

type Block = { kind: "lines"; lines: DiffLine[] } | { kind: "fold"; lines: DiffLine[] };

/** Line-based netlist diff with the line numbers of both texts; long unchanged stretches fold. */
export function NetlistDiff({
  diff,
  context = 3,
  labelA = "before",
  labelB = "after",
  className,
}: NetlistDiffProps) {
  if (diff.every((d) => d.kind === "same")) {
    return <p className={cn("text-ink-500 text-sm", className)}>The two netlists are identical.</p>;
  }
  const blocks = foldUnchanged(diff, context);
  return (
    <div className={cn("border-paper-200 overflow-x-auto rounded-md border bg-white", className)}>
      <table className="w-full border-collapse font-mono text-[0.8125rem] leading-5">
        <caption className="sr-only">
          Netlist changes from {labelA} to {labelB}
        </caption>
        <thead className="sr-only">
          <tr>
            <th scope="col">Line in {labelA}</th>
            <th scope="col">Line in {labelB}</th>
            <th scope="col">Change</th>
            <th scope="col">Text</th>
          </tr>
        </thead>
        <tbody>
          {blocks.map((block, i) =>
            block.kind === "fold" ? (
              <tr key={`f${i}`} className="bg-paper-50 text-ink-400">
                <td colSpan={4} className="text-caption px-3 py-0.5 font-sans">
                  ⋯ {block.lines.length} unchanged {block.lines.length === 1 ? "line" : "lines"}
                </td>
              </tr>
            ) : (
              block.lines.map((d, k) => (
                <tr
                  key={`${i}-${k}`}
                  className={cn(
                    d.kind === "added" && "bg-signal-ok-soft",
                    d.kind === "removed" && "bg-signal-fault-soft",
                  )}
                >
                  <td className="text-ink-400 w-10 px-2 text-right align-top select-none">
                    {d.oldLine ?? ""}
                  </td>
                  <td className="border-paper-200 text-ink-400 w-10 border-r px-2 text-right align-top select-none">
                    {d.newLine ?? ""}
                  </td>
                  <td
                    className={cn(
                      "w-5 text-center align-top select-none",
                      d.kind === "added"
                        ? "text-signal-ok"
                        : d.kind === "removed"
                          ? "text-signal-fault"
                          : "text-ink-300",
                    )}
                  >
                    <span aria-hidden>{d.kind === "added" ? "+" : d.kind === "removed" ? "−" : " "}</span>
                    <span className="sr-only">{d.kind === "same" ? "unchanged" : d.kind}</span>
                  </td>
                  <td className="text-ink-900 pr-3 align-top whitespace-pre">{d.text || " "}</td>
                </tr>
              ))
            ),
          )}
        </tbody>
      </table>
    </div>
  );
}

function foldUnchanged(diff: DiffLine[], context: number): Block[] {
  const keep = diff.map(() => false);
  diff.forEach((d, i) => {
    if (d.kind === "same") return;
    for (let k = Math.max(0, i - context); k <= Math.min(diff.length - 1, i + context); k++) keep[k] = true;
  });
  const blocks: Block[] = [];
  diff.forEach((d, i) => {
    const kind = keep[i] ? "lines" : "fold";
    const last = blocks[blocks.length - 1];
    if (last && last.kind === kind) last.lines.push(d);
    else blocks.push({ kind, lines: [d] });
  });
  return blocks;
}
