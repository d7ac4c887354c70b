import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import type { PoleResult } from "../types";
import { Equilibration } from "./equilibrate";
import type { MnaSystem } from "./mna";
import { SparseComplexLU } from "./sparse-lu";
import type { SparseComplexMatrix } from "./sparse-matrix";

/** Largest system whose poles are computed (the eigenproblem is dense, O(n³)). */
export const MAX_POLE_UNKNOWNS = 400;

/**
 * A regular pencil G + s·C over one sparsity pattern (MNA, or any other pair — a zeros analysis
 * passes its own): `pattern` gives n, rowPtr and colIdx; g and c are the values in that order.
 */
interface Pencil {
  pattern: Pick<SparseComplexMatrix, "n" | "rowPtr" | "colIdx">;
  g: Float64Array;
  c: Float64Array;
}

/** A verified eigenvalue s (rad/s) must leave the equilibrated G + s·C this singular (σ_min ≤ it). */
const POLE_RESIDUAL = 1e-7;

/**
 * Finite eigenvalues s of the pencil (det(G + s·C) = 0), each verified.
 *
 * Method: shift-invert to a standard eigenproblem. With a real shift s0 where G + s0·C is regular,
 * (G + s·C)x = 0 ⇔ M·x = μ·x with M = (G + s0·C)⁻¹·C and μ = 1/(s0 − s); the infinite eigenvalues
 * (the algebraic part: ideal op-amps, sources, nodes without capacitance) give μ = 0 and are dropped
 * below 1e-9 of the largest |μ|. M is formed column by column with the sparse LU, then ml-matrix's
 * EigenvalueDecomposition (Hessenberg QR) gives μ.
 * Infinite eigenvalues of index > 1 (a capacitor between an ideal op-amp's inputs, a capacitor in
 * an ideal amplifier's feedback path) form Jordan blocks at μ = 0; rounding splits a block of size k
 * into μ ≈ ε^(1/k)·|M|, far above any fixed cut-off (J. H. Wilkinson, "The Algebraic Eigenvalue
 * Problem", Oxford 1965, ch. 2 §§10–11, perturbation of a defective eigenvalue), which turned into
 * "poles" near 10¹⁰…10¹³ rad/s, some in the right half-plane. So every candidate is verified
 * against the pencil itself: the equilibrated matrix D_r·(G + s·C)·D_c at that s must be singular to
 * working precision — its smallest singular value, estimated by inverse iteration with the sparse
 * LU (three steps from a fixed start), at most POLE_RESIDUAL (entries are ≤ 1 after scaling). A true
 * eigenvalue computed to relative accuracy δ leaves about δ; a split infinite one leaves O(ε^(1/k)) or
 * more and is dropped.
 * Cost O(n³) for the eigenproblem plus one sparse factorization per candidate.
 * Returns null when no regular shift was found.
 */
export function pencilEigenvalues(p: Pencil, scaleHz: number): { re: number; im: number }[] | null {
  const { n, rowPtr, colIdx } = p.pattern;
  for (const factor of [1, 1.37, 0.61, 2.9, 0.23]) {
    const s0 = 2 * Math.PI * scaleHz * factor;
    const re = Float64Array.from(p.g, (g, k) => g + s0 * p.c[k]!);
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
        for (let q = rowPtr[i]!; q < rowPtr[i + 1]!; q++) {
          if (colIdx[q] === j && p.c[q] !== 0) {
            colRe[i] = p.c[q]!;
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
    const out: { re: number; im: number }[] = [];
    for (let k = 0; k < mr.length; k++) {
      const a = mr[k]!;
      const b = mi[k]!;
      const d = a * a + b * b;
      if (Math.sqrt(d) <= 1e-9 * biggest) continue;
      // s = s0 − 1/μ, 1/μ = (a − jb)/d; parts below rounding of the shift are zero.
      let sr = s0 - a / d;
      let si = b / d;
      const size = Math.max(Math.hypot(sr, si), s0);
      if (Math.abs(sr) < 1e-12 * size) sr = 0;
      if (Math.abs(si) < 1e-12 * Math.hypot(sr, si) || Math.abs(si) < 1e-12 * s0) si = 0;
      if (smallestSingularValue(p, sr, si) <= POLE_RESIDUAL) out.push({ re: sr, im: si });
    }
    return out;
  }
  return null;
}

/**
 * Estimate of the smallest singular value of D_r·(G + s·C)·D_c, D_r and D_c equilibrating the
 * term sizes |G| + |s|·|C| (entries ≤ ~1): 0 when the sparse LU finds G + s·C singular to working precision,
 * otherwise 1/‖B⁻¹z‖ after three steps of inverse iteration from a fixed start z (Wilkinson 1965,
 * ch. 9 — inverse iteration; any start not orthogonal to the smallest singular vector converges).
 */
export function smallestSingularValue(p: Pencil, sr: number, si: number): number {
  const { n, rowPtr, colIdx } = p.pattern;
  const re = Float64Array.from(p.g, (g, k) => g + sr * p.c[k]!);
  const im = Float64Array.from(p.c, (c) => si * c);
  const lu = new SparseComplexLU({ n, rowPtr, colIdx, re, im });
  if (lu.isSingular()) return 0;
  // Scale by the sizes of the terms, |g| + |s|·|c|, not of their sums: at a pole an entry such as
  // 1/R + s·C can cancel to rounding, and scaling that remnant up would hide the singularity.
  const eq = new Equilibration(n);
  const size = Math.hypot(sr, si);
  eq.compute(
    { n, rowPtr, colIdx, re, im },
    Float64Array.from(p.g, Math.abs),
    Float64Array.from(p.c, (c) => size * Math.abs(c)),
  );
  const { row, col } = eq;
  const zr = Float64Array.from({ length: n }, (_, i) => 1 + ((i * 0.618034) % 1));
  const zi = Float64Array.from({ length: n }, (_, i) => (i * 0.414214) % 1);
  let growth = 0;
  for (let step = 0; step < 3; step++) {
    const zn = Math.hypot(...zr, ...zi);
    for (let i = 0; i < n; i++) {
      zr[i] = zr[i]! / zn / row[i]!;
      zi[i] = zi[i]! / zn / row[i]!;
    }
    lu.solve(zr, zi);
    for (let j = 0; j < n; j++) {
      zr[j] = zr[j]! / col[j]!;
      zi[j] = zi[j]! / col[j]!;
    }
    growth = Math.hypot(...zr, ...zi);
    if (!Number.isFinite(growth)) return 0;
  }
  return growth > 0 ? 1 / growth : 0;
}

/**
 * Natural frequencies of the network with its independent sources zeroed: the finite s with
 * det(G + s·C) = 0, each verified (`pencilEigenvalues`). Returns null when no regular shift was found.
 *
 * Reported per pole: s = σ + jω (rad/s), f = |s|/2π, Q = |s|/(−2σ) (null when σ = 0), and for
 * complex poles the amplitude ratio per cycle e^(2πσ/|ω|) (> 1 grows, < 1 decays; null for real poles).
 */
export function computePoles(sys: MnaSystem, scaleHz: number): PoleResult[] | null {
  const s = pencilEigenvalues({ pattern: sys.matrix, g: sys.g, c: sys.c }, scaleHz);
  if (!s) return null;
  return s.map((x) => describe(x.re, x.im)).sort((p, q) => p.frequencyHz - q.frequencyHz || q.im - p.im);
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
