/** Parsers of the study statements: `vary` and `monte-carlo`. */
import type { Statement } from "./ast";
import { type Cursor, list, spanBetween, spanOf, words } from "./cursor";
import { didYouMean } from "./hints";

/** `vary NAME over V1, V2, …` or `vary NAME from A to B log|linear N points`. */
export function parseVary(c: Cursor): Statement | null {
  const usage = "vary Rf over 20k, 22k, 24k | vary C from 1n to 100n log 9 points";
  const target = c.expectName("a let or part name", true, usage);
  if (target === null) return null;
  const mode = c.peek();
  if (mode?.text === "over") {
    c.next();
    const values = list(c, "any", "a value");
    return values && c.expectEnd(usage) ? { type: "vary", target, values, span: c.span } : null;
  }
  if (mode?.text !== "from") {
    return c.fail(
      mode,
      mode ? `expected \`over\` or \`from\`, found \`${mode.text}\`` : "expected `over` or `from`",
      usage,
    );
  }
  c.next();
  const from = c.value("any", "the first value");
  if (from === null || !words(c, ["to"], usage)) return null;
  const to = c.value("any", "the last value");
  if (to === null) return null;
  const spacing = c.peek();
  if (spacing?.text !== "log" && spacing?.text !== "linear") {
    return c.fail(spacing, "expected `log` or `linear`", usage);
  }
  c.next();
  const count = c.value("count", "the number of values");
  if (count === null || !words(c, ["points"], usage) || !c.expectEnd(usage)) return null;
  return {
    type: "vary",
    target,
    values: { mode: spacing.text as "log" | "linear", from, to, count },
    span: c.span,
  };
}

/** `monte-carlo N [seed=S] [dist=uniform|normal]` */
export function parseMonteCarlo(c: Cursor): Statement | null {
  const usage = "monte-carlo 500 seed=7 dist=normal";
  const samples = c.value("count", "the number of samples");
  if (samples === null) return null;
  const s: Statement = { type: "monte-carlo", samples, span: c.span };
  while (!c.atEnd()) {
    const key = c.peek()!;
    if (!(key.kind === "word" && c.isOp("=", 1)))
      return c.fail(spanOf(key), `unexpected \`${key.text}\``, usage);
    c.next();
    c.next();
    if (key.text === "seed") {
      const seed = c.value("count", "the seed");
      if (seed === null) return null;
      s.seed = seed;
    } else if (key.text === "dist") {
      const dist = c.expectName("uniform or normal", false, usage);
      if (dist === null) return null;
      if (dist.name !== "uniform" && dist.name !== "normal") {
        return c.fail(
          dist.span,
          `unknown distribution \`${dist.name}\``,
          didYouMean(dist.name, ["uniform", "normal"]) ?? "dist=uniform or dist=normal",
        );
      }
      s.dist = dist;
    } else {
      return c.fail(
        spanOf(key),
        `unknown option \`${key.text}\``,
        didYouMean(key.text, ["seed", "dist"]) ?? usage,
      );
    }
  }
  s.span = spanBetween(s.span, c.span);
  return s;
}
