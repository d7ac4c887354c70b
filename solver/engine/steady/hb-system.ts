/**
 * The harmonic-balance equations of an autonomous circuit on its ports (K. S. Kundert and
 * A. Sangiovanni-Vincentelli, "Simulation of nonlinear circuits in the frequency domain", IEEE Trans.
 * CAD 5(4), 1986): for every port e and harmonic k = 0…N,
 *   R_e,k = W_e,k − Σ_f L_ef,k(ω)·U_f,k(W) = 0,
 * U_f = the harmonics of u_f(t) = f(w_f(t)), evaluated on M uniform samples of one period (M a power
 * of two, > 4N) and transformed by FFT. Unknowns: the two-sided harmonics W_e,k (W_e,0 real) of every
 * port and ω; the imaginary part of port 0's fundamental is fixed at 0 (the phase reference) and its
 * place in the unknown vector holds ω. The Jacobian comes from the harmonics G of each port's
 * conductance g(t) = df/dw: ∂U_k/∂W_m = G_{k−m} (+ G_{k+m} for the conjugate of W_m).
 */
import { harmonicsOf, powerOfTwoAtLeast, synthesize } from "./fft";
import { type Port, portLaw } from "./ports";
import type { PortTransfer, Transfer } from "./transfer";

/** Relative step of ω for ∂L/∂ω. */
const OMEGA_STEP = 1e-6;

export class HbSystem {
  readonly p: number;
  /** Unknowns per port: W_0, then Re and Im of W_1…W_N. */
  readonly block: number;
  readonly size: number;
  readonly samples: number;
  constructor(
    readonly transfer: Transfer,
    readonly ports: Port[],
    readonly harmonics: number,
  ) {
    this.p = ports.length;
    this.block = 2 * harmonics + 1;
    this.size = this.p * this.block;
    this.samples = Math.max(512, powerOfTwoAtLeast(8 * harmonics + 2));
  }

  /** ω from the unknown vector (it sits where port 0's Im W_1 would). */
  omega(x: Float64Array): number {
    return x[2]!;
  }

  /** Port e's harmonics (two-sided) from the unknown vector. */
  portHarmonics(x: Float64Array, e: number): { re: Float64Array; im: Float64Array } {
    const n = this.harmonics;
    const re = new Float64Array(n + 1);
    const im = new Float64Array(n + 1);
    const o = e * this.block;
    re[0] = x[o]!;
    for (let m = 1; m <= n; m++) {
      re[m] = x[o + 2 * m - 1]!;
      im[m] = e === 0 && m === 1 ? 0 : x[o + 2 * m]!;
    }
    return { re, im };
  }

  /** Time samples of each port's law: U (N+1 harmonics) and G (2N+1 harmonics). */
  private evaluatePorts(x: Float64Array) {
    const n = this.harmonics;
    return this.ports.map((port, e) => {
      const w = this.portHarmonics(x, e);
      const wt = synthesize(w.re, w.im, this.samples);
      const u = new Float64Array(this.samples);
      const g = new Float64Array(this.samples);
      for (let i = 0; i < wt.length; i++) {
        const r = portLaw(port, wt[i]!);
        u[i] = r.u;
        g[i] = r.g;
      }
      return { w, wt, ut: u, u: harmonicsOf(u, n + 1), g: harmonicsOf(g, 2 * n + 1) };
    });
  }

  /** The transfers L_k(ω), k = 0…N; null when the network is singular at one of them. */
  transfers(omega: number, keep = false): PortTransfer[] | null {
    const out: PortTransfer[] = [];
    for (let k = 0; k <= this.harmonics; k++) {
      const t = this.transfer.at(k * omega, keep);
      if (t === null) return null;
      out.push(t);
    }
    return out;
  }

  /** Residual R (same layout as x) and, when asked, the Jacobian (row-major size×size). */
  evaluate(x: Float64Array, withJacobian: boolean): { r: Float64Array; j: Float64Array | null } | null {
    const { p, block, harmonics: n } = this;
    const omega = this.omega(x);
    if (!(omega > 0)) return null;
    const L = this.transfers(omega);
    if (L === null) return null;
    const ev = this.evaluatePorts(x);
    const r = new Float64Array(this.size);
    for (let e = 0; e < p; e++) {
      for (let k = 0; k <= n; k++) {
        let sr = 0;
        let si = 0;
        for (let f = 0; f < p; f++) {
          const lr = L[k]!.re[e * p + f]!;
          const li = L[k]!.im[e * p + f]!;
          const ur = ev[f]!.u.re[k]!;
          const ui = k === 0 ? 0 : ev[f]!.u.im[k]!;
          sr += lr * ur - li * ui;
          si += lr * ui + li * ur;
        }
        const w = ev[e]!.w;
        if (k === 0) r[e * block] = w.re[0]! - sr;
        else {
          r[e * block + 2 * k - 1] = w.re[k]! - sr;
          r[e * block + 2 * k] = w.im[k]! - si;
        }
      }
    }
    if (!withJacobian) return { r, j: null };
    const Lw = this.transfers(omega * (1 + OMEGA_STEP));
    if (Lw === null) return null;
    return { r, j: this.jacobian(L, Lw, omega, ev) };
  }

  private jacobian(
    L: PortTransfer[],
    Lw: PortTransfer[],
    omega: number,
    ev: { u: { re: Float64Array; im: Float64Array }; g: { re: Float64Array; im: Float64Array } }[],
  ): Float64Array {
    const { p, block, harmonics: n, size } = this;
    const j = new Float64Array(size * size);
    const G = (f: number, q: number): [number, number] => {
      const g = ev[f]!.g;
      return q >= 0 ? [g.re[q]!, g.im[q]!] : [g.re[-q]!, -g.im[-q]!];
    };
    for (let e = 0; e < p; e++) {
      for (let k = 0; k <= n; k++) {
        const rowRe = e * block + (k === 0 ? 0 : 2 * k - 1);
        const rowIm = k === 0 ? -1 : rowRe + 1;
        const put = (col: number, vr: number, vi: number) => {
          j[rowRe * size + col] = j[rowRe * size + col]! + vr;
          if (rowIm >= 0) j[rowIm * size + col] = j[rowIm * size + col]! + vi;
        };
        for (let f = 0; f < p; f++) {
          const lr = L[k]!.re[e * p + f]!;
          const li = L[k]!.im[e * p + f]!;
          const minusLb = (col: number, br: number, bi: number) =>
            put(col, -(lr * br - li * bi), -(lr * bi + li * br));
          const base = f * block;
          minusLb(base, ...G(f, k));
          for (let m = 1; m <= n; m++) {
            const [ar, ai] = G(f, k - m);
            const [cr, ci] = G(f, k + m);
            minusLb(base + 2 * m - 1, ar + cr, ai + ci);
            // ∂/∂Im W_m: j·(G_{k−m} − G_{k+m})
            if (!(f === 0 && m === 1)) minusLb(base + 2 * m, -(ai - ci), ar - cr);
          }
          // ∂R/∂ω = −(∂L/∂ω)·U
          const dlr = (Lw[k]!.re[e * p + f]! - lr) / (omega * OMEGA_STEP);
          const dli = (Lw[k]!.im[e * p + f]! - li) / (omega * OMEGA_STEP);
          const ur = ev[f]!.u.re[k]!;
          const ui = k === 0 ? 0 : ev[f]!.u.im[k]!;
          put(2, -(dlr * ur - dli * ui), -(dlr * ui + dli * ur));
        }
        // ∂W_e,k/∂W_e,k = 1
        j[rowRe * size + rowRe] = j[rowRe * size + rowRe]! + 1;
        if (rowIm >= 0 && !(e === 0 && k === 1)) j[rowIm * size + rowIm] = j[rowIm * size + rowIm]! + 1;
      }
    }
    return j;
  }

  /** Port signals at the solution (for rebuilding every unknown). */
  portSignals(x: Float64Array) {
    return this.evaluatePorts(x);
  }
}
