import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import type { PoleResult } from "../types";
import type { MnaSystem } from "./mna";
import { SparseComplexLU } from "./sparse-lu";

/** Largest system whose poles are computed (the eigenproblem is dense, O(n³)). */
export const MAX_POLE_UNKNOWNS = 400;

/**
 * Natural frequencies of the network with its independent sources zeroed: the finite s with
 * det(G + s·C) = 0.
 *
 * Method: shift-invert to a standard eigenproblem. With a real shift s0 where G + s0·C is regular,
 * (G + s·C)x = 0 ⇔ M·x = μ·x with M = (G + s0·C)⁻¹·C and μ = 1/(s0 − s); the algebraic (non-dynamic)
 * part of the network gives μ = 0 (infinite s) and is dropped. M is formed column by column with
 * the sparse LU, then ml-matrix's EigenvalueDecomposition (Hessenberg QR) gives μ.
 * Cost O(n³). Assumes n ≤ MAX_POLE_UNKNOWNS. Returns null when no regular shift was found.
 *
 * Reported per pole: s = σ + jω (rad/s), f = |s|/2π, Q = |s|/(−2σ) (null when σ = 0), and for
 * complex poles the amplitude ratio per cycle e^(2πσ/|ω|) (> 1 grows, < 1 decays; null for real poles).
 */
export function computePoles(sys: MnaSystem, scaleHz: number): PoleResult[] | null {
  const n = sys.n;
  const { rowPtr, colIdx } = sys.matrix;
  for (const factor of [1, 1.37, 0.61, 2.9, 0.23]) {
    const s0 = 2 * Math.PI * scaleHz * factor;
    const re = Float64Array.from(sys.g, (g, p) => g + s0 * sys.c[p]!);
    const im = new Float64Array(re.length);
    const lu = new SparseComplexLU({ n, rowPtr, colIdx, re, im });
    if (lu.isSingular()) continue;
    const m = new Matrix(n, n);
    const colRe = new Float64Array(n);
    const colIm = new Float64Array(n);
    for (let j = 0; j < n; j++) {
      colRe.fill(0);
      colIm.fill(0);
      let any = false;
      for (let i = 0; i < n; i++) {
        for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
          if (colIdx[p] === j && sys.c[p] !== 0) {
            colRe[i] = sys.c[p]!;
            any = true;
          }
        }
      }
      if (!any) continue;
      lu.solve(colRe, colIm);
      for (let i = 0; i < n; i++) m.set(i, j, colRe[i]!);
    }
    const evd = new EigenvalueDecomposition(m, { assumeSymmetric: false });
    const mr = evd.realEigenvalues;
    const mi = evd.imaginaryEigenvalues;
    const biggest = Math.max(0, ...mr.map((x, k) => Math.hypot(x, mi[k]!)));
    if (biggest === 0) return [];
    const poles: PoleResult[] = [];
    for (let k = 0; k < mr.length; k++) {
      const a = mr[k]!;
      const b = mi[k]!;
      const d = a * a + b * b;
      // Eigenvalues at rounding level belong to the algebraic part (infinite natural frequencies).
      if (Math.sqrt(d) <= 1e-9 * biggest) continue;
      // s = s0 − 1/μ, 1/μ = (a − jb)/d
      const sr = s0 - a / d;
      const si = b / d;
      poles.push(describe(sr, Math.abs(si) < 1e-12 * Math.hypot(sr, si) ? 0 : si));
    }
    return poles.sort((p, q) => p.frequencyHz - q.frequencyHz || q.im - p.im);
  }
  return null;
}

function describe(sr: number, si: number): PoleResult {
  const w = Math.hypot(sr, si);
  return {
    re: sr,
    im: si,
    frequencyHz: w / (2 * Math.PI),
    q: sr === 0 ? null : w / (-2 * sr),
    growthPerCycle: si === 0 ? null : Math.exp((2 * Math.PI * sr) / Math.abs(si)),
  };
}
