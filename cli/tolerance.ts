/**
 * `--tolerance NAME=LIMIT` for a baseline comparison: how far a measure (or a trace, in dB or
 * degrees) may move before the command fails. `f0=0.5%` is relative to the baseline's value;
 * `pm=2deg`, `f0=10Hz`, `gain=0.2dB`, `q=0.05` are absolute in the measure's unit (SI prefixes as in
 * a netlist: `f0=1.5k`, `f0=1.5kHz`). `*=1%` sets the limit of every name without its own.
 * Without any, a measure may move by rounding only (1e-9 relative).
 */
import { parseNumberText, UNIT_SYMBOLS } from "@/solver/lang/numbers";

export interface Tolerance {
  name: string;
  /** Relative (a fraction: 0.5 % → 0.005) or absolute in `unit`. */
  kind: "relative" | "absolute";
  value: number;
  /** Unit written with an absolute limit (null: none written, the measure's own). */
  unit: string | null;
  /** As the user wrote it, for messages. */
  text: string;
}

/** Movement allowed when no tolerance names a measure: rounding only. */
export const ROUNDING = 1e-9;

/** `NAME=LIMIT` → a tolerance, or a message saying what is wrong. */
export function parseTolerance(arg: string): Tolerance | { error: string } {
  const eq = arg.indexOf("=");
  const name = arg.slice(0, eq).trim();
  const text = arg.slice(eq + 1).trim();
  if (eq <= 0 || text === "" || !/^(\*|[A-Za-z_][\w.]*)$/.test(name)) {
    return { error: `--tolerance ${arg}: write NAME=LIMIT, e.g. f0=0.5% or pm=2deg` };
  }
  const n = parseNumberText(text);
  if (!n.ok) return { error: `--tolerance ${arg}: ${n.message}${n.hint ? ` (${n.hint})` : ""}` };
  if (!(n.value >= 0)) return { error: `--tolerance ${arg}: a limit is zero or more` };
  if (n.unit === "%") return { name, kind: "relative", value: n.value, unit: null, text };
  return { name, kind: "absolute", value: n.value, unit: n.unit ? UNIT_SYMBOLS[n.unit] : null, text };
}

/** The tolerance for a name: its own, else `*`, else null (rounding only). */
export function toleranceFor(name: string, all: Tolerance[]): Tolerance | null {
  return all.find((t) => t.name === name) ?? all.find((t) => t.name === "*") ?? null;
}

/** Unit names as measures report them ("" for a ratio such as Q). */
function sameUnit(limitUnit: string | null, unit: string): boolean {
  return limitUnit === null || limitUnit === unit || (limitUnit === "deg" && unit === "°");
}

/**
 * Whether a move from `a` to `b` is within the tolerance. Returns the verdict, or a message when
 * an absolute limit's unit does not fit the measure's.
 */
export function within(
  a: number,
  b: number,
  unit: string,
  t: Tolerance | null,
): { ok: boolean; limit: string } | { error: string } {
  const delta = Math.abs(b - a);
  if (t === null) return { ok: delta <= ROUNDING * Math.max(Math.abs(a), Math.abs(b)), limit: "rounding" };
  if (t.kind === "relative") {
    // A relative limit of a zero baseline allows no movement beyond rounding.
    const allowed = Math.abs(a) * t.value + ROUNDING * Math.max(Math.abs(a), Math.abs(b));
    return { ok: delta <= allowed, limit: t.text };
  }
  if (!sameUnit(t.unit, unit)) {
    return { error: `--tolerance ${t.name}=${t.text}: ${t.name} is in ${unit || "no unit"}, not ${t.unit}` };
  }
  return { ok: delta <= t.value * (1 + ROUNDING), limit: t.text };
}
