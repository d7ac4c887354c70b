import type { PartChange, PartSummary } from "@/lib/compare";
import { cn } from "@/lib/utils";
import { formatQuantity } from "@/solver/format";
import type { NetlistError, PartKind } from "@/solver/types";

export interface PartsChangesProps {
  parts: PartChange[];
  /** Compile errors of either netlist; parts cannot be listed then. */
  errors?: { a: NetlistError[]; b: NetlistError[] };
  className?: string;
}

const UNIT: Record<PartKind, string> = {
  resistor: "Ω",
  capacitor: "F",
  inductor: "H",
  vsource: "V",
  isource: "A",
  vcvs: "",
  vccs: "S",
  ccvs: "Ω",
  cccs: "",
  opamp: "",
  diode: "",
};

function describe(p: PartSummary | null): string {
  if (!p) return "—";
  const value = p.kind === "opamp" || p.kind === "diode" ? "" : ` ${formatQuantity(p.value, UNIT[p.kind])}`;
  const options = p.options.length > 0 ? ` ${p.options.join(" ")}` : "";
  return `${p.kind} ${p.nodes.join(" ")}${value}${options}`;
}

const CHANGE_STYLE = {
  added: "text-signal-ok",
  removed: "text-signal-fault",
  changed: "text-copper-600",
} as const;

/** Parts added, removed and changed (old → new), by full part name. */
export function PartsChanges({ parts, errors, className }: PartsChangesProps) {
  const broken = (errors?.a.length ?? 0) + (errors?.b.length ?? 0) > 0;
  if (broken) {
    return (
      <p className={cn("text-signal-warn text-sm", className)}>
        Parts cannot be compared: {errors?.a.length ? "the first netlist" : "the second netlist"} does not
        compile with this solver version.
      </p>
    );
  }
  if (parts.length === 0) {
    return <p className={cn("text-ink-500 text-sm", className)}>No part was added, removed or changed.</p>;
  }
  return (
    <div className={cn("overflow-x-auto", className)}>
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Parts changed</caption>
        <thead>
          <tr className="border-paper-200 text-caption text-ink-500 border-b text-left uppercase">
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Part
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Change
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Before
            </th>
            <th scope="col" className="py-1.5 font-medium">
              After
            </th>
          </tr>
        </thead>
        <tbody>
          {parts.map((p) => (
            <tr key={p.name} className="border-paper-100 border-b align-top last:border-0">
              <th scope="row" className="text-ink-900 py-1.5 pr-3 text-left font-mono font-medium">
                {p.name}
              </th>
              <td className={cn("py-1.5 pr-3 font-medium", CHANGE_STYLE[p.change])}>
                {p.change}
                {p.fields.length > 0 ? (
                  <span className="text-caption text-ink-500 block font-normal">{p.fields.join(", ")}</span>
                ) : null}
              </td>
              <td className="text-ink-600 py-1.5 pr-3 font-mono">{describe(p.before)}</td>
              <td className="text-ink-900 py-1.5 font-mono">{describe(p.after)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
