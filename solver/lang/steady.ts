/** Resolution of the `steady` statement against the resolved loops. */
import type { LoopCut, MeasureDef, SteadyDef } from "../types";
import { probe } from "./directives";
import { didYouMean } from "./hints";
import { count, type DirectiveContext, err, num, type Of } from "./resolve";

/** Harmonics of a steady analysis: default and the language's limit (a service may allow fewer). */
const DEFAULT_HARMONICS = 15;
const MAX_HARMONICS = 255;
/** Default start level of the envelope, volts at the cut node. */
const DEFAULT_FROM = 1e-6;

export function resolveSteady(
  s: Of<"steady"> | undefined,
  ctx: DirectiveContext,
  loops: LoopCut[],
): SteadyDef | null {
  if (s === undefined) return null;
  const loop = loops.find((l) => l.name === s.loop.name);
  if (loop === undefined)
    return err(
      ctx,
      s.loop.span,
      `no loop named \`${s.loop.name}\``,
      didYouMean(
        s.loop.name,
        loops.map((l) => l.name),
      ) ?? "define it first: loop T cut out before R1",
    );
  const harmonics = s.harmonics
    ? count(ctx, s.harmonics, "the number of harmonics", 1, MAX_HARMONICS)
    : DEFAULT_HARMONICS;
  const from = s.from ? num(ctx, s.from, "swing") : DEFAULT_FROM;
  if (harmonics === null || from === null) return null;
  if (!(from > 0)) return err(ctx, s.from!.span, "the start level must be above zero", "from=1uV");
  return { loop: loop.name, harmonics, from, span: s.span };
}

/** `frequency(LOOP)`, `startup(LOOP)`, `amplitude(PROBE)`, `thd(PROBE)`: they need `steady LOOP`. */
export function resolveSteadyMeasure(
  m: Of<"measure">,
  ctx: DirectiveContext,
  steady: SteadyDef | null,
): MeasureDef | null {
  if (steady === null)
    return err(
      ctx,
      m.span,
      `${m.fn} is read from the steady oscillation, and the netlist has no \`steady\` statement`,
      "add `steady LOOP` naming the oscillator's loop",
    );
  const def: MeasureDef = { name: m.name.name, fn: m.fn, target: m.target.name, span: m.span };
  if (m.probe) {
    const p = probe(ctx, m.probe);
    if (p === null) return null;
    def.probe = p;
    return def;
  }
  if (m.target.name !== steady.loop)
    return err(
      ctx,
      m.target.span,
      `the steady oscillation is of loop \`${steady.loop}\`, not \`${m.target.name}\``,
      `write ${m.fn}(${steady.loop})`,
    );
  return def;
}
