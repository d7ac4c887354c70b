/**
 * Value places: which units each place of a value accepts (a part's value, an option, a frequency,
 * a limit…), and the message when a number's unit does not fit its place.
 */
import { UNIT_NAMES, UNIT_SYMBOLS, type Unit } from "./numbers";

/** What a place accepts: the units allowed besides none. */
export type Place = keyof typeof PLACES;

const PLACES = {
  resistor: ["ohm"],
  capacitor: ["F"],
  inductor: ["H"],
  vsource: ["V"],
  isource: ["A"],
  vcvs: [],
  vccs: ["S"],
  ccvs: ["ohm"],
  cccs: [],
  opamp: [],
  diode: [],
  is: ["A"],
  n: [],
  swing: ["V"],
  tol: ["%"],
  phase: ["deg"],
  gain: ["dB"],
  gbw: ["Hz"],
  rout: ["ohm"],
  pole2: ["Hz"],
  en: ["V"],
  in: ["A"],
  fc: ["Hz"],
  frequency: ["Hz"],
  level: ["dB", "deg"],
  count: [],
  any: ["ohm", "F", "H", "V", "A", "S", "Hz", "%", "deg"],
  limit: ["Hz", "dB", "deg", "V", "A", "%"],
} as const satisfies Record<string, readonly Unit[]>;

/** Plain words for a place, used in "… takes …" messages. */
const PLACE_WORDS: Record<Place, string> = {
  resistor: "a resistor's value is in ohms",
  capacitor: "a capacitor's value is in farads",
  inductor: "an inductor's value is in henries",
  vsource: "a voltage source's amplitude is in volts",
  isource: "a current source's amplitude is in amperes",
  vcvs: "a voltage-controlled voltage source's gain has no unit",
  vccs: "a transconductance is in siemens",
  ccvs: "a transresistance is in ohms",
  cccs: "a current gain has no unit",
  opamp: "an opamp takes no value",
  diode: "a diode takes no value (its options are is= and n=)",
  is: "a saturation current is in amperes",
  n: "an emission coefficient has no unit",
  swing: "an output swing is in volts",
  tol: "a tolerance is a percentage or a fraction",
  phase: "a phase is in degrees",
  gain: "a gain is a plain number or in dB",
  gbw: "a gain-bandwidth product is in hertz",
  rout: "an output resistance is in ohms",
  pole2: "a second pole is a frequency in hertz",
  en: "a noise voltage density is in volts per root hertz (write 10n or 10nV)",
  in: "a noise current density is in amperes per root hertz (write 1p or 1pA)",
  fc: "a 1/f noise corner is a frequency in hertz",
  frequency: "a frequency is in hertz",
  level: "a level is a magnitude, a dB value or a phase in degrees",
  count: "a count is a plain whole number",
  any: "this value",
  limit: "a limit is in Hz, dB, degrees, volts or a plain number",
};

/** Null when `unit` fits `place`, else a message and a hint. */
export function unitMismatch(unit: Unit | null, place: Place): { message: string; hint: string } | null {
  if (unit === null || (PLACES[place] as readonly Unit[]).includes(unit)) return null;
  const allowed = PLACES[place] as readonly Unit[];
  const hint =
    allowed.length === 0
      ? "write the number without a unit"
      : `write it without a unit or in ${allowed.map((u) => UNIT_SYMBOLS[u]).join(" or ")}`;
  return { message: `${PLACE_WORDS[place]}, not in ${UNIT_NAMES[unit]}`, hint };
}
