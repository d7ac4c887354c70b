/**
 * Parsers of the analysis statements: sweep, show, loop, noise, zeros, poles, sensitivity (measure and
 * check in measure-syntax.ts, vary and monte-carlo in study-syntax.ts, steady in steady-syntax.ts).
 */
import type { Named, Statement, SweepNode } from "./ast";
import { type Cursor, list, spanOf, words } from "./cursor";
import { didYouMean } from "./hints";
import { LOOP_METHODS } from "./kinds";
import { parseCheck, parseMeasure } from "./measure-syntax";
import { parseProbe } from "./probe";
import { parseSteady, parseTemperature } from "./steady-syntax";
import { parseMonteCarlo, parseVary } from "./study-syntax";

/** Dispatch on the statement keyword at the cursor. */
export function parseAnalysis(c: Cursor): Statement | null {
  const keyword = c.next()!;
  switch (keyword.text) {
    case "sweep":
      return parseSweep(c);
    case "show":
      return parseShow(c);
    case "loop":
      return parseLoop(c);
    case "measure":
      return parseMeasure(c);
    case "check":
      return parseCheck(c);
    case "vary":
      return parseVary(c);
    case "monte-carlo":
      return parseMonteCarlo(c);
    case "poles":
      return c.expectEnd("`poles` takes nothing after it") ? { type: "poles", span: c.span } : null;
    case "temperature":
      return parseTemperature(c);
    case "steady":
      return parseSteady(c);
    case "sensitivity": {
      const measure = c.expectName("a measure name", false, "sensitivity f0");
      return measure && c.expectEnd("`sensitivity` takes one measure")
        ? { type: "sensitivity", measure, span: c.span }
        : null;
    }
    case "noise":
      return parseNoise(c);
    case "zeros": {
      const first = c.peek();
      if (first === undefined) return c.fail(undefined, "the probe is missing", "zeros volts(out)");
      const text = c.rawFrom(first);
      const probe = parseProbe(c);
      return probe && { type: "zeros", probe, text, span: c.span };
    }
    default:
      return c.fail(spanOf(keyword), `\`${keyword.text}\` can't be used here`);
  }
}

const SWEEP_FORMS =
  "sweep 10Hz to 1MHz log 100 per decade | sweep 1kHz to 20kHz linear 500 points | sweep at 50Hz, 1kHz";

function parseSweep(c: Cursor): Statement | null {
  if (c.isWord("at")) {
    c.next();
    const points = list(c, "frequency", "a frequency");
    return points && c.expectEnd() ? { type: "sweep", sweep: { kind: "list", points }, span: c.span } : null;
  }
  const start = c.value("frequency", "the start frequency");
  if (start === null || !words(c, ["to"], SWEEP_FORMS)) return null;
  const stop = c.value("frequency", "the stop frequency");
  if (stop === null) return null;
  const mode = c.peek();
  let sweep: SweepNode;
  if (mode?.text === "log") {
    c.next();
    const perDecade = c.value("count", "the points per decade");
    if (perDecade === null || !words(c, ["per", "decade"], SWEEP_FORMS)) return null;
    sweep = { kind: "log", start, stop, perDecade };
  } else if (mode?.text === "linear") {
    c.next();
    const points = c.value("count", "the number of points");
    if (points === null || !words(c, ["points"], SWEEP_FORMS)) return null;
    sweep = { kind: "linear", start, stop, points };
  } else {
    const hint =
      mode?.kind === "word" ? (didYouMean(mode.text, ["log", "linear"]) ?? SWEEP_FORMS) : SWEEP_FORMS;
    return c.fail(
      mode,
      mode ? `expected \`log\` or \`linear\`, found \`${mode.text}\`` : "expected `log` or `linear`",
      hint,
    );
  }
  return c.expectEnd(SWEEP_FORMS) ? { type: "sweep", sweep, span: c.span } : null;
}

/** `noise NAME = PROBE [input SOURCE]`. */
function parseNoise(c: Cursor): Statement | null {
  const hint = "noise N = volts(out) input Vin";
  const name = c.expectName("a noise name", false, hint);
  if (name === null || c.expectOp("=", "expected `=` after the noise name", hint) === null) return null;
  const first = c.peek();
  if (first === undefined) return c.fail(undefined, "the probe is missing", hint);
  const probe = parseProbe(c, "input");
  if (probe === null) return null;
  const text = c.rawFrom(first).replace(/\s+input\s.*$/, "");
  const s: Statement = { type: "noise", name, probe, text, span: c.span };
  if (c.isWord("input")) {
    c.next();
    const input = c.expectName("the input source's name", true, hint);
    if (input === null || !c.expectEnd(hint)) return null;
    s.input = input;
  }
  return s;
}

function parseShow(c: Cursor): Statement | null {
  let name: Named | null = null;
  if (c.isWord() && c.isOp("=", 1)) {
    name = c.expectName("a trace name");
    if (name === null) return null;
    c.next();
  }
  const first = c.peek();
  if (first === undefined)
    return c.fail(undefined, "the probe is missing", "show gain = volts(out) / volts(in)");
  const text = c.rawFrom(first);
  const probe = parseProbe(c);
  if (probe === null) return null;
  return { type: "show", name: name ?? { name: text, span: probe.span }, probe, text, span: c.span };
}

function parseLoop(c: Cursor): Statement | null {
  const hint = "loop T cut out before R1";
  const name = c.expectName("a loop name", false, hint);
  if (name === null || !words(c, ["cut"], hint)) return null;
  const node = c.expectNode("the node to cut", hint);
  if (node === null || !words(c, ["before"], hint)) return null;
  const before: Named[] = [];
  for (;;) {
    const part = c.expectName("a part name", true, hint);
    if (part === null) return null;
    before.push(part);
    if (!c.isOp(",")) break;
    c.next();
  }
  const s: Statement = { type: "loop", name, node, before, span: c.span };
  while (!c.atEnd()) {
    const key = c.peek()!;
    if (!(key.kind === "word" && c.isOp("=", 1))) {
      return c.fail(
        spanOf(key),
        `unexpected \`${key.text}\` at the end of the statement`,
        "list parts separated by commas: before R1,R2 — then options: method=injection",
      );
    }
    c.next();
    c.next();
    if (key.text !== "method") {
      return c.fail(
        spanOf(key),
        `unknown option \`${key.text}\``,
        didYouMean(key.text, ["method"]) ?? "loop T cut out before R1 method=injection",
      );
    }
    const method = c.expectName("cut or injection", false, "method=cut or method=injection");
    if (method === null) return null;
    if (!(LOOP_METHODS as readonly string[]).includes(method.name)) {
      return c.fail(
        method.span,
        `unknown loop method \`${method.name}\``,
        didYouMean(method.name, LOOP_METHODS) ?? "method=cut or method=injection",
      );
    }
    s.method = method;
  }
  return s;
}
