import type { CheckDef, CheckResult, MeasureResult } from "../types";

const fmt = (x: number) => String(Number(x.toPrecision(6)));

/** Evaluate design limits against the measures; a check on a null measure fails with its reason. */
export function evaluateChecks(defs: CheckDef[], measures: MeasureResult[]): CheckResult[] {
  const byName = new Map(measures.map((m) => [m.name, m]));
  return defs.map((c) => {
    const m = byName.get(c.measure);
    const base = { name: c.measure, expression: c.expression };
    if (!m) return { ...base, pass: false, reason: `no measure named ${c.measure}` };
    if (m.value === null) return { ...base, pass: false, reason: m.reason ?? `${c.measure} has no value` };
    const v = m.value;
    let pass: boolean;
    switch (c.op) {
      case "<":
        pass = v < c.value;
        break;
      case "<=":
        pass = v <= c.value;
        break;
      case ">":
        pass = v > c.value;
        break;
      case ">=":
        pass = v >= c.value;
        break;
      case "between": {
        const hi = c.value2 ?? Number.NaN;
        pass = v >= Math.min(c.value, hi) && v <= Math.max(c.value, hi);
        break;
      }
    }
    const unit = m.unit ? ` ${m.unit}` : "";
    return { ...base, pass, reason: pass ? null : `${c.measure} = ${fmt(v)}${unit} fails ${c.expression}` };
  });
}
