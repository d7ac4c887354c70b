/**
 * Number literals: `12`, `1.5e-3`, SI prefixes (f p n u µ m k M G T), units, IEC 60062 codes
 * (`4k7`, `2R2`, `1n5`, `R47`), and the places where each unit fits.
 */
import { nearest } from "./hints";
import { table } from "./table";

export type Unit = "ohm" | "F" | "H" | "V" | "A" | "S" | "Hz" | "%" | "dB" | "deg";

/** A value with its scale applied (`%` already divided by 100); `unit` is null when none was written. */
interface NumberValue {
  value: number;
  unit: Unit | null;
}

/** A failed read may say what to write instead (`replacement`, the whole number as it should be). */
type NumberResult =
  | ({ ok: true } & NumberValue)
  | { ok: false; message: string; hint?: string; replacement?: string };

const PREFIXES = table<number>({
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  "\u00B5": 1e-6, // micro sign
  "\u03BC": 1e-6, // Greek small mu
  m: 1e-3,
  k: 1e3,
  M: 1e6,
  G: 1e9,
  T: 1e12,
});

const UNITS = table<Unit>({
  "\u03A9": "ohm", // Greek capital omega
  "\u2126": "ohm", // ohm sign
  ohm: "ohm",
  ohms: "ohm",
  Ohm: "ohm",
  F: "F",
  H: "H",
  V: "V",
  A: "A",
  S: "S",
  Hz: "Hz",
  "%": "%",
  dB: "dB",
  deg: "deg",
  "°": "deg",
});

/** Written units that are not accepted, with what to write instead. */
const MISSPELLED = table<string>({
  hz: "write Hz",
  HZ: "write Hz",
  db: "write dB",
  DB: "write dB",
  Db: "write dB",
  K: "write k for kilo; M is mega, m is milli",
  U: "write u or µ for micro",
  N: "write n for nano",
  P: "write p for pico",
  sec: "time values have no place in a netlist: give frequencies in Hz",
  s: "time values have no place in a netlist: give frequencies in Hz",
});

/** Human names of units, for messages. */
export const UNIT_NAMES: Record<Unit, string> = {
  ohm: "ohms",
  F: "farads",
  H: "henries",
  V: "volts",
  A: "amperes",
  S: "siemens",
  Hz: "hertz",
  "%": "percent",
  dB: "decibels",
  deg: "degrees",
};

/** How each unit is written. */
export const UNIT_SYMBOLS: Record<Unit, string> = {
  ohm: "Ω",
  F: "F",
  H: "H",
  V: "V",
  A: "A",
  S: "S",
  Hz: "Hz",
  "%": "%",
  dB: "dB",
  deg: "deg",
};

const IEC = /^([0-9]*)([fpnu\u00B5\u03BCmkMGTR])([0-9]*)(.*)$/;

/** Read a number token's text (no sign). Never throws. */
export function parseNumberText(text: string): NumberResult {
  let digitsEnd = 0;
  while (isDigitCode(text.charCodeAt(digitsEnd))) digitsEnd++;
  const end = mantissaEnd(text, digitsEnd);
  const mantissa = text.slice(0, end);
  const suffix = text.slice(end);
  // IEC 60062: the prefix letter (or R) stands for the decimal point: 4k7, 2R2, 1n5, R47, 10R.
  // Only a letter followed by a digit, or R, can make one (the regex below is skipped otherwise).
  if (end === digitsEnd && suffix !== "" && (suffix[0] === "R" || isDigitCode(suffix.charCodeAt(1)))) {
    const iec = IEC.exec(text);
    const [, whole = "", letter = "", fraction = "", unitText = ""] = iec ?? [];
    if (
      iec &&
      (fraction !== "" || letter === "R") &&
      (whole !== "" || letter === "R") &&
      whole + fraction !== ""
    ) {
      const scale = letter === "R" ? 1 : (PREFIXES[letter] ?? 1);
      const unit = readUnit(unitText);
      if (!unit.ok) return unit;
      if (unit.unit === "%" || unit.unit === "dB" || unit.unit === "deg") {
        return { ok: false, message: `a letter-for-decimal-point code can't carry ${UNIT_NAMES[unit.unit]}` };
      }
      const value = Number(`${whole || "0"}.${fraction || "0"}`) * scale;
      return { ok: true, value: Number(value.toPrecision(15)), unit: unit.unit };
    }
  }
  const base = Number(mantissa);
  if (mantissa === "" || !Number.isFinite(base)) {
    return { ok: false, message: `\`${text}\` is not a number` };
  }
  if (suffix === "") return { ok: true, value: base, unit: null };
  // The unit tables are read directly (not through readUnit): a failed read would build its message.
  const whole = UNITS[suffix];
  if (whole !== undefined) return { ok: true, value: scaleUnit(base, whole), unit: whole };
  const prefix = PREFIXES[suffix[0] ?? ""];
  if (prefix !== undefined) {
    const restText = suffix.slice(1);
    const rest = restText === "" ? null : UNITS[restText];
    if (rest !== undefined) {
      if (rest === "%" || rest === "dB" || rest === "deg") {
        return { ok: false, message: `no prefix may stand before ${UNIT_NAMES[rest]}` };
      }
      return { ok: true, value: withPrefix(base, prefix), unit: rest };
    }
  }
  return badSuffix(text, suffix);
}

const isDigitCode = (k: number) => k >= 48 && k <= 57;

/**
 * `base` times a prefix's `scale`, rounded to 15 significant digits (`4.7k` is 4700, not
 * 4700.000000000001). A whole `base` below 10^15 skips the rounding, which is the slow part of
 * reading a number in a fresh process (a string made and read back): its exact product has at most
 * 15 significant digits, the product as computed is within a few units in the last place of it, so
 * the rounding gives that exact product back, read as the double nearest to it — which the product
 * is for a scale of 10^3…10^12 (exact in binary), and the quotient by the exact 10^3…10^15 is for
 * the smaller scales (IEEE 754 rounds each operation correctly).
 */
function withPrefix(base: number, scale: number): number {
  if (Number.isInteger(base) && base < 1e15) {
    if (scale >= 1) return base * scale;
    const divisor = DIVISORS.get(scale);
    if (divisor !== undefined) return base / divisor;
  }
  return Number((base * scale).toPrecision(15));
}

/** The powers of ten the prefixes below 1 divide by. */
const DIVISORS = new Map([
  [1e-3, 1e3],
  [1e-6, 1e6],
  [1e-9, 1e9],
  [1e-12, 1e12],
  [1e-15, 1e15],
]);

/**
 * Where the mantissa of `text` ends, as the pattern `[0-9]*\.?[0-9]*(?:[eE][+-]?[0-9]+)?` at its
 * start would match it; `i` is past its leading digits. A scan by char code: it runs once per number.
 */
function mantissaEnd(text: string, digitsEnd: number): number {
  let i = digitsEnd;
  if (text.charCodeAt(i) === 46 /* . */) {
    i++;
    while (isDigitCode(text.charCodeAt(i))) i++;
  }
  const e = text.charCodeAt(i);
  if (e === 101 || e === 69 /* e E */) {
    const s = text.charCodeAt(i + 1);
    let j = s === 43 || s === 45 /* + - */ ? i + 2 : i + 1;
    if (isDigitCode(text.charCodeAt(j))) {
      while (isDigitCode(text.charCodeAt(j))) j++;
      i = j;
    }
  }
  return i;
}

function scaleUnit(value: number, unit: Unit | null): number {
  return unit === "%" ? Number((value / 100).toPrecision(15)) : value;
}

function readUnit(
  text: string,
): { ok: true; unit: Unit | null } | { ok: false; message: string; hint?: string } {
  if (text === "") return { ok: true, unit: null };
  const unit = UNITS[text];
  return unit === undefined ? { ok: false, message: `unknown unit \`${text}\`` } : { ok: true, unit };
}

function badSuffix(text: string, suffix: string): NumberResult {
  const lower = suffix.toLowerCase();
  if (lower.startsWith("meg")) {
    return {
      ok: false,
      message: `\`${text}\`: "meg" is not a prefix here`,
      hint: "write 1M for mega; M is mega, m is milli",
      replacement: `${text.slice(0, text.length - suffix.length)}M${suffix.slice(3)}`,
    };
  }
  if (lower.startsWith("mil")) {
    return {
      ok: false,
      message: `\`${text}\`: "mil" is not a prefix here`,
      hint: "write m for milli (1m = 0.001); lengths have no place in a netlist",
    };
  }
  const known = MISSPELLED[suffix] ?? MISSPELLED[suffix.slice(1)] ?? MISSPELLED[suffix[0] ?? ""];
  if (known !== undefined)
    return { ok: false, message: `\`${text}\`: unknown prefix or unit \`${suffix}\``, hint: known };
  const spellings = [...Object.keys(UNITS)];
  for (const p of Object.keys(PREFIXES))
    for (const u of ["Ω", "ohm", "F", "H", "V", "A", "S", "Hz"]) spellings.push(p + u);
  const guess = nearest(suffix, spellings);
  return {
    ok: false,
    message: `\`${text}\`: unknown prefix or unit \`${suffix}\``,
    hint: guess
      ? `did you mean \`${guess}\`?`
      : "prefixes are f p n u µ m k M G T; units Ω F H V A S Hz % dB deg",
  };
}
