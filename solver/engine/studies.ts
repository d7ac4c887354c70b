import { compile } from "../lang";
import type {
  Circuit,
  MeasureResult,
  Part,
  SensitivityResult,
  SolveSuccess,
  VariantResult,
  Warning,
  ZeroResult,
} from "../types";
import { buildMna } from "./mna";
import { computePoles, MAX_POLE_UNKNOWNS } from "./poles";
import { rerun, withValues } from "./rerun";
import { computeZeros } from "./zeros";

/** The variants of a `vary` in value order, and the warnings of the ones that were skipped. */
export interface VaryOutcome {
  variants: VariantResult[];
  warnings: Warning[];
}

/** Relative step of the central differences of `sensitivity`. */
const SENSITIVITY_STEP = 1e-4;

const SWEPT_KINDS = new Set<Part["kind"]>([
  "resistor",
  "capacitor",
  "inductor",
  "vcvs",
  "vccs",
  "ccvs",
  "cccs",
]);

/**
 * Add the analyses of the circuit's structure to a successful result (NETLIST.md): `poles`, `zeros`
 * and `sensitivity`. `vary` and `monte-carlo` are steps of the pipeline (solver/pipeline.ts).
 * Problems become warnings in `out.warnings`.
 */
export function addStructureStudies(circuit: Circuit, out: SolveSuccess): void {
  const freqs = out.frequencies;
  const warnings = out.warnings;
  if (circuit.poles) {
    const built = buildMna(circuit.parts, circuit.nodes);
    if (built.ok && built.system.n <= MAX_POLE_UNKNOWNS) {
      const mid = Math.sqrt((freqs[0] || 1) * (freqs[freqs.length - 1] || 1));
      const poles = computePoles(built.system, mid);
      if (poles) out.poles = poles;
      else
        warnings.push({ line: null, message: "poles: no regular shift found; the network may be singular" });
    } else if (built.ok) {
      warnings.push({
        line: null,
        message: `poles: the circuit has ${built.system.n} unknowns; poles are computed for up to ${MAX_POLE_UNKNOWNS}`,
      });
    }
  }
  if (circuit.zeros && circuit.zeros.length > 0) out.zeros = zerosOf(circuit, freqs, warnings);
  if (circuit.sensitivity.length > 0) out.sensitivity = sensitivity(circuit, freqs, out.measures, warnings);
}

/** The `zeros` statements' zeros; a probe that cannot be answered becomes a warning. */
function zerosOf(circuit: Circuit, freqs: number[], warnings: Warning[]): ZeroResult[] {
  const built = buildMna(circuit.parts, circuit.nodes);
  const src = circuit.parts.find((p) => (p.kind === "vsource" || p.kind === "isource") && p.value !== 0);
  if (!built.ok || !src) return [];
  if (built.system.n + 1 > MAX_POLE_UNKNOWNS) {
    warnings.push({
      line: circuit.zeros![0]!.span.line,
      message: `zeros: the circuit has ${built.system.n} unknowns; zeros are computed for up to ${MAX_POLE_UNKNOWNS - 1}`,
    });
    return [];
  }
  const mid = Math.sqrt((freqs[0] || 1) * (freqs[freqs.length - 1] || 1));
  const out: ZeroResult[] = [];
  for (const z of circuit.zeros ?? []) {
    const r = computeZeros(built.system, src, z.probe, z.text, mid);
    if (typeof r === "string") warnings.push({ line: z.span.line, message: r });
    else out.push(...r);
  }
  return out;
}

/**
 * Solve one value of the circuit's `vary` (a `let` is re-compiled with an override, a part's value
 * is replaced) and add it to `into`: the variant, or a warning when it cannot be solved (skipped).
 * Never throws on user input.
 */
export function solveVariant(
  text: string,
  circuit: Circuit,
  freqs: number[],
  value: number,
  into: VaryOutcome,
): void {
  const vd = circuit.vary;
  if (!vd) return;
  let c: Circuit | null = circuit;
  if (vd.targetKind === "let") {
    const compiled = compile(text, { lets: { [vd.target]: value } });
    c = compiled.ok ? compiled.circuit : null;
    if (!compiled.ok) {
      into.warnings.push({
        line: vd.span.line,
        message: `vary ${vd.target} = ${value}: ${compiled.errors[0]?.message}`,
      });
    }
  } else {
    c = withValues(circuit, new Map([[vd.target, value]]));
  }
  if (!c) return;
  const o = rerun(c, freqs);
  if (typeof o === "string") {
    into.warnings.push({ line: vd.span.line, message: `vary ${vd.target} = ${value}: ${o}` });
    return;
  }
  into.variants.push({ name: vd.target, value, traces: o.traces, measures: o.measures, checks: o.checks });
}

/**
 * Normalized sensitivity (∂M/M)/(∂x/x) by central differences with relative step
 * SENSITIVITY_STEP (error O(step²) plus the measures' refinement noise divided by the step).
 */
function sensitivity(circuit: Circuit, freqs: number[], nominal: MeasureResult[], warnings: Warning[]) {
  const out: SensitivityResult[] = [];
  const targets = circuit.parts.filter((p) => SWEPT_KINDS.has(p.kind) && p.value !== 0);
  const runs = new Map<string, [MeasureResult[] | string, MeasureResult[] | string]>();
  for (const p of targets) {
    const side = (k: number) => {
      const o = rerun(withValues(circuit, new Map([[p.name, p.value * (1 + k * SENSITIVITY_STEP)]])), freqs);
      return typeof o === "string" ? o : o.measures;
    };
    runs.set(p.name, [side(1), side(-1)]);
  }
  for (const s of circuit.sensitivity) {
    const m0 = nominal.find((m) => m.name === s.measure);
    if (!m0) {
      warnings.push({ line: s.span.line, message: `sensitivity: no measure named ${s.measure}` });
      continue;
    }
    for (const p of targets) {
      const [up, down] = runs.get(p.name)!;
      const vu = typeof up === "string" ? null : up.find((m) => m.name === s.measure)?.value;
      const vd = typeof down === "string" ? null : down.find((m) => m.name === s.measure)?.value;
      const ok = m0.value !== null && m0.value !== 0 && typeof vu === "number" && typeof vd === "number";
      out.push({
        measure: s.measure,
        part: p.name,
        value: ok ? (vu - vd) / (2 * SENSITIVITY_STEP * m0.value!) : null,
      });
    }
  }
  return out;
}
