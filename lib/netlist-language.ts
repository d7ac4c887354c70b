/**
 * Language data of the netlist (NETLIST.md) for the browser editor: words to highlight and complete,
 * hover help, and a light scan of the names a netlist defines. Client-safe: no mathjs, no parser.
 * The kind table, statements and measure functions come from the solver's own lists.
 */
import { E_SERIES as SERIES_VALUES } from "@/solver/lang/eseries";
import { KEYWORDS, KINDS, MEASURE_FUNCTIONS, LOOP_METHODS as METHODS } from "@/solver/lang/kinds";
import type { LoopMethod, PartKind } from "@/solver/types";

export const LANGUAGE_ID = "phasewright-netlist";

export const STATEMENTS: string[] = [...KEYWORDS];
export const PART_KINDS = Object.keys(KINDS) as PartKind[];
export const MEASURE_FNS: string[] = [...MEASURE_FUNCTIONS];
export const LOOP_METHODS: LoopMethod[] = [...METHODS];
/** Words used inside statements (sweep, loop, check, vary, monte-carlo). */
export const SUB_KEYWORDS = [
  "to",
  "log",
  "linear",
  "per",
  "decade",
  "points",
  "at",
  "cut",
  "before",
  "between",
  "and",
  "over",
  "from",
];
export const PROBE_FNS = ["volts", "amps"];
export const EXPRESSION_FNS = ["sqrt", "log10", "exp", "snap", "abs", "pi", "e"];
export const LEVEL_WORDS = ["half-power"];
/** The series names `snap` takes (solver/lang/eseries.ts declares them). */
export const E_SERIES: string[] = Object.keys(SERIES_VALUES);
/** Every `key=` option of parts and statements. */
export const OPTIONS: Record<string, string> = {
  tol: "Tolerance of a resistor, capacitor or inductor: `tol=1%` or `tol=0.01`. Used by `monte-carlo`.",
  phase: "Phase of a `vsource` or `isource` in degrees (default 0): `phase=90`.",
  gain: "Open-loop DC gain A0 of an `opamp`: `gain=100k`.",
  gbw: "Gain-bandwidth of an `opamp` (single pole): `gbw=1MHz`. Alone it means A(s) = 2π·F/s.",
  rout: "Output resistance of an `opamp`: `rout=50`.",
  swing:
    "Output limit of an `opamp`: `swing=12V` keeps the output within ±12 V in the steady oscillation; small-signal analyses ignore it.",
  pole2:
    "Second pole of an `opamp` (needs `gbw` or `gain`): `pole2=20MHz` makes A(s) = A0/((1 + s·A0/ωT)(1 + s/(2π·F))) in every small-signal analysis.",
  en: "Input noise voltage density of an `opamp`, V/√Hz at in+: `en=4nV`.",
  in: "Input noise current density of an `opamp`, A/√Hz into each input: `in=0.5pA`.",
  fc: "1/f corner of an `opamp`'s `en` and `in`: density·√(1 + fc/f), `fc=20Hz`.",
  is: "Saturation current of a `diode` in amperes (default 1e-14): `is=2n`.",
  n: "Emission coefficient of a `diode` (default 1): `n=1.8`.",
  harmonics: "Harmonics of a `steady` analysis (default 15, at most 255): `harmonics=31`.",
  seed: "Random seed of `monte-carlo` (the same seed gives the same result): `seed=7`.",
  dist: "Distribution of `monte-carlo` samples: `dist=uniform` (within ±tol) or `dist=normal` (tol = 3σ).",
  method:
    "How a `loop` is measured: `method=cut` (default; exact only behind an ideal voltage output) or `method=injection` (double injection; includes the driver's loading).",
};

const LOOP_METHOD_DOCS: Record<LoopMethod, string> = {
  cut: "NODE′ is driven by an ideal 1∠0° source: exact when an ideal voltage output drives NODE (the default).",
  injection:
    "Double injection on the closed loop (a series voltage and a shunt current test at NODE): exact whatever drives NODE, including its output resistance.",
};
export const UNITS = ["Ω", "ohm", "F", "H", "V", "A", "S", "Hz", "%", "dB", "deg", "°"];

const KIND_DOCS: Record<PartKind, string> = {
  resistor: "Resistor between a and b; value in ohms.",
  capacitor: "Capacitor between a and b; value in farads.",
  inductor: "Inductor between a and b; value in henries.",
  vsource: "AC voltage source, p to n; value is the amplitude in volts (default 1), `phase=` in degrees.",
  isource: "AC current source; the current flows from p through the source to n. Amplitude in amperes.",
  vcvs: "Voltage-controlled voltage source: volts(p, n) = gain · volts(cp, cn).",
  vccs: "Voltage-controlled current source: gm · volts(cp, cn) flows from p through the part to n.",
  ccvs: "Current-controlled voltage source: volts(p, n) = r · amps(SENSE); SENSE is a vsource or inductor.",
  cccs: "Current-controlled current source: k · amps(SENSE) flows from p through the part to n.",
  opamp:
    "Operational amplifier, pins in+ in− out. Ideal without options; `gain=A0` finite gain, `gbw=F` single pole, `rout=R` output resistance, `pole2=F` second pole, `swing=V` output limit (steady oscillation only), noise `en=`, `in=`, `fc=`.",
  diode:
    "Diode, anode to cathode: i = is·(e^(v/(n·Vt)) − 1), Vt = kT/q at the netlist's `temperature`. Options `is=` (default 1e-14 A), `n=` (default 1). Practically open in small-signal analyses (unbiased).",
};

const STATEMENT_DOCS: Record<string, string> = {
  title:
    "`title TEXT` — the circuit's title (once): the rest of the line as written; `#` starts a comment, `\\#` writes a `#`.",
  let: "`let NAME = EXPR` — a named value; numbers with SI prefixes, earlier lets, `pi`, `sqrt`, `log10`, `exp`, `snap`.",
  block:
    "`block NAME(T1, T2, …) [key=default…]` … `end` — a reusable sub-network; address inner names as `X1.R1`.",
  end: "`end` — closes a `block`.",
  preset: "`preset NAME = KIND key=value…` — a named set of options, then used as a kind.",
  sweep:
    "`sweep 10Hz to 1MHz log 100 per decade` · `sweep 1kHz to 20kHz linear 500 points` · `sweep at 50Hz, 1kHz`. Default: 10 Hz to 10 MHz, 100 per decade.",
  show: "`show [NAME =] PROBE` — a complex trace over `volts(NODE)`, `volts(A, B)`, `amps(PART)` with + − * /.",
  loop: "`loop NAME cut NODE before PART[,PART…] [method=cut|injection]` — loop gain T (the returned signal per injected signal) at NODE, between the driver and the listed parts. `cut`: T = volts(NODE)/volts(NODE′) with the cut driven by 1∠0°; `injection`: double injection, exact whatever drives NODE.",
  measure:
    "`measure NAME = FUNCTION(TRACE…) [at F]` — a scalar result, refined by solving again at new frequencies.",
  check: "`check NAME OP VALUE` or `check NAME between A and B` — a pass/fail limit on a measure.",
  vary: "`vary NAME over V1, V2, …` or `vary NAME from A to B log N points` — re-solve per value of a let or part.",
  "monte-carlo":
    "`monte-carlo N [seed=S] [dist=uniform|normal]` — N random samples of every part with `tol`.",
  poles: "`poles` — natural frequencies of the network with its sources zeroed (f, Q, growth per cycle).",
  sensitivity: "`sensitivity MEASURE` — normalized sensitivity of a measure to each part value.",
  noise:
    "`noise NAME = volts(…) [input SOURCE]` — output noise density at every frequency, each resistor's and op-amp's share, input-referred with `input`; read it with `noise(NAME) at F` or `noise(NAME) from F1 to F2` (rms).",
  zeros:
    "`zeros PROBE` — finite zeros of the transfer from the netlist's one independent source to `volts(…)` or `amps(…)`, drawn with the poles.",
  temperature:
    "`temperature 27C` or `temperature 300.15K` — the temperature of diodes and noise (default 27 °C).",
  steady:
    "`steady LOOP [harmonics=N] [from=LEVEL]` — the periodic state the oscillator of LOOP settles into once its limiters act (harmonic balance): frequency, amplitude, waveform, distortion, start-up time.",
};

const FUNCTION_DOCS: Record<string, string> = {
  "zero-phase":
    "`zero-phase(X)` — first frequency where the phase of X crosses 0° (a ±180° wrap is not a crossing).",
  crossing:
    "`crossing(X, LEVEL)` — first frequency where |X| or ∠X crosses LEVEL: `-3dB`, `0.5`, `-45deg`, `half-power`.",
  peak: "`peak(X)` — frequency of the largest |X|.",
  dip: "`dip(X)` — frequency of the smallest |X|.",
  bandwidth:
    "`bandwidth(X[, LEVEL])` — width of the band around the peak above peak·LEVEL (default half-power).",
  q: "`q(X)` — peak frequency divided by bandwidth.",
  unity: "`unity(X)` — first frequency where |X| crosses 1.",
  "phase-margin": "`phase-margin(X)` — at unity(X), the angle between ∠X and 0° (0…180°).",
  "gain-margin": "`gain-margin(X)` — at zero-phase(X), −20·log10|X| in dB.",
  mag: "`mag(X) at F` — |X| at frequency F (a number or a measure's name).",
  db: "`db(X) at F` — 20·log10|X| at frequency F.",
  phase: "`phase(X) at F` — ∠X in degrees at frequency F.",
  "group-delay": "`group-delay(X) at F` — −d∠X/dω in seconds at F, exact from the solution's derivative.",
  "input-noise":
    "`input-noise(N) at F` or `input-noise(N) from F1 to F2` — noise N referred to its `input` source.",
  frequency: "`frequency(LOOP)` — frequency of the steady oscillation of LOOP (needs `steady LOOP`), Hz.",
  amplitude:
    "`amplitude(PROBE)` — peak amplitude of the fundamental of `volts(…)`/`amps(…)` in the steady oscillation.",
  thd: "`thd(PROBE)` — total harmonic distortion of the probe in the steady oscillation, percent.",
  startup:
    "`startup(LOOP)` — seconds for the small-signal envelope to grow from the `from=` level to the steady amplitude.",
  volts: "`volts(NODE)` or `volts(A, B)` — node voltage to `gnd`, or the voltage of A against B.",
  amps: "`amps(PART)` — current entering the part's first terminal and leaving its second.",
  gnd: "`gnd` — ground, the reference node (0 V) of every voltage.",
  snap: "`snap(E24, x)` — nearest IEC 60063 preferred value of the series (E6…E192) to x.",
  "half-power": "`half-power` — the level |X| = 1/√2 (−3.0103 dB).",
};

/** Markdown help for a word under the cursor, or null. */
export function hoverDoc(word: string): string | null {
  if (word in KINDS) {
    const k = KINDS[word as PartKind];
    return `**${word}** (part kind) — ${KIND_DOCS[word as PartKind]}\n\nTerminals: ${k.terminals.join(" ")}\n\n\`${k.usage}\``;
  }
  if (word in STATEMENT_DOCS) return `**${word}** (statement) — ${STATEMENT_DOCS[word]}`;
  if (word in FUNCTION_DOCS) return `**${word}** — ${FUNCTION_DOCS[word]}`;
  if (word in OPTIONS) return `**${word}=** (option) — ${OPTIONS[word]}`;
  if (word in LOOP_METHOD_DOCS)
    return `**method=${word}** (loop method) — ${LOOP_METHOD_DOCS[word as LoopMethod]}`;
  return null;
}

export function loopMethodDoc(method: LoopMethod): string {
  return LOOP_METHOD_DOCS[method];
}

export function kindDoc(kind: PartKind): string {
  return KIND_DOCS[kind];
}

export function statementDoc(word: string): string {
  return STATEMENT_DOCS[word] ?? "";
}

export function functionDoc(word: string): string {
  return FUNCTION_DOCS[word] ?? "";
}

/** Names a netlist defines, found by a light line scan (good enough for completion while typing). */
export interface NetlistNames {
  parts: string[];
  nodes: string[];
  lets: string[];
  traces: string[];
  measures: string[];
  presets: string[];
  blocks: string[];
}

const NAME = "[A-Za-z_][A-Za-z0-9_.]*";

export function collectNames(text: string): NetlistNames {
  const sets = {
    parts: new Set<string>(),
    nodes: new Set<string>(),
    lets: new Set<string>(),
    traces: new Set<string>(),
    measures: new Set<string>(),
    presets: new Set<string>(),
    blocks: new Set<string>(),
  };
  const partRe = new RegExp(`^\\s*(${NAME})\\s*:\\s*(${NAME})\\s*(.*)$`);
  for (const raw of text.split(/\r?\n/)) {
    const line = raw.replace(/#.*$/, "");
    const part = partRe.exec(line);
    if (part) {
      const [, name, kind, rest] = part;
      sets.parts.add(name!);
      const info = KINDS[kind as PartKind];
      const words = (rest ?? "").split(/\s+/).filter((w) => w && !w.includes("="));
      const count = info ? info.terminals.length - (kind === "ccvs" || kind === "cccs" ? 1 : 0) : 2;
      for (const w of words.slice(0, count)) if (/^[A-Za-z0-9_.]+$/.test(w) && w !== "gnd") sets.nodes.add(w);
      continue;
    }
    let m = new RegExp(`^\\s*let\\s+(${NAME})\\s*=`).exec(line);
    if (m) sets.lets.add(m[1]!);
    m = new RegExp(`^\\s*(?:show|loop)\\s+(${NAME})\\s*(?:=|cut\\b)`).exec(line);
    if (m) sets.traces.add(m[1]!);
    m = /^\s*show\s+([^=]+)$/.exec(line);
    if (m) sets.traces.add(m[1]!.trim());
    m = new RegExp(`^\\s*measure\\s+(${NAME})\\s*=`).exec(line);
    if (m) sets.measures.add(m[1]!);
    m = new RegExp(`^\\s*preset\\s+(${NAME})\\s*=`).exec(line);
    if (m) sets.presets.add(m[1]!);
    m = new RegExp(`^\\s*block\\s+(${NAME})\\s*\\(`).exec(line);
    if (m) sets.blocks.add(m[1]!);
  }
  return {
    parts: [...sets.parts],
    nodes: ["gnd", ...[...sets.nodes].filter((n) => n !== "gnd")],
    lets: [...sets.lets],
    traces: [...sets.traces],
    measures: [...sets.measures],
    presets: [...sets.presets],
    blocks: [...sets.blocks],
  };
}

/** What fits where the cursor is, judged from the text of the line before it. */
export type CompletionContext =
  | "statement" // start of a line
  | "kind" // after `NAME:`
  | "node" // inside volts( … )
  | "part" // inside amps( … ), after `before`
  | "trace" // inside a measure function's parentheses
  | "function" // after `measure NAME =`
  | "measure" // after `check`, `sensitivity`, `at`
  | "option" // later on a part line
  | "loop-option" // after a loop's list of parts
  | "loop-method" // after `method=` on a loop line
  | "any";

export function completionContext(before: string): CompletionContext {
  const line = before.replace(/#.*$/, "");
  if (/^\s*[A-Za-z_]*$/.test(line)) return "statement";
  if (/^\s*loop\b.*\bmethod=\w*$/.test(line)) return "loop-method";
  if (/^\s*loop\b.*\bbefore\s+[\w.]+(?:\s*,\s*[\w.]+)*\s+\w*$/.test(line)) return "loop-option";
  if (new RegExp(`^\\s*${NAME}\\s*:\\s*[A-Za-z_]*$`).test(line)) return "kind";
  if (/\bvolts\(\s*[^()]*$/.test(line)) return "node";
  if (/\bamps\(\s*[^()]*$/.test(line) || /\bbefore\s+[\w,\s]*$/.test(line)) return "part";
  if (/^\s*measure\s+\w+\s*=\s*[\w-]+\(\s*[^()]*$/.test(line)) return "trace";
  if (/^\s*measure\s+\w+\s*=\s*[\w-]*$/.test(line)) return "function";
  if (/^\s*(check|sensitivity)\s+\w*$/.test(line) || /\bat\s+\w*$/.test(line)) return "measure";
  if (/^\s*loop\s+\w+\s+cut\s+\w*$/.test(line)) return "node";
  if (new RegExp(`^\\s*${NAME}\\s*:`).test(line)) return "option";
  return "any";
}
