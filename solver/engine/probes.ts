import { GROUND, type Probe } from "../types";
import type { AcSolver } from "./ac";
import type { MnaSystem } from "./mna";

/** A complex value and its derivative with respect to s (complex frequency). */
export interface Dual {
  re: number;
  im: number;
  dRe: number;
  dIm: number;
  /**
   * The size of the derivative's terms before they were added up: the sum of |term| over every
   * term that went into dRe and dIm (|re| + |im| for complex ones). Rounding leaves an error of a
   * few ε times this, so a derivative far below it is cancellation noise (`groupDelayOf`).
   * Absent: not tracked.
   */
  dAbs?: number;
}

const dual = (re: number, im: number, dRe = 0, dIm = 0, dAbs = Math.abs(dRe) + Math.abs(dIm)): Dual => ({
  re,
  im,
  dRe,
  dIm,
  dAbs,
});

/** |re| + |im|: a bound on a complex value's modulus, within √2 of it. */
const l1 = (re: number, im: number) => Math.abs(re) + Math.abs(im);

/** Why a probe cannot be evaluated on this system (unknown node or part), or null. */
export function probeProblem(p: Probe, sys: MnaSystem): string | null {
  switch (p.op) {
    case "num":
      return null;
    case "v":
      for (const name of [p.node, p.ref]) {
        if (name !== undefined && name !== GROUND && !sys.nodeIndex.has(name)) return `no node named ${name}`;
      }
      return null;
    case "i": {
      const part = sys.partByName.get(p.part);
      if (!part) return `no part named ${p.part}`;
      if (part.kind === "opamp")
        return `amps(${p.part}): an op-amp has no single current; probe a part in series`;
      return null;
    }
    case "neg":
      return probeProblem(p.arg, sys);
    default:
      return probeProblem(p.left, sys) ?? probeProblem(p.right, sys);
  }
}

function voltage(ac: AcSolver, name: string | undefined): Dual {
  if (name === undefined || name === GROUND) return dual(0, 0);
  const i = ac.sys.nodeIndex.get(name)!;
  return dual(ac.xRe[i]!, ac.xIm[i]!, ac.dxRe[i]!, ac.dxIm[i]!);
}

// Each operation also carries `dAbs`, the size of its derivative's terms (see `Dual`).
const size = (a: Dual) => a.dAbs ?? l1(a.dRe, a.dIm);

function diff(a: Dual, b: Dual): Dual {
  return dual(a.re - b.re, a.im - b.im, a.dRe - b.dRe, a.dIm - b.dIm, size(a) + size(b));
}

function scale(a: Dual, k: number): Dual {
  return dual(a.re * k, a.im * k, a.dRe * k, a.dIm * k, size(a) * Math.abs(k));
}

function mul(a: Dual, b: Dual): Dual {
  return dual(
    a.re * b.re - a.im * b.im,
    a.re * b.im + a.im * b.re,
    a.dRe * b.re - a.dIm * b.im + a.re * b.dRe - a.im * b.dIm,
    a.dRe * b.im + a.dIm * b.re + a.re * b.dIm + a.im * b.dRe,
    size(a) * l1(b.re, b.im) + l1(a.re, a.im) * size(b),
  );
}

function div(a: Dual, b: Dual): Dual {
  const den = b.re * b.re + b.im * b.im;
  const qr = (a.re * b.re + a.im * b.im) / den;
  const qi = (a.im * b.re - a.re * b.im) / den;
  // (a/b)' = (a' − q·b')/b
  const nr = a.dRe - (qr * b.dRe - qi * b.dIm);
  const ni = a.dIm - (qr * b.dIm + qi * b.dRe);
  const terms = (size(a) + l1(qr, qi) * size(b)) / Math.sqrt(den);
  return dual(qr, qi, (nr * b.re + ni * b.im) / den, (ni * b.re - nr * b.im) / den, terms);
}

/** Current through a part, entering its first terminal (passive sign convention). */
function current(ac: AcSolver, name: string): Dual {
  const sys = ac.sys;
  const part = sys.partByName.get(name)!;
  const k = sys.branchIndex.get(name);
  if (k !== undefined) return dual(ac.xRe[k]!, ac.xIm[k]!, ac.dxRe[k]!, ac.dxIm[k]!);
  const [a, b, c, d] = part.nodes;
  switch (part.kind) {
    case "resistor":
      return scale(diff(voltage(ac, a), voltage(ac, b)), 1 / part.value);
    case "capacitor": {
      // i = s·C·v, i' = C·v + s·C·v'
      const v = diff(voltage(ac, a), voltage(ac, b));
      return mul(dual(0, ac.omega * part.value, part.value, 0), v);
    }
    case "isource": {
      const ph = ((part.phaseDeg ?? 0) * Math.PI) / 180;
      return dual(part.value * Math.cos(ph), part.value * Math.sin(ph));
    }
    case "vccs":
      return scale(diff(voltage(ac, c), voltage(ac, d)), part.value);
    case "cccs": {
      const s = sys.branchIndex.get(part.sense ?? "");
      if (s === undefined) return dual(Number.NaN, Number.NaN);
      return scale(dual(ac.xRe[s]!, ac.xIm[s]!, ac.dxRe[s]!, ac.dxIm[s]!), part.value);
    }
    default:
      return dual(Number.NaN, Number.NaN);
  }
}

/**
 * Evaluate a probe on the last solution of `ac` (and its derivative when `ac.derivative()` was
 * called; otherwise the derivative fields hold stale numbers and must be ignored).
 */
export function evalProbe(p: Probe, ac: AcSolver): Dual {
  switch (p.op) {
    case "num":
      return dual(p.value, 0);
    case "v":
      return diff(voltage(ac, p.node), voltage(ac, p.ref));
    case "i":
      return current(ac, p.part);
    case "neg":
      return scale(evalProbe(p.arg, ac), -1);
    case "+":
      return sum(evalProbe(p.left, ac), evalProbe(p.right, ac));
    case "-":
      return diff(evalProbe(p.left, ac), evalProbe(p.right, ac));
    case "*":
      return mul(evalProbe(p.left, ac), evalProbe(p.right, ac));
    case "/":
      return div(evalProbe(p.left, ac), evalProbe(p.right, ac));
  }
}

/**
 * A loop gain measured by double injection (R. D. Middlebrook, "Measurement of loop gain in
 * feedback systems", Int. J. Electronics 38(4), 1975) on a system built by loops.ts: the closed
 * loop with a series test source `source` from `cut` (the listed parts' side, x) to `node` (the
 * driver's side, y). The system's first right-hand side sets that source to 1 V (voltage
 * injection); its second sets it to 0 V and injects 1 A from gnd into `cut` (current injection).
 */
export interface DoubleInjection {
  op: "double-injection";
  node: string;
  cut: string;
  source: string;
}

/** What a trace reads from its system's solution. */
export type Reading = Probe | DoubleInjection;

const ONE = dual(1, 0);

/**
 * The two injection ratios, in this engine's sign convention (the returned signal over the
 * injected one; Middlebrook's Tv, Ti are these negated):
 *  - Tv = v(node)/v(cut) with the 1 V series source (first right-hand side);
 *  - Ti = i(driver → junction)/i(junction → listed parts) with the 1 A injection (second one),
 *    where j, the source's branch current from `cut` to `node`, is the current into the driver
 *    side, so Ti = −j/(1 − j).
 */
export function injectionRatios(d: DoubleInjection, ac: AcSolver): { tv: Dual; ti: Dual } {
  const { vx, vy, j } = injectionReadings(d, ac);
  return { tv: div(vy, vx), ti: div(scale(j, -1), diff(ONE, j)) };
}

function injectionReadings(d: DoubleInjection, ac: AcSolver) {
  const x = ac.sys.nodeIndex.get(d.cut)!;
  const k = ac.sys.branchIndex.get(d.source)!;
  return {
    vx: dual(ac.xRe[x]!, ac.xIm[x]!, ac.dxRe[x]!, ac.dxIm[x]!),
    vy: voltage(ac, d.node),
    j: dual(ac.x2Re[k]!, ac.x2Im[k]!, ac.dx2Re[k]!, ac.dx2Im[k]!),
  };
}

/**
 * T = (Tv·Ti − 1)/(Tv + Ti − 2), i.e. 1/(1 − T) = 1/(1 − Tv) + 1/(1 − Ti): Middlebrook's
 * combination with T, Tv, Ti negated. Evaluated without Ti (which is infinite when an ideal
 * voltage output drives the node, j = 1): with w = vx − vy (the injected 1 V) and Ti = −j/(1 − j),
 *   T = (vx − j·w) / (vx + (1 − j)·w),
 * which is v(node)/v(cut) = Tv exactly when j = 1, i.e. the ideal cut.
 */
export function evalDoubleInjection(d: DoubleInjection, ac: AcSolver): Dual {
  const { vx, vy, j } = injectionReadings(d, ac);
  const w = diff(vx, vy);
  return div(diff(vx, mul(j, w)), sum(vx, mul(diff(ONE, j), w)));
}

function sum(a: Dual, b: Dual): Dual {
  return dual(a.re + b.re, a.im + b.im, a.dRe + b.dRe, a.dIm + b.dIm, size(a) + size(b));
}

/** Evaluate a trace's reading on the last solution of `ac` (derivatives as for evalProbe). */
export function readTrace(r: Reading, ac: AcSolver): Dual {
  return r.op === "double-injection" ? evalDoubleInjection(r, ac) : evalProbe(r, ac);
}

/**
 * The unknowns whose derivatives `readTrace` reads for these readings on `ac`'s system: dx/ds
 * (`dx`) and, for a second right-hand side, dx2/ds (`dx2`), ascending. Found by reading each one
 * once from a view of `ac` whose derivative arrays record the indices asked for, so the answer is
 * the evaluation's own (which unknowns a reading touches never depends on their values).
 */
export function derivativesRead(readings: Reading[], ac: AcSolver): { dx: Int32Array; dx2: Int32Array } {
  const dx = new Set<number>();
  const dx2 = new Set<number>();
  const recording = (into: Set<number>) =>
    new Proxy(new Float64Array(ac.sys.n), {
      get(target, key) {
        if (typeof key === "string" && /^\d+$/.test(key)) into.add(Number(key));
        return Reflect.get(target, key);
      },
    });
  const view = Object.create(ac, {
    dxRe: { value: recording(dx) },
    dxIm: { value: recording(dx) },
    dx2Re: { value: recording(dx2) },
    dx2Im: { value: recording(dx2) },
  }) as AcSolver;
  for (const r of readings) readTrace(r, view);
  const sorted = (s: Set<number>) => Int32Array.from([...s].sort((a, b) => a - b));
  return { dx: sorted(dx), dx2: sorted(dx2) };
}
