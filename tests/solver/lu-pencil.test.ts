// The sweep's fast paths give the same numbers, bit for bit, as the plain ones they replace:
// the pencil's kept terms (maxima without a pass over the values), the slot copy of G and C, and
// the forward substitution run along the refactor. "Same numbers" is the design (common practice
// for such rewrites: compare against the straightforward form on seeded random inputs).
import { describe, expect, it } from "vitest";
import { rowColumnMaxima } from "@/solver/engine/equilibrate";
import { pencilInOrder, pencilMaxima, pencilTests } from "@/solver/engine/pencil-maxima";
import { SparseComplexLU } from "@/solver/engine/sparse-lu";
import { type SparseComplexMatrix, sparseFromDense } from "@/solver/engine/sparse-matrix";
import { mulberry32 } from "./engine-circuits";

/** A random pencil G + s·C in one pattern, with ties, zeros and one long row and column. */
function randomPencil(n: number, seed: number): { a: SparseComplexMatrix; g: Float64Array; c: Float64Array } {
  const rnd = mulberry32(seed);
  const re = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const im = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const pick = () => [0, 1, 1e-3, 2.5, -2.5][Math.floor(rnd() * 5)]! * (rnd() < 0.5 ? 1 : 1e3);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      // Row and column 0 are dense (longer than the short-group scan), the rest sparse.
      if (i === j || i === 0 || j === 0 || rnd() < 0.08) {
        re[i]![j] = pick() || 1e-9;
        im[i]![j] = pick();
      }
    }
    re[i]![i] = re[i]![i]! + 5e3;
  }
  const a = sparseFromDense(re, im);
  return { a, g: Float64Array.from(a.re), c: Float64Array.from(a.im) };
}

describe("pencil maxima", () => {
  it("give each row's and column's largest |g| + ω|c| exactly, at every ω (6 seeds × 7 frequencies)", () => {
    for (let seed = 1; seed <= 6; seed++) {
      const { a, g, c } = randomPencil(48, seed);
      const order = {
        rowPerm: Int32Array.from({ length: 48 }, (_, i) => (i * 7) % 48),
        colPerm: Int32Array.from({ length: 48 }, (_, i) => 47 - i),
      };
      const pen = pencilInOrder(pencilMaxima(a, g, c), order);
      expect(pen.single).toBe(false);
      for (const w of [0, 1e-6, 0.5, 1, 3.7, 1e4, 1e12]) {
        const cm = new Float64Array(48);
        const rm = new Float64Array(48);
        pencilTests(pen, w, cm, rm);
        const rmax = new Float64Array(48);
        const cmax = new Float64Array(48);
        rowColumnMaxima(
          a,
          g,
          Float64Array.from(c, (x) => w * x),
          rmax,
          cmax,
        );
        for (let k = 0; k < 48; k++) {
          expect(cm[k]).toBe(cmax[order.colPerm[k]!]! || 1);
          expect(rm[k]).toBe(rmax[order.rowPerm[k]!]! || 1);
        }
      }
    }
  });

  it("mark a pencil with one kept term per row and column as single, with the same maxima", () => {
    // A diagonal-dominant tridiagonal pencil: each diagonal entry beats its row and column in |g| and |c|.
    const n = 20;
    const re = Array.from({ length: n }, (_, i) =>
      Array.from({ length: n }, (_, j) => (i === j ? 3 : Math.abs(i - j) === 1 ? -1 : 0)),
    );
    const im = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 2e-6 : 0)));
    const a = sparseFromDense(re, im);
    const ident = {
      rowPerm: Int32Array.from({ length: n }, (_, i) => i),
      colPerm: Int32Array.from({ length: n }, (_, i) => i),
    };
    const pen = pencilInOrder(pencilMaxima(a, a.re, a.im), ident);
    expect(pen.single).toBe(true);
    const cm = new Float64Array(n);
    const rm = new Float64Array(n);
    pencilTests(pen, 1e6, cm, rm);
    expect(Array.from(cm)).toEqual(new Array(n).fill(3 + 1e6 * 2e-6));
    expect(Array.from(rm)).toEqual(new Array(n).fill(3 + 1e6 * 2e-6));
  });
});

describe("refactorAt with the right-hand side", () => {
  it("solves bit for bit as refactor of the assembled values and a full solve (4 seeds × 6 frequencies)", () => {
    for (let seed = 11; seed <= 14; seed++) {
      const { a, g, c } = randomPencil(40, seed);
      const rnd = mulberry32(seed + 100);
      const bRe = Float64Array.from({ length: 40 }, () => rnd() - 0.5);
      const bIm = Float64Array.from({ length: 40 }, () => rnd() - 0.5);
      const fast = new SparseComplexLU({ ...a, re: Float64Array.from(g), im: Float64Array.from(c) });
      fast.setPencil(g, c);
      const plain = new SparseComplexLU({ ...a, re: Float64Array.from(g), im: Float64Array.from(c) });
      for (const w of [1, 10, 1e3, 0.25, 1e5, 3]) {
        const okFast = fast.refactorAt(w, bRe, bIm);
        const okPlain = plain.refactor(
          g,
          Float64Array.from(c, (x) => w * x),
        );
        expect(okFast).toBe(okPlain);
        expect(okFast).toBe(true);
        const x1 = [new Float64Array(40), new Float64Array(40)] as const;
        const x2 = [new Float64Array(40), new Float64Array(40)] as const;
        expect(fast.solve(bRe, bIm, x1[0], x1[1])).toBe(true);
        expect(plain.solve(bRe, bIm, x2[0], x2[1])).toBe(true);
        expect(Array.from(x1[0])).toEqual(Array.from(x2[0]));
        expect(Array.from(x1[1])).toEqual(Array.from(x2[1]));
        // A transposed solve after the fused refactor and solve: Aᵀ·z = d the same as in full.
        fast.solveTransposed(bIm, bRe, x1[0], x1[1]);
        plain.solveTransposed(bIm, bRe, x2[0], x2[1]);
        expect(Array.from(x1[0])).toEqual(Array.from(x2[0]));
        expect(Array.from(x1[1])).toEqual(Array.from(x2[1]));
        // A second solve of other values after the fused one runs its own forward pass.
        const d = [Float64Array.from(bIm), Float64Array.from(bRe)] as const;
        const e = [Float64Array.from(bIm), Float64Array.from(bRe)] as const;
        fast.solve(d[0], d[1]);
        plain.solve(e[0], e[1]);
        expect(Array.from(d[0])).toEqual(Array.from(e[0]));
      }
    }
  });
});

describe("solveProduct", () => {
  it("gives −A⁻¹·M·v bit for bit as forming −M·v and solving (3 seeds)", () => {
    for (let seed = 21; seed <= 23; seed++) {
      const { a, g, c } = randomPencil(36, seed);
      const lu = new SparseComplexLU({ ...a, re: Float64Array.from(g), im: Float64Array.from(c) });
      const rnd = mulberry32(seed);
      const vRe = Float64Array.from({ length: 36 }, () => rnd() - 0.5);
      const vIm = Float64Array.from({ length: 36 }, () => rnd() - 0.5);
      // M: A's pattern with C's values (zeros kept: they must not change anything either).
      const m = { ptr: a.rowPtr, idx: a.colIdx, val: c };
      const x = [new Float64Array(36), new Float64Array(36)] as const;
      expect(lu.solveProduct(m, vRe, vIm, x[0], x[1])).toBe(true);
      const dRe = new Float64Array(36);
      const dIm = new Float64Array(36);
      for (let i = 0; i < 36; i++) {
        for (let p = a.rowPtr[i]!; p < a.rowPtr[i + 1]!; p++) {
          dRe[i] = dRe[i]! - c[p]! * vRe[a.colIdx[p]!]!;
          dIm[i] = dIm[i]! - c[p]! * vIm[a.colIdx[p]!]!;
        }
      }
      lu.solve(dRe, dIm);
      expect(Array.from(x[0])).toEqual(Array.from(dRe));
      expect(Array.from(x[1])).toEqual(Array.from(dIm));
      expect(x[0].some((v) => v !== 0)).toBe(true);
    }
  });
});
