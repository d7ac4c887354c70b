import { GROUND, type Probe } from "../types";
import type { AcSolver } from "./ac";
import type { MnaSystem } from "./mna";

/** A complex value and its derivative with respect to s (complex frequency). */
export interface Dual {
  re: number;
  im: number;
  dRe: number;
  dIm: number;
}

const dual = (re: number, im: number, dRe = 0, dIm = 0): Dual => ({ re, im, dRe, dIm });

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
        return `i(${p.part}): an op-amp has no single current; probe a part in series`;
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

function diff(a: Dual, b: Dual): Dual {
  return dual(a.re - b.re, a.im - b.im, a.dRe - b.dRe, a.dIm - b.dIm);
}

function scale(a: Dual, k: number): Dual {
  return dual(a.re * k, a.im * k, a.dRe * k, a.dIm * k);
}

function mul(a: Dual, b: Dual): Dual {
  return dual(
    a.re * b.re - a.im * b.im,
    a.re * b.im + a.im * b.re,
    a.dRe * b.re - a.dIm * b.im + a.re * b.dRe - a.im * b.dIm,
    a.dRe * b.im + a.dIm * b.re + a.re * b.dIm + a.im * b.dRe,
  );
}

function div(a: Dual, b: Dual): Dual {
  const den = b.re * b.re + b.im * b.im;
  const qr = (a.re * b.re + a.im * b.im) / den;
  const qi = (a.im * b.re - a.re * b.im) / den;
  // (a/b)' = (a' − q·b')/b
  const nr = a.dRe - (qr * b.dRe - qi * b.dIm);
  const ni = a.dIm - (qr * b.dIm + qi * b.dRe);
  return dual(qr, qi, (nr * b.re + ni * b.im) / den, (ni * b.re - nr * b.im) / den);
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
    case "+": {
      const a = evalProbe(p.left, ac);
      const b = evalProbe(p.right, ac);
      return dual(a.re + b.re, a.im + b.im, a.dRe + b.dRe, a.dIm + b.dIm);
    }
    case "-":
      return diff(evalProbe(p.left, ac), evalProbe(p.right, ac));
    case "*":
      return mul(evalProbe(p.left, ac), evalProbe(p.right, ac));
    case "/":
      return div(evalProbe(p.left, ac), evalProbe(p.right, ac));
  }
}
