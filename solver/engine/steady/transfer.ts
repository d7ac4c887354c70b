/**
 * The linear network seen from the ports, harmonic by harmonic: L_k(ω) (p×p, complex) maps the
 * ports' inputs U_k to their control variables W_k = L_k·U_k at frequency k·ω. Solving the block
 * system of every MNA unknown's harmonics by first eliminating the linear unknowns of each harmonic
 * (a Schur complement onto the ports) is exact; the node harmonics are rebuilt from the per-port
 * solutions (`responses`).
 */
import { assemble, type MnaSystem } from "../mna";
import { SparseComplexLU } from "../sparse-lu";
import type { Port } from "./ports";

export interface PortTransfer {
  /** L[e*p + f] = response of port e's control to a unit input at port f. */
  re: Float64Array;
  im: Float64Array;
  /** The MNA solution for a unit input at each port (for rebuilding every unknown). */
  responses: { re: Float64Array; im: Float64Array }[];
}

export class Transfer {
  private lu: SparseComplexLU | null = null;
  readonly p: number;
  constructor(
    readonly sys: MnaSystem,
    readonly ports: Port[],
  ) {
    this.p = ports.length;
  }

  /** L at angular frequency omega (rad/s); null when the network is singular there. */
  at(omega: number, keep = false): PortTransfer | null {
    const { sys, ports, p } = this;
    assemble(sys, omega / (2 * Math.PI));
    if (!this.lu) {
      this.lu = new SparseComplexLU(sys.matrix);
      if (this.lu.isSingular()) {
        this.lu = null;
        return null;
      }
    } else if (!this.lu.refactor(sys.matrix.re, sys.matrix.im)) return null;
    const re = new Float64Array(p * p);
    const im = new Float64Array(p * p);
    const responses: PortTransfer["responses"] = [];
    const n = sys.n;
    const xr = new Float64Array(n);
    const xi = new Float64Array(n);
    for (let f = 0; f < p; f++) {
      xr.fill(0);
      xi.fill(0);
      const port = ports[f]!;
      if (port.kind === "diodes") {
        if (port.ia >= 0) xr[port.ia] = -1;
        if (port.ib >= 0) xr[port.ib] = 1;
      } else xr[port.row] = 1;
      this.lu.solve(xr, xi);
      for (let e = 0; e < p; e++) {
        const [r, i] = control(ports[e]!, xr, xi, omega, e === f);
        re[e * p + f] = r;
        im[e * p + f] = i;
      }
      if (keep) responses.push({ re: Float64Array.from(xr), im: Float64Array.from(xi) });
    }
    return { re, im, responses };
  }
}

const at = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]!);

/** A port's control variable for the MNA solution x of a unit input (self: the input is this port's). */
function control(
  port: Port,
  xr: Float64Array,
  xi: Float64Array,
  omega: number,
  self: boolean,
): [number, number] {
  if (port.kind === "diodes") return [at(xr, port.ia) - at(xr, port.ib), at(xi, port.ia) - at(xi, port.ib)];
  const vr = at(xr, port.inP) - at(xr, port.inN);
  const vi = at(xi, port.inP) - at(xi, port.inN);
  // A(jΩ) = 1/(1/A0 + jΩτ)
  const dr = 1 / port.gain;
  const di = omega * port.tau;
  const d2 = dr * dr + di * di;
  const ar = dr / d2;
  const ai = -di / d2;
  const c = port.c;
  return [c * (ar * vr - ai * vi) + (self ? 1 - c : 0), c * (ar * vi + ai * vr)];
}

/** Fix each swing port's scale c from its DC feedback (ports.ts): c = 1/max(1, |1 − A0·D0|). */
export function scaleSwingPorts(t: Transfer, omegaHint: number): boolean {
  const ports = t.ports;
  for (const port of ports) if (port.kind === "swing") port.c = 1;
  const dc = t.at(0) ?? t.at(1e-6 * omegaHint);
  if (dc === null) return false;
  ports.forEach((port, e) => {
    if (port.kind !== "swing") return;
    // With c = 1 the self entry is A0·D0 at DC.
    const a0d0 = dc.re[e * ports.length + e]!;
    port.c = 1 / Math.max(1, Math.abs(1 - a0d0));
  });
  return true;
}
