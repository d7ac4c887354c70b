import { cn } from "@/lib/utils";
import type { SolveSuccess } from "@/solver/types";
import { formatNumber, formatQuantity, formatSiCompact } from "./format";

export interface StudiesProps {
  result: Pick<SolveSuccess, "measures" | "variants" | "monteCarlo" | "poles" | "sensitivity">;
  className?: string;
}

const th = "py-1 pr-3 text-left font-medium text-caption text-ink-500";
const td = "whitespace-nowrap py-1 pr-3 text-left font-mono tabular-nums text-ink-900";

/** Results of `vary`, `monte-carlo`, `poles` and `sensitivity`, each only when the netlist asked for it. */
export function Studies({ result, className }: StudiesProps) {
  const unitOf = (name: string) => result.measures.find((m) => m.name === name)?.unit ?? "";
  const { variants, monteCarlo, poles, sensitivity } = result;
  if (!variants?.length && !monteCarlo && !poles?.length && !sensitivity?.length) return null;
  return (
    <div className={cn("flex flex-col gap-4 text-sm", className)}>
      {variants?.length ? (
        <section>
          <h3 className="text-ink-800 mb-1 font-semibold">Variants ({variants[0]?.name})</h3>
          <div className="overflow-x-auto">
            <table className="border-collapse">
              <thead>
                <tr className="border-paper-200 border-b">
                  <th scope="col" className={th}>
                    {variants[0]?.name}
                  </th>
                  {variants[0]?.measures.map((m) => (
                    <th key={m.name} scope="col" className={th}>
                      {m.name}
                    </th>
                  ))}
                  <th scope="col" className={th}>
                    checks
                  </th>
                </tr>
              </thead>
              <tbody>
                {variants.map((v) => (
                  <tr key={v.value} className="border-paper-100 border-b last:border-0">
                    <th scope="row" className={td}>
                      {formatSiCompact(v.value)}
                    </th>
                    {v.measures.map((m) => (
                      <td key={m.name} className={td} title={m.reason ?? undefined}>
                        {formatQuantity(m.value, m.unit)}
                      </td>
                    ))}
                    <td className={td}>
                      {v.checks.filter((c) => c.pass).length}/{v.checks.length}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </section>
      ) : null}

      {monteCarlo ? (
        <section>
          <h3 className="text-ink-800 mb-1 font-semibold">
            Monte Carlo: {monteCarlo.samples} samples, seed {monteCarlo.seed} —{" "}
            <span className={monteCarlo.yield >= 0.99 ? "text-signal-ok" : "text-signal-warn"}>
              {formatNumber(monteCarlo.yield * 100, 4)} % pass every check
            </span>
          </h3>
          <div className="overflow-x-auto">
            <table className="border-collapse">
              <thead>
                <tr className="border-paper-200 border-b">
                  {["measure", "mean", "std", "p5", "p95", "min", "max"].map((h) => (
                    <th key={h} scope="col" className={th}>
                      {h}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {monteCarlo.measures.map((m) => {
                  const u = unitOf(m.name);
                  return (
                    <tr key={m.name} className="border-paper-100 border-b last:border-0">
                      <th scope="row" className={td}>
                        {m.name}
                      </th>
                      <td className={td}>{formatQuantity(m.mean, u)}</td>
                      <td className={td}>{formatQuantity(m.std, u)}</td>
                      <td className={td}>{formatQuantity(m.percentiles.p5, u)}</td>
                      <td className={td}>{formatQuantity(m.percentiles.p95, u)}</td>
                      <td className={td}>{formatQuantity(m.min, u)}</td>
                      <td className={td}>{formatQuantity(m.max, u)}</td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        </section>
      ) : null}

      {poles?.length ? (
        <section>
          <h3 className="text-ink-800 mb-1 font-semibold">Natural frequencies (poles)</h3>
          <div className="overflow-x-auto">
            <table className="border-collapse">
              <thead>
                <tr className="border-paper-200 border-b">
                  {["σ (rad/s)", "ω (rad/s)", "f", "Q", "growth per cycle"].map((h) => (
                    <th key={h} scope="col" className={th}>
                      {h}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {poles.map((p, i) => (
                  <tr
                    key={i}
                    className={cn(
                      "border-paper-100 border-b last:border-0",
                      p.re > 0 && "bg-signal-warn-soft",
                    )}
                  >
                    <td className={td}>{formatNumber(p.re, 5)}</td>
                    <td className={td}>{formatNumber(p.im, 5)}</td>
                    <td className={td}>{formatQuantity(p.frequencyHz, "Hz")}</td>
                    <td className={td}>{p.q === null ? "—" : formatNumber(p.q, 4)}</td>
                    <td className={td}>
                      {p.growthPerCycle === null ? "—" : `×${formatNumber(p.growthPerCycle, 6)}`}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {poles.some((p) => p.re > 0) ? (
            <p className="text-signal-warn mt-1">
              Highlighted poles lie in the right half-plane: small signals grow there.
            </p>
          ) : null}
        </section>
      ) : null}

      {sensitivity?.length ? (
        <section>
          <h3 className="text-ink-800 mb-1 font-semibold">Sensitivity (ΔM/M per Δx/x)</h3>
          <div className="overflow-x-auto">
            <table className="border-collapse">
              <thead>
                <tr className="border-paper-200 border-b">
                  {["measure", "part", "sensitivity"].map((h) => (
                    <th key={h} scope="col" className={th}>
                      {h}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {sensitivity.map((s) => (
                  <tr key={`${s.measure}-${s.part}`} className="border-paper-100 border-b last:border-0">
                    <td className={td}>{s.measure}</td>
                    <td className={td}>{s.part}</td>
                    <td className={td}>{s.value === null ? "—" : formatNumber(s.value, 4)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </section>
      ) : null}
    </div>
  );
}
