/** Resolution of measure, check, vary and monte-carlo statements: names, units, limits, order. */
import type { CheckDef, MeasureDef, MonteCarloDef, SourceSpan, SteadyDef, VaryDef } from "../types";
import type { ValueNode } from "./ast";
import { evaluate } from "./expr";
import { didYouMean } from "./hints";
import { measureUnit, STEADY_FUNCTIONS } from "./kinds";
import { UNIT_NAMES } from "./numbers";
import type { Place } from "./places";
import { claim, count, type DirectiveContext, err, frequency, num, type Of } from "./resolve";
import { resolveSteadyMeasure } from "./steady";

export function resolveMeasures(
  list: Of<"measure">[],
  ctx: DirectiveContext,
  traces: Map<string, SourceSpan>,
  steady: SteadyDef | null = null,
  noiseNames: Set<string> = new Set(),
): MeasureDef[] {
  const out: MeasureDef[] = [];
  const all = new Map(list.map((m) => [m.name.name, m]));
  const names = new Map<string, SourceSpan>();
  for (const m of list) {
    if (!claim(ctx, names, m.name, "measure")) continue;
    if (STEADY_FUNCTIONS.has(m.fn)) {
      const def = resolveSteadyMeasure(m, ctx, steady);
      if (def) out.push(def);
      continue;
    }
    const wantsNoise = m.fn === "noise" || m.fn === "input-noise";
    if (wantsNoise !== noiseNames.has(m.target.name) && traces.has(m.target.name)) {
      err(
        ctx,
        m.target.span,
        wantsNoise
          ? `\`${m.target.name}\` is a trace, not a noise`
          : `\`${m.target.name}\` is a noise; read it with noise(…) or input-noise(…)`,
        wantsNoise ? "name a noise with `noise NAME = volts(out)` first" : `noise(${m.target.name}) at 1kHz`,
      );
      continue;
    }
    if (!traces.has(m.target.name)) {
      err(
        ctx,
        m.target.span,
        `no trace or loop named \`${m.target.name}\``,
        didYouMean(m.target.name, traces.keys()) ?? "name a trace with `show NAME = …` or `loop NAME cut …`",
      );
      continue;
    }
    const def: MeasureDef = { name: m.name.name, fn: m.fn, target: m.target.name, span: m.span };
    if (m.level) def.level = m.level.level;
    if (m.at) {
      const at = frequencyRef(ctx, m, m.at, all);
      if (at === null) continue;
      def.at = at;
    }
    if (m.band) {
      const from = frequencyRef(ctx, m, m.band.from, all);
      const to = frequencyRef(ctx, m, m.band.to, all);
      if (from === null || to === null) continue;
      if ("hz" in from && "hz" in to && !(to.hz > from.hz)) {
        err(ctx, m.band.to.span, "the band must end above its start", "noise(N) from 20Hz to 20kHz");
        continue;
      }
      def.band = { from, to };
    }
    out.push(def);
  }
  return out;
}

/** A frequency written literally, by a let, or as an earlier measure that is a frequency. */
function frequencyRef(
  ctx: DirectiveContext,
  m: Of<"measure">,
  at: ValueNode,
  all: Map<string, Of<"measure">>,
): { hz: number } | { measure: string } | null {
  if (at.kind === "name" && all.has(at.name)) {
    const ref = all.get(at.name)!;
    if (ref === m || ref.span.line >= m.span.line) {
      return err(
        ctx,
        at.span,
        `measure \`${at.name}\` is defined on line ${ref.span.line}, after this one`,
        `move \`measure ${at.name}\` above line ${m.span.line}`,
      );
    }
    if (measureUnit(ref.fn) !== "Hz")
      return err(
        ctx,
        at.span,
        `measure \`${at.name}\` is not a frequency`,
        "use a frequency or a measure that is one",
      );
    return { measure: at.name };
  }
  if (at.kind === "name" && !ctx.lets.has(at.name)) {
    return err(
      ctx,
      at.span,
      `no measure or let named \`${at.name}\``,
      didYouMean(at.name, [...all.keys(), ...ctx.lets]),
    );
  }
  const hz = frequency(ctx, at);
  return hz === null ? null : { hz };
}

export function resolveChecks(
  list: Of<"check">[],
  ctx: DirectiveContext,
  measures: Of<"measure">[],
): CheckDef[] {
  const out: CheckDef[] = [];
  for (const c of list) {
    const m = measures.find((x) => x.name.name === c.measure.name);
    if (m === undefined) {
      err(
        ctx,
        c.measure.span,
        `no measure named \`${c.measure.name}\``,
        didYouMean(
          c.measure.name,
          measures.map((x) => x.name.name),
        ),
      );
      continue;
    }
    const unit = measureUnit(m.fn);
    const limit = (v: ValueNode): number | null => {
      if (v.kind === "number" && v.unit !== null && v.unit !== unit) {
        const measured =
          unit === "" ? "a plain number" : unit === "s" ? "in seconds" : `in ${UNIT_NAMES[unit]}`;
        return err(
          ctx,
          v.span,
          `\`${m.name.name}\` is ${measured}; this limit is in ${UNIT_NAMES[v.unit]}`,
          unit === "" || unit === "s"
            ? "write the limit without a unit"
            : `write it in ${unit} or without a unit`,
        );
      }
      const x = evaluate(v, ctx.global, ctx.errors);
      // thd is in percent: `check dist < 1%` means 1, not the fraction 0.01 that `%` reads as.
      return x !== null && unit === "%" && v.kind === "number" && v.unit === "%" ? x * 100 : x;
    };
    const value = limit(c.value);
    const value2 = c.value2 ? limit(c.value2) : undefined;
    if (value === null || value2 === null) continue;
    const def: CheckDef = { measure: m.name.name, op: c.op, value, expression: c.expression, span: c.span };
    if (value2 !== undefined) {
      if (!(value2 > value)) {
        err(ctx, c.value2!.span, "the upper limit must be above the lower one");
        continue;
      }
      def.value2 = value2;
    }
    out.push(def);
  }
  return out;
}

export function resolveVary(s: Of<"vary">, ctx: DirectiveContext): VaryDef | null {
  const isLet = ctx.lets.has(s.target.name);
  const target = isLet ? null : ctx.parts.find((p) => p.name === s.target.name);
  if (!isLet && !target) {
    return err(
      ctx,
      s.target.span,
      `no let or part named \`${s.target.name}\``,
      didYouMean(s.target.name, [...ctx.lets, ...ctx.parts.map((p) => p.name)]),
    );
  }
  const place: Place = target ? target.kind : "any";
  let values: number[];
  if (Array.isArray(s.values)) {
    const list = s.values.map((v) => num(ctx, v, place));
    if (list.some((v) => v === null)) return null;
    values = list as number[];
  } else {
    const r = s.values;
    const a = num(ctx, r.from, place);
    const b = num(ctx, r.to, place);
    const n = count(ctx, r.count, "the number of values", 2, 10_000);
    if (a === null || b === null || n === null) return null;
    if (r.mode === "log" && !(a > 0 && b > 0))
      return err(ctx, r.from.span, "a log range needs values above zero");
    // Through logarithms when b/a or b − a overflows a double (1e-300 to 1e300 gave Infinity).
    const ratio = b / a;
    const lnA = Math.log(a);
    const lnSpan = Math.log(b) - lnA;
    values = Array.from({ length: n }, (_, i) => {
      const t = i / (n - 1);
      if (r.mode === "log") return Number.isFinite(ratio) ? a * ratio ** t : Math.exp(lnA + lnSpan * t);
      return Number.isFinite(b - a) ? a + (b - a) * t : a * (1 - t) + b * t;
    }).map((v) => Number(v.toPrecision(12)));
  }
  const bad = values.findIndex((v) => !Number.isFinite(v));
  if (bad >= 0) {
    const at = Array.isArray(s.values) ? (s.values[bad]?.span ?? s.span) : s.values.to.span;
    return err(ctx, at, "this value is beyond what a double holds (about ±1.8e308): use a smaller one");
  }
  return { target: s.target.name, targetKind: isLet ? "let" : "part", values, span: s.span };
}

export function resolveMonteCarlo(s: Of<"monte-carlo">, ctx: DirectiveContext): MonteCarloDef | null {
  const samples = count(ctx, s.samples, "the number of samples", 1, 100_000);
  const seed = s.seed ? count(ctx, s.seed, "the seed", 0, 2 ** 32 - 1) : 1;
  if (samples === null || seed === null) return null;
  if (!ctx.parts.some((p) => p.tol !== undefined)) {
    ctx.warnings.push({
      line: s.span.line,
      message: "monte-carlo: no part has a tolerance (tol=…), so every sample is the same",
    });
  }
  const dist = s.dist?.name === "normal" ? "normal" : "uniform";
  return { samples, seed, dist, span: s.span };
}
