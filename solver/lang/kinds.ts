/** What each part kind takes: terminals, value place, options, and a usage line for hints. */
import type { LoopMethod, MeasureFunction, PartKind } from "../types";
import type { Place } from "./places";

interface KindInfo {
  terminals: string[];
  /** Whether a value is required, optional (with a default) or not allowed. */
  value: "required" | "optional" | "none";
  defaultValue: number;
  options: Partial<Record<string, Place>>;
  usage: string;
}

const TOL = { tol: "tol" } as const;
const PHASE = { phase: "phase" } as const;

export const KINDS: Record<PartKind, KindInfo> = {
  resistor: {
    terminals: ["a", "b"],
    value: "required",
    defaultValue: 0,
    options: TOL,
    usage: "R1: resistor a b 10k",
  },
  capacitor: {
    terminals: ["a", "b"],
    value: "required",
    defaultValue: 0,
    options: TOL,
    usage: "C1: capacitor a b 10n",
  },
  inductor: {
    terminals: ["a", "b"],
    value: "required",
    defaultValue: 0,
    options: TOL,
    usage: "L1: inductor a b 1m",
  },
  vsource: {
    terminals: ["p", "n"],
    value: "optional",
    defaultValue: 1,
    options: PHASE,
    usage: "Vin: vsource in gnd 1",
  },
  isource: {
    terminals: ["p", "n"],
    value: "optional",
    defaultValue: 1,
    options: PHASE,
    usage: "I1: isource a gnd 1m",
  },
  vcvs: {
    terminals: ["p", "n", "cp", "cn"],
    value: "required",
    defaultValue: 0,
    options: {},
    usage: "Buf: vcvs out gnd a b 10",
  },
  vccs: {
    terminals: ["p", "n", "cp", "cn"],
    value: "required",
    defaultValue: 0,
    options: {},
    usage: "Gm: vccs out gnd a b 1m",
  },
  ccvs: {
    terminals: ["p", "n", "sense"],
    value: "required",
    defaultValue: 0,
    options: {},
    usage: "Zt: ccvs out gnd Vsense 1k",
  },
  cccs: {
    terminals: ["p", "n", "sense"],
    value: "required",
    defaultValue: 0,
    options: {},
    usage: "Mirror: cccs out gnd Vsense 2",
  },
  opamp: {
    terminals: ["in+", "in-", "out"],
    value: "none",
    defaultValue: 0,
    options: {
      gain: "gain",
      gbw: "gbw",
      rout: "rout",
      swing: "swing",
      pole2: "pole2",
      en: "en",
      in: "in",
      fc: "fc",
    },
    usage: "U1: opamp pos neg out gbw=1M",
  },
  diode: {
    terminals: ["anode", "cathode"],
    value: "none",
    defaultValue: 0,
    options: { is: "is", n: "n" },
    usage: "D1: diode a b is=1e-14 n=1",
  },
};

export const KIND_NAMES = Object.keys(KINDS) as PartKind[];

export function isPartKind(word: string): word is PartKind {
  return Object.hasOwn(KINDS, word);
}

export const KEYWORDS = [
  "title",
  "let",
  "block",
  "end",
  "preset",
  "sweep",
  "show",
  "loop",
  "measure",
  "check",
  "vary",
  "monte-carlo",
  "poles",
  "sensitivity",
  "noise",
  "zeros",
  "temperature",
  "steady",
];

/** The ways a loop gain is measured (`loop … method=…`); the first is the default. */
export const LOOP_METHODS: readonly LoopMethod[] = ["cut", "injection"];

export const MEASURE_FUNCTIONS: MeasureFunction[] = [
  "zero-phase",
  "crossing",
  "peak",
  "dip",
  "bandwidth",
  "q",
  "unity",
  "phase-margin",
  "gain-margin",
  "mag",
  "db",
  "phase",
  "group-delay",
  "noise",
  "input-noise",
  "frequency",
  "amplitude",
  "thd",
  "startup",
];

/** Measure functions of the steady oscillation (NETLIST.md "Steady oscillation"). */
export const STEADY_FUNCTIONS: ReadonlySet<MeasureFunction> = new Set([
  "frequency",
  "amplitude",
  "thd",
  "startup",
]);

/** The unit of each measure's result ("" for plain numbers). */
export function measureUnit(fn: MeasureFunction): "Hz" | "dB" | "deg" | "V" | "%" | "s" | "" {
  switch (fn) {
    case "amplitude":
      return "V";
    case "thd":
      return "%";
    case "startup":
      return "s";
    case "q":
    case "mag":
      return "";
    case "group-delay":
      return "s";
    case "noise":
    case "input-noise":
      return "V";
    case "db":
    case "gain-margin":
      return "dB";
    case "phase":
    case "phase-margin":
      return "deg";
    default:
      return "Hz";
  }
}

/** Largest number of sweep points (NETLIST.md "Sweep"). */
export const MAX_POINTS = 100_000;
/** Deepest nesting of block instances (NETLIST.md "Statements"). */
export const MAX_BLOCK_DEPTH = 16;
