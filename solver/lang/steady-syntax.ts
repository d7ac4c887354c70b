/** Parsers of `temperature VALUE` and `steady LOOP [harmonics=N] [from=LEVEL]` (NETLIST.md). */
import { ZERO_CELSIUS } from "../physics";
import type { Statement, ValueNode } from "./ast";
import { type Cursor, spanBetween, spanOf } from "./cursor";
import { didYouMean } from "./hints";

const TEMPERATURE_USAGE = "temperature 27C | temperature 300.15K | temperature -40C";
/** Highest temperature accepted, kelvin (far beyond any part's rating; catches 27K for 27C). */
const MAX_KELVIN = 1000;

/** `temperature 27C` / `300.15K` / `-40°C`: the unit is required (a bare number is ambiguous). */
export function parseTemperature(c: Cursor): Statement | null {
  const first = c.peek();
  let sign = 1;
  if (first?.kind === "op" && (first.text === "-" || first.text === "+")) {
    sign = first.text === "-" ? -1 : 1;
    c.next();
  }
  const t = c.peek();
  if (t?.kind !== "number")
    return c.fail(
      t,
      t ? `expected a temperature, found \`${t.text}\`` : "the temperature is missing",
      TEMPERATURE_USAGE,
    );
  c.next();
  const span = first ? spanBetween(spanOf(first), spanOf(t)) : spanOf(t);
  const m = /^([0-9]*\.?[0-9]+(?:[eE][+-]?[0-9]+)?)(°?C|K)?$/.exec(t.text);
  if (m === null) return c.fail(t, `\`${t.text}\` is not a temperature`, TEMPERATURE_USAGE);
  if (m[2] === undefined)
    return c.fail(
      t,
      "a temperature needs its unit",
      `write ${t.text}C for degrees Celsius or ${t.text}K for kelvin`,
    );
  const value = sign * Number(m[1]);
  const kelvin = Number((m[2] === "K" ? value : value + ZERO_CELSIUS).toPrecision(12));
  if (!(kelvin > 0)) return c.fail(span, "a temperature must be above absolute zero (0 K, −273.15 °C)");
  if (kelvin > MAX_KELVIN)
    return c.fail(span, `a temperature above ${MAX_KELVIN} K is out of range`, TEMPERATURE_USAGE);
  return c.expectEnd(TEMPERATURE_USAGE) ? { type: "temperature", kelvin, span: c.span } : null;
}

const STEADY_USAGE = "steady T harmonics=15 from=1uV";

export function parseSteady(c: Cursor): Statement | null {
  const loop = c.expectName("a loop name", false, STEADY_USAGE);
  if (loop === null) return null;
  const s: Extract<Statement, { type: "steady" }> = { type: "steady", loop, span: c.span };
  while (!c.atEnd()) {
    const key = c.peek()!;
    if (!(key.kind === "word" && c.isOp("=", 1)))
      return c.fail(spanOf(key), `unexpected \`${key.text}\``, STEADY_USAGE);
    c.next();
    c.next();
    let v: ValueNode | null;
    if (key.text === "harmonics") {
      v = c.value("count", "the number of harmonics");
      if (v === null) return null;
      s.harmonics = v;
    } else if (key.text === "from") {
      v = c.value("swing", "the start level");
      if (v === null) return null;
      s.from = v;
    } else {
      return c.fail(
        spanOf(key),
        `unknown option \`${key.text}\``,
        didYouMean(key.text, ["harmonics", "from"]) ?? STEADY_USAGE,
      );
    }
  }
  s.span = spanBetween(s.span, c.span);
  return s;
}
