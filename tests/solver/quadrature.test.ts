import { describe, expect, it } from "vitest";
import { integrate } from "@/solver/engine/quadrature";
import { SparseComplexLU } from "@/solver/engine/sparse-lu";
import { mulberry32 } from "./engine-circuits";
import { expectClose } from "./engine-tolerance";

describe("Gauss–Kronrod quadrature", () => {
  it("one G7–K15 panel integrates x^k on [0, 1] exactly to k = 22 (Kronrod's degree 3n+1 for n = 7: common practice)", () => {
    for (let k = 0; k <= 22; k++) {
      const r = integrate((x) => x ** k, 0, 1, { rel: 1, pieces: 1 });
      expectClose(r.value, 1 / (k + 1), 1e-14);
    }
  });

  it("adapts to a peaked integrand: ∫ 1/(1 + x²) over [−100, 100] = 2·atan(100)", () => {
    const r = integrate((x) => 1 / (1 + x * x), -100, 100, { rel: 1e-12 });
    expect(r.converged).toBe(true);
    expectClose(r.value, 2 * Math.atan(100), 1e-12);
  });
});

describe("SparseComplexLU.solveTransposed", () => {
  it("solves Aᵀz = d (plain transpose) for a random sparse complex matrix", () => {
    const rnd = mulberry32(7);
    const n = 12;
    const dense: [number, number][][] = Array.from({ length: n }, (_, i) =>
      Array.from({ length: n }, (_, j) =>
        i === j ? [4 + rnd(), rnd()] : rnd() < 0.25 ? [rnd() - 0.5, rnd() - 0.5] : [0, 0],
      ),
    );
    const rowPtr = [0];
    const colIdx: number[] = [];
    const re: number[] = [];
    const im: number[] = [];
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const [a, b] = dense[i]![j]!;
        if (a === 0 && b === 0) continue;
        colIdx.push(j);
        re.push(a);
        im.push(b);
      }
      rowPtr.push(colIdx.length);
    }
    const lu = new SparseComplexLU({
      n,
      rowPtr: Int32Array.from(rowPtr),
      colIdx: Int32Array.from(colIdx),
      re: Float64Array.from(re),
      im: Float64Array.from(im),
    });
    const dRe = Float64Array.from({ length: n }, () => rnd());
    const dIm = Float64Array.from({ length: n }, () => rnd());
    const zRe = new Float64Array(n);
    const zIm = new Float64Array(n);
    lu.solveTransposed(dRe, dIm, zRe, zIm);
    for (let j = 0; j < n; j++) {
      let sr = 0;
      let si = 0;
      for (let i = 0; i < n; i++) {
        const [a, b] = dense[i]![j]!;
        sr += a * zRe[i]! - b * zIm[i]!;
        si += a * zIm[i]! + b * zRe[i]!;
      }
      expect(Math.abs(sr - dRe[j]!) + Math.abs(si - dIm[j]!)).toBeLessThan(1e-12);
    }
  });
});
