/** Resolution of sweep, show and loop statements against the flattened circuit. */
import { exactCutAt, inexactCutMessage } from "../engine/loops";
import type { LoopCut, LoopMethod, Part, Probe, Show, SourceSpan, Sweep } from "../types";
import type { Named, ProbeNode, SweepNode } from "./ast";
import { didYouMean } from "./hints";
import { MAX_POINTS } from "./kinds";
import { claim, count, type DirectiveContext, err, frequency, type Of } from "./resolve";

const DEFAULT_SWEEP: Sweep = { kind: "log", start: 10, stop: 10e6, perDecade: 100 };

/** The sweep (or the default, 10 Hz … 10 MHz at 100 per decade); at most MAX_POINTS points. */
export function resolveSweep(
  statement: Of<"sweep"> | undefined,
  ctx: DirectiveContext,
): { sweep: Sweep; defaultSweep: boolean } {
  // The note about the default sweep is added by the engine when it reports `defaultSweep`.
  if (statement === undefined) {
    return { sweep: DEFAULT_SWEEP, defaultSweep: true };
  }
  const s = statement.sweep;
  const resolved = sweepOf(s, ctx, statement.span);
  return { sweep: resolved ?? DEFAULT_SWEEP, defaultSweep: false };
}

function sweepOf(s: SweepNode, ctx: DirectiveContext, span: SourceSpan): Sweep | null {
  if (s.kind === "list") {
    const values = s.points.map((p) => frequency(ctx, p));
    if (values.some((v) => v === null)) return null;
    const points = [...new Set(values as number[])].sort((a, b) => a - b);
    if (points.length > MAX_POINTS) return err(ctx, span, `a sweep has at most ${MAX_POINTS} points`);
    return { kind: "list", points };
  }
  const start = frequency(ctx, s.start);
  const stop = frequency(ctx, s.stop);
  const n = count(
    ctx,
    s.kind === "log" ? s.perDecade : s.points,
    s.kind === "log" ? "points per decade" : "the number of points",
    s.kind === "log" ? 1 : 2,
    MAX_POINTS,
  );
  if (start === null || stop === null || n === null) return null;
  if (!(stop > start))
    return err(
      ctx,
      s.stop.span,
      "the sweep must end above its start",
      `swap them: sweep ${stop} to ${start} …`,
    );
  const total = s.kind === "log" ? Math.ceil(n * Math.log10(stop / start) - 1e-9) + 1 : n;
  if (total > MAX_POINTS) {
    return err(
      ctx,
      span,
      `this sweep has ${total} points; the limit is ${MAX_POINTS}`,
      "use fewer points per decade or a narrower range",
    );
  }
  return s.kind === "log"
    ? { kind: "log", start, stop, perDecade: n }
    : { kind: "linear", start, stop, points: n };
}

function node(ctx: DirectiveContext, n: Named): string | null {
  if (n.name === "gnd") return "gnd";
  if (ctx.nodes.has(n.name)) return n.name;
  const alias = ctx.aliases.get(n.name);
  if (alias !== undefined) return alias;
  const hint =
    didYouMean(n.name, ctx.nodes) ??
    (/^gnd$/i.test(n.name) || n.name === "ground" ? "ground is `gnd`" : undefined);
  return err(ctx, n.span, `no node named \`${n.name}\``, hint);
}

function part(ctx: DirectiveContext, n: Named): Part | null {
  const found = ctx.parts.find((p) => p.name === n.name);
  if (found) return found;
  return err(
    ctx,
    n.span,
    `no part named \`${n.name}\``,
    didYouMean(
      n.name,
      ctx.parts.map((p) => p.name),
    ),
  );
}

export function probe(ctx: DirectiveContext, p: ProbeNode): Probe | null {
  switch (p.op) {
    case "num":
      return { op: "num", value: p.value };
    case "v": {
      const a = node(ctx, p.node);
      const b = p.ref ? node(ctx, p.ref) : undefined;
      if (a === null || b === null) return null;
      return b === undefined ? { op: "v", node: a } : { op: "v", node: a, ref: b };
    }
    case "i": {
      const found = part(ctx, p.part);
      if (found === null) return null;
      if (found.kind === "opamp")
        return err(
          ctx,
          p.part.span,
          "amps() reads parts with two terminals and sources, not an opamp",
          "read the current of a part in series with the output",
        );
      return { op: "i", part: found.name };
    }
    case "neg": {
      const arg = probe(ctx, p.arg);
      return arg && { op: "neg", arg };
    }
    default: {
      const left = probe(ctx, p.left);
      const right = probe(ctx, p.right);
      return left && right && { op: p.op, left, right };
    }
  }
}

export function resolveShows(
  list: Of<"show">[],
  ctx: DirectiveContext,
  traces: Map<string, SourceSpan>,
): Show[] {
  const out: Show[] = [];
  for (const s of list) {
    if (!claim(ctx, traces, s.name, "trace")) continue;
    const p = probe(ctx, s.probe);
    if (p) out.push({ name: s.name.name, probe: p, text: s.text, span: s.span });
  }
  return out;
}

export function resolveLoops(
  list: Of<"loop">[],
  ctx: DirectiveContext,
  traces: Map<string, SourceSpan>,
): LoopCut[] {
  const out: LoopCut[] = [];
  for (const l of list) {
    if (!claim(ctx, traces, l.name, "trace")) continue;
    const at = node(ctx, l.node);
    if (at === "gnd")
      err(
        ctx,
        l.node.span,
        "gnd can't be cut",
        "cut the node where the loop's signal leaves the driving stage",
      );
    const before: string[] = [];
    for (const b of l.before) {
      const p = part(ctx, b);
      if (p !== null && before.includes(p.name)) continue; // listed twice: once is enough
      if (p === null || at === null) continue;
      if (!p.nodes.includes(at)) {
        err(ctx, b.span, `\`${p.name}\` does not touch node \`${at}\``, `list parts connected to ${at}`);
        continue;
      }
      before.push(p.name);
    }
    if (at === null || at === "gnd" || before.length !== new Set(l.before.map((b) => b.name)).size) continue;
    const method = (l.method?.name ?? "cut") as LoopMethod;
    const moved = new Set(before);
    if (method === "injection") {
      if (!ctx.parts.some((p) => !moved.has(p.name) && p.nodes.includes(at))) {
        err(
          ctx,
          l.node.span,
          `every part on \`${at}\` is listed, so nothing drives the loop there`,
          "list only the parts the loop's signal flows into; the driving stage stays off the list",
        );
        continue;
      }
    } else if (!exactCutAt(ctx.parts, at, moved)) {
      // The engine gives the same warning (for circuits built without the language) and says it once.
      ctx.warnings.push({ line: l.span.line, message: inexactCutMessage(l.name.name, at) });
    }
    out.push({ name: l.name.name, node: at, before, ...(l.method ? { method } : {}), span: l.span });
  }
  return out;
}
