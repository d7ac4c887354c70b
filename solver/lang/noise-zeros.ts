/** Resolution of `noise` and `zeros` statements (NETLIST.md "Noise", "Zeros"). */
import type { NoiseDef, SourceSpan, ZerosDef } from "../types";
import { probe } from "./directives";
import { didYouMean } from "./hints";
import { claim, type DirectiveContext, err, type Of } from "./resolve";

const SOURCES = new Set(["vsource", "isource"]);

export function resolveNoise(
  list: Of<"noise">[],
  ctx: DirectiveContext,
  traces: Map<string, SourceSpan>,
): NoiseDef[] {
  const out: NoiseDef[] = [];
  for (const s of list) {
    if (!claim(ctx, traces, s.name, "trace")) continue;
    const p = probe(ctx, s.probe);
    if (p === null) continue;
    if (p.op !== "v") {
      err(
        ctx,
        s.probe.span,
        "noise reads one voltage: volts(NODE) or volts(A, B)",
        "a ratio or a current has no noise density in volts; probe the node",
      );
      continue;
    }
    const def: NoiseDef = { name: s.name.name, probe: p, text: s.text, span: s.span };
    if (s.input) {
      const src = ctx.parts.find((x) => x.name === s.input!.name);
      if (!src || !SOURCES.has(src.kind)) {
        err(
          ctx,
          s.input.span,
          src
            ? `\`${src.name}\` is a ${src.kind}, not an independent source`
            : `no part named \`${s.input.name}\``,
          didYouMean(
            s.input.name,
            ctx.parts.filter((x) => SOURCES.has(x.kind)).map((x) => x.name),
          ) ?? "input names the vsource or isource that drives the circuit",
        );
        continue;
      }
      def.input = src.name;
    }
    out.push(def);
  }
  return out;
}

export function resolveZeros(list: Of<"zeros">[], ctx: DirectiveContext): ZerosDef[] {
  const out: ZerosDef[] = [];
  if (list.length === 0) return out;
  const sources = ctx.parts.filter((x) => SOURCES.has(x.kind) && x.value !== 0);
  for (const s of list) {
    const p = probe(ctx, s.probe);
    if (p === null) continue;
    if (p.op !== "v" && p.op !== "i") {
      err(
        ctx,
        s.probe.span,
        "zeros reads one probe: volts(NODE), volts(A, B) or amps(PART)",
        "the zeros of a ratio are those of its numerator when the denominator is the source",
      );
      continue;
    }
    if (sources.length !== 1) {
      err(
        ctx,
        s.span,
        sources.length === 0
          ? "zeros needs an independent source: the transfer is from the netlist's one source to the probe"
          : `zeros needs exactly one independent source; this netlist has ${sources.length} (${sources
              .slice(0, 4)
              .map((x) => x.name)
              .join(", ")})`,
        sources.length === 0
          ? "add a vsource driving the input, e.g. Vin: vsource in gnd 1"
          : "set the other sources to 0 while reading zeros",
      );
      continue;
    }
    out.push({ probe: p, text: s.text, span: s.span });
  }
  return out;
}
