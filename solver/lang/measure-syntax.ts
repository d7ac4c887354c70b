/** Parsers of `measure` and `check` statements. */
import type { MeasureFunction } from "../types";
import type { LevelNode, Statement, ValueNode } from "./ast";
import { type Cursor, spanOf, words } from "./cursor";
import { didYouMean } from "./hints";
import { MEASURE_FUNCTIONS } from "./kinds";
import { parseReading } from "./probe";

/** Steady measures that read a probe rather than a trace: `amplitude(volts(out))`. */
const PROBE_FUNCTIONS = new Set<MeasureFunction>(["amplitude", "thd"]);

const AT_FUNCTIONS = new Set<MeasureFunction>(["mag", "db", "phase", "group-delay", "noise", "input-noise"]);
/** Functions that also integrate over a band: `noise(N) from F1 to F2`. */
const BAND_FUNCTIONS = new Set<MeasureFunction>(["noise", "input-noise"]);

export function parseMeasure(c: Cursor): Statement | null {
  const name = c.expectName("a measure name", false, "measure f0 = zero-phase(T)");
  if (
    name === null ||
    c.expectOp("=", "expected `=` after the measure name", "measure f0 = zero-phase(T)") === null
  )
    return null;
  const fnTok = c.peek();
  const fnName = c.expectName("a measure function", false, `functions: ${MEASURE_FUNCTIONS.join(", ")}`);
  if (fnName === null || fnTok === undefined) return null;
  const fn = MEASURE_FUNCTIONS.find((f) => f === fnName.name);
  if (fn === undefined) {
    return c.fail(
      fnName.span,
      `unknown measure function \`${fnName.name}\``,
      didYouMean(fnName.name, MEASURE_FUNCTIONS) ?? `functions: ${MEASURE_FUNCTIONS.join(", ")}`,
    );
  }
  const usage =
    fn === "crossing" ? "crossing(T, -3dB)" : AT_FUNCTIONS.has(fn) ? `${fn}(T) at 1kHz` : `${fn}(T)`;
  if (c.expectOp("(", `expected \`(\` after ${fn}`, usage) === null) return null;
  if (PROBE_FUNCTIONS.has(fn)) {
    const probeUsage = `${fn}(volts(out)), ${fn}(volts(a, b)) or ${fn}(amps(R1))`;
    const first = c.peek();
    const probe = parseReading(c, probeUsage);
    if (probe === null || first === undefined) return null;
    const text = c.rawFrom(first).replace(/\)\s*$/, "");
    if (c.expectOp(")", "expected `)`", probeUsage) === null || !c.expectEnd()) return null;
    return { type: "measure", name, fn, target: { name: text, span: probe.span }, probe, span: c.span };
  }
  const target = c.expectName("a trace or loop name", false, usage);
  if (target === null) return null;
  let level: LevelNode | undefined;
  if (c.isOp(",")) {
    c.next();
    if (fn !== "crossing" && fn !== "bandwidth") return c.fail(c.peek(), `${fn} takes one trace`, usage);
    const parsed = parseLevel(c);
    if (parsed === null) return null;
    level = parsed;
  } else if (fn === "crossing") {
    return c.fail(
      c.peek(),
      "crossing needs a level",
      "crossing(T, -3dB), crossing(T, 0.5), crossing(T, -45deg) or crossing(T, half-power)",
    );
  }
  if (c.expectOp(")", "expected `)`", usage) === null) return null;
  let at: ValueNode | undefined;
  let band: { from: ValueNode; to: ValueNode } | undefined;
  const bandUsage = `${fn}(N) at 1kHz | ${fn}(N) from 20Hz to 20kHz`;
  if (c.isWord("at")) {
    const atTok = c.next()!;
    if (!AT_FUNCTIONS.has(fn))
      return c.fail(
        spanOf(atTok),
        `${fn} takes no \`at\``,
        "only mag, db, phase, group-delay, noise and input-noise are read at a frequency",
      );
    const v = c.value("frequency", "a frequency or a measure name");
    if (v === null) return null;
    at = v;
  } else if (c.isWord("from") && BAND_FUNCTIONS.has(fn)) {
    c.next();
    const from = c.value("frequency", "the band's lower frequency");
    if (from === null || !words(c, ["to"], bandUsage)) return null;
    const to = c.value("frequency", "the band's upper frequency");
    if (to === null) return null;
    band = { from, to };
  } else if (AT_FUNCTIONS.has(fn)) {
    return c.fail(undefined, `${fn} needs a frequency`, BAND_FUNCTIONS.has(fn) ? bandUsage : usage);
  }
  if (!c.expectEnd()) return null;
  const s: Statement = { type: "measure", name, fn, target, span: c.span };
  if (level) s.level = level;
  if (at) s.at = at;
  if (band) s.band = band;
  return s;
}

function parseLevel(c: Cursor): LevelNode | null {
  const t = c.peek();
  if (t?.kind === "word" && t.text === "half-power") {
    c.next();
    return { level: { kind: "half-power" }, span: spanOf(t) };
  }
  const v = c.value("level", "a level");
  if (v === null) return null;
  if (v.kind !== "number")
    return c.fail(v.span, "a level is written literally", "e.g. -3dB, 0.5, -45deg or half-power");
  const kind = v.unit === "dB" ? "db" : v.unit === "deg" ? "deg" : "mag";
  if (kind === "mag" && v.value <= 0)
    return c.fail(v.span, "a magnitude level must be above zero", "for decibels write the unit: -3dB");
  return { level: { kind, value: v.value }, span: v.span };
}

export function parseCheck(c: Cursor): Statement | null {
  const first = c.peek();
  const usage = "check gain >= 1 | check f0 between 950Hz and 1.05kHz";
  const measure = c.expectName("a measure name", false, usage);
  if (measure === null || first === undefined) return null;
  const expression = c.rawFrom(first);
  const opTok = c.peek();
  if (opTok?.kind === "word" && opTok.text === "between") {
    c.next();
    const value = c.value("limit", "the lower limit");
    if (value === null || !words(c, ["and"], usage)) return null;
    const value2 = c.value("limit", "the upper limit");
    if (value2 === null || !c.expectEnd(usage)) return null;
    return { type: "check", measure, op: "between", value, value2, expression, span: c.span };
  }
  if (opTok?.kind !== "op" || !["<", "<=", ">", ">="].includes(opTok.text)) {
    return c.fail(
      opTok,
      opTok ? `expected <, <=, >, >= or between, found \`${opTok.text}\`` : "the comparison is missing",
      usage,
    );
  }
  c.next();
  const value = c.value("limit", "a limit");
  if (value === null || !c.expectEnd(usage)) return null;
  return {
    type: "check",
    measure,
    op: opTok.text as "<" | "<=" | ">" | ">=",
    value,
    expression,
    span: c.span,
  };
}
