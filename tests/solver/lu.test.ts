import { complex, lusolve, matrix } from "mathjs";
import { describe, expect, it } from "vitest";
import { markowitzOrder } from "@/solver/engine/markowitz";
import { SparseComplexLU } from "@/solver/engine/sparse-lu";
import { LUFactors } from "@/solver/engine/sparse-lu-factors";
import { factorNumeric } from "@/solver/engine/sparse-lu-numeric";
import { PivotTests } from "@/solver/engine/sparse-lu-scaling";
import { solveFactors, sparseRhs } from "@/solver/engine/sparse-lu-solve";
import { csrFromTriplets, sparseFromDense } from "@/solver/engine/sparse-matrix";
import { mulberry32 } from "./engine-circuits";
import { relClose } from "./engine-tolerance";

type Dense = { re: number[][]; im: number[][] };

/** A random sparse complex matrix with a strong diagonal (well conditioned), seeded. */
function randomSystem(n: number, density: number, seed: number, dominant = true): Dense {
  const rnd = mulberry32(seed);
  const re = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const im = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (i === j || rnd() < density) {
        re[i]![j] = rnd() * 2 - 1;
        im[i]![j] = rnd() * 2 - 1;
      }
    }
    if (dominant) re[i]![i] = re[i]![i]! + n * density + 2;
  }
  return { re, im };
}

function permutedProduct(lu: SparseComplexLU, a: Dense) {
  const n = lu.n;
  const { lRe, lIm, uRe, uIm } = lu.denseFactors();
  const P = lu.rowPermutation;
  const Q = lu.columnPermutation;
  let worst = 0;
  let scale = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let sr = 0;
      let si = 0;
      for (let k = 0; k < n; k++) {
        sr += lRe[i]![k]! * uRe[k]![j]! - lIm[i]![k]! * uIm[k]![j]!;
        si += lRe[i]![k]! * uIm[k]![j]! + lIm[i]![k]! * uRe[k]![j]!;
      }
      const ar = a.re[P[i]!]![Q[j]!]!;
      const ai = a.im[P[i]!]![Q[j]!]!;
      worst = Math.max(worst, Math.hypot(sr - ar, si - ai));
      scale = Math.max(scale, Math.hypot(ar, ai));
    }
  }
  return worst / scale;
}

describe("SparseComplexLU", () => {
  it("satisfies P·A·Q = L·U with L unit lower and U upper", () => {
    const a = randomSystem(30, 0.12, 7);
    const lu = new SparseComplexLU(sparseFromDense(a.re, a.im));
    expect(lu.isSingular()).toBe(false);
    expect(permutedProduct(lu, a)).toBeLessThan(1e-13);
    const f = lu.denseFactors();
    for (let i = 0; i < lu.n; i++) {
      expect(f.lRe[i]![i]).toBe(1);
      for (let j = i + 1; j < lu.n; j++) expect(f.lRe[i]![j]).toBe(0);
      for (let j = 0; j < i; j++) expect(f.uRe[i]![j]).toBe(0);
    }
  });

  it("pivots off a zero diagonal (a voltage-source-like row) and still factors exactly", () => {
    // Saddle-point structure as in modified nodal analysis: zero diagonal in the constraint rows.
    const re = [
      [1e-3, -1e-3, 1],
      [-1e-3, 2e-3, 0],
      [1, 0, 0],
    ];
    const a = { re, im: re.map((r) => r.map(() => 0)) };
    const lu = new SparseComplexLU(sparseFromDense(a.re, a.im));
    expect(lu.isSingular()).toBe(false);
    expect(permutedProduct(lu, a)).toBeLessThan(1e-15);
  });

  it("solves random complex systems like mathjs lusolve (seeded, 10 cases)", () => {
    for (let seed = 1; seed <= 10; seed++) {
      const n = 5 + seed * 3;
      const a = randomSystem(n, 0.2, seed, seed % 2 === 0);
      const rnd = mulberry32(seed + 100);
      const bRe = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const bIm = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const lu = new SparseComplexLU(sparseFromDense(a.re, a.im));
      const xRe = new Float64Array(n);
      const xIm = new Float64Array(n);
      lu.solve(bRe, bIm, xRe, xIm);
      const A = matrix(a.re.map((row, i) => row.map((x, j) => complex(x, a.im[i]![j]!))));
      const b = matrix(Array.from(bRe, (x, i) => [complex(x, bIm[i]!)]));
      const ref = lusolve(A, b).toArray() as unknown as { re: number; im: number }[][];
      for (let i = 0; i < n; i++) {
        const r = ref[i]![0]!;
        const scale = Math.max(...ref.map((row) => Math.hypot(row[0]!.re, row[0]!.im)));
        expect(Math.hypot(xRe[i]! - r.re, xIm[i]! - r.im) / scale).toBeLessThan(1e-11);
      }
    }
  });

  it("reports a singular matrix instead of solving it", () => {
    const a = sparseFromDense([
      [1, 2, 0],
      [2, 4, 0],
      [0, 0, 1],
    ]);
    const lu = new SparseComplexLU(a);
    expect(lu.isSingular()).toBe(true);
    expect(() => lu.solve(new Float64Array(3), new Float64Array(3))).toThrow(
      "matrix is singular: cannot solve",
    );
  });

  it("rejects values that do not fit the pattern", () => {
    const lu = new SparseComplexLU(sparseFromDense([[2]]));
    expect(() => lu.refactor(new Float64Array(2), new Float64Array(2))).toThrow(
      "dimension mismatch: values and pattern differ in length",
    );
  });

  it("refactors new values in the same pattern without re-pivoting, and re-pivots one frequency when needed", () => {
    const a = randomSystem(25, 0.15, 3);
    const m = sparseFromDense(a.re, a.im);
    const lu = new SparseComplexLU(m);
    const order = Array.from(lu.rowPermutation);
    // Scale the imaginary parts (as a frequency step does) and refactor.
    const re2 = Float64Array.from(m.re);
    const im2 = m.im.map((x) => x * 1.7);
    expect(lu.refactor(re2, im2)).toBe(true);
    expect(lu.repivots).toBe(0);
    expect(Array.from(lu.rowPermutation)).toEqual(order);
    const a2 = { re: a.re, im: a.im.map((row) => row.map((x) => x * 1.7)) };
    expect(permutedProduct(lu, a2)).toBeLessThan(1e-13);
    // Now make a pivot tiny (one whose row has no L part but U entries, so the pivot is a
    // matrix entry itself, and whose column holds other entries, so equilibration cannot scale it
    // back up): the refactorization must re-pivot for these values only.
    const f = lu.denseFactors();
    const colCount = (c: number) => a.re.filter((row, i) => row[c] !== 0 || a.im[i]![c] !== 0).length;
    const k = order.findIndex(
      (_, i) =>
        f.lRe[i]!.every((x, j) => j === i || x === 0) &&
        f.uRe[i]!.some((x, j) => j > i && x !== 0) &&
        colCount(lu.columnPermutation[i]!) > 1,
    );
    expect(k).toBeGreaterThanOrEqual(0);
    const p0 = order[k]!;
    const c0 = lu.columnPermutation[k]!;
    const re3 = Float64Array.from(m.re);
    const im3 = Float64Array.from(m.im);
    for (let p = m.rowPtr[p0]!; p < m.rowPtr[p0 + 1]!; p++) {
      if (m.colIdx[p] === c0) {
        re3[p] = 1e-9;
        im3[p] = 0;
      }
    }
    const a3 = sparseDense(m.rowPtr, m.colIdx, re3, im3, m.n);
    expect(lu.refactor(re3, im3)).toBe(true);
    expect(lu.repivots).toBe(1);
    expect(permutedProduct(lu, a3)).toBeLessThan(1e-12);
    // The next refactor goes back to the sweep's order.
    expect(lu.refactor(re2, im2)).toBe(true);
    expect(Array.from(lu.rowPermutation)).toEqual(order);
  });
});

describe("csrFromTriplets", () => {
  it("merges triplets at one place, rows sorted by column, values summed in triplet order", () => {
    // Row 1 gets (1,2) twice and (1,0); row 0 gets (0,1). The three values at (1,2) are summed
    // left to right: (1e16 + 1) − 1e16 = 0 in doubles (1 would mean another order).
    const m = csrFromTriplets(3, [1, 0, 1, 1, 1], [2, 1, 0, 2, 2], [1e16, 5, 7, 1, -1e16], [1, 2, 3, 4, 5]);
    expect(Array.from(m.rowPtr)).toEqual([0, 1, 3, 3]);
    expect(Array.from(m.colIdx)).toEqual([1, 0, 2]);
    expect(Array.from(m.a)).toEqual([5, 7, 0]);
    expect(Array.from(m.b)).toEqual([2, 3, 10]);
    expect(() => csrFromTriplets(2, [0, 2], [0, 0], [1, 1], [0, 0])).toThrow(/outside a 2×2 matrix/);
    expect(() => csrFromTriplets(2, [0], [0], [1, 1], [0])).toThrow(/differ in length/);
  });
});

describe("sparseRhs", () => {
  it("keeps every entry with a real or an imaginary part, in index order, and drops zeros", () => {
    const d = sparseRhs(Float64Array.from([0, 2, 0, -1, 0]), Float64Array.from([0, 0, 3, 0.5, 0]));
    expect(Array.from(d.index)).toEqual([1, 2, 3]);
    expect(Array.from(d.re)).toEqual([2, 0, -1]);
    expect(Array.from(d.im)).toEqual([0, 3, 0.5]);
  });
});

describe("markowitzOrder's pruned search", () => {
  // The search stops before rows that cannot beat or tie the best pivot found (while no column has
  // a single entry, a row of cnt entries costs at least cnt − 1). It must pick the very pivots of
  // the plain restricted search: seeded random matrices of several densities, chains with
  // couplings (the shape it speeds up), and the ladder-like matrices of circuits.
  const bothOrders = (d: Dense) => {
    const a = sparseFromDense(d.re, d.im);
    const tests = new PivotTests(a.n, 1e-14);
    tests.full(a, a.re, a.im);
    const scaled = tests.scaled(a, a.re, a.im);
    const opt = { pivotThreshold: 0.1, absTolerance: tests.absTol, searchRows: 4 };
    return [
      markowitzOrder(a, scaled.re, scaled.im, opt),
      markowitzOrder(a, scaled.re, scaled.im, { ...opt, prune: false }),
    ] as const;
  };
  const chain = (n: number, seed: number): Dense => {
    const rnd = mulberry32(seed);
    const re = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const im = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    for (let i = 0; i < n; i++) {
      re[i]![i] = 2 + rnd();
      im[i]![i] = rnd() - 0.5;
      if (i + 1 < n) {
        re[i]![i + 1] = -1;
        re[i + 1]![i] = -1;
      }
      if (rnd() < 0.05) re[i]![Math.floor(rnd() * n)] = 0.01;
    }
    return { re, im };
  };
  it("picks the same pivots as the plain search", () => {
    let pruned = 0;
    for (let seed = 1; seed <= 24; seed++) {
      const d =
        seed % 3 === 0
          ? chain(40 + seed, seed)
          : randomSystem(20 + seed, 0.04 + 0.01 * (seed % 5), 500 + seed);
      const [a, b] = bothOrders(d);
      expect(a.ok).toBe(b.ok);
      if (!a.ok || !b.ok) continue;
      expect(Array.from(a.symbolic.rowPerm)).toEqual(Array.from(b.symbolic.rowPerm));
      expect(Array.from(a.symbolic.colPerm)).toEqual(Array.from(b.symbolic.colPerm));
      expect(Array.from(a.symbolic.lIdx)).toEqual(Array.from(b.symbolic.lIdx));
      expect(Array.from(a.symbolic.uIdx)).toEqual(Array.from(b.symbolic.uIdx));
      pruned++;
    }
    expect(pruned).toBeGreaterThan(20);
  });
});

describe("factorNumeric's two ways", () => {
  // An order whose elimination would record more updates than a plan may hold is factored with a
  // dense scatter vector instead (sparse-lu-scatter.ts): the same arithmetic in the same order, so
  // the same factors. Seeded random matrices, both ways from one ordering, compared number by number.
  it("the scatter factorization gives the plan's L, U, pivots and solution", () => {
    for (let seed = 1; seed <= 8; seed++) {
      const n = 12 + seed * 3;
      const d = randomSystem(n, 0.15, 100 + seed, seed % 2 === 0);
      const a = sparseFromDense(d.re, d.im);
      const tests = new PivotTests(n, 1e-14);
      tests.full(a, a.re, a.im);
      const scaled = tests.scaled(a, a.re, a.im);
      const order = markowitzOrder(a, scaled.re, scaled.im, {
        pivotThreshold: 0.1,
        absTolerance: tests.absTol,
        searchRows: 4,
      });
      if (!order.ok) throw new Error(`seed ${seed}: no order`);
      tests.prepare(order.symbolic);
      const factor = (scatter: boolean) => {
        const f = new LUFactors(a);
        f.use(order.symbolic);
        if (scatter) f.plan = { ...f.plan!, upd: null };
        expect(factorNumeric(f, tests, a.re, a.im, 1, 0.1)).toBe(true);
        return f;
      };
      const byPlan = factor(false);
      const byScatter = factor(true);
      // L's and U's slots (the plan also keeps each pivot in its slot; both keep 1/pivot in inv).
      const lu = 2 * (order.symbolic.lIdx.length + order.symbolic.uIdx.length);
      expect(byScatter.fac.length).toBe(byPlan.fac.length);
      for (let t = 0; t < lu; t++) expect(byScatter.fac[t]).toBe(byPlan.fac[t]);
      expect(Array.from(byScatter.inv)).toEqual(Array.from(byPlan.inv));
      const rnd = mulberry32(seed);
      const bRe = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const bIm = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const solve = (f: LUFactors) => {
        const x = { re: new Float64Array(n), im: new Float64Array(n) };
        expect(solveFactors(f, bRe, bIm, x.re, x.im)).toBe(true);
        return x;
      };
      const x1 = solve(byPlan);
      const x2 = solve(byScatter);
      expect(Array.from(x2.re)).toEqual(Array.from(x1.re));
      expect(Array.from(x2.im)).toEqual(Array.from(x1.im));
      // And the solution is one: A·x = b to rounding.
      for (let i = 0; i < n; i++) {
        let sr = 0;
        let si = 0;
        for (let j = 0; j < n; j++) {
          sr += d.re[i]![j]! * x1.re[j]! - d.im[i]![j]! * x1.im[j]!;
          si += d.re[i]![j]! * x1.im[j]! + d.im[i]![j]! * x1.re[j]!;
        }
        expect(Math.hypot(sr - bRe[i]!, si - bIm[i]!)).toBeLessThan(1e-10);
      }
    }
  });
});

function sparseDense(
  rowPtr: Int32Array,
  colIdx: Int32Array,
  re: Float64Array,
  im: Float64Array,
  n: number,
): Dense {
  const out = { re: Array.from({ length: n }, () => new Array<number>(n).fill(0)), im: [] as number[][] };
  out.im = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
      out.re[i]![colIdx[p]!] = re[p]!;
      out.im[i]![colIdx[p]!] = im[p]!;
    }
  }
  return out;
}

it("relClose treats 0 and NaN deliberately", () => {
  expect(relClose(0, 0)).toBe(true);
  expect(relClose(0, 1e-300)).toBe(false);
  expect(relClose(0, 1e-300, 1e-9, 1e-200)).toBe(true);
  expect(relClose(Number.NaN, Number.NaN)).toBe(true);
  expect(relClose(Number.NaN, 1)).toBe(false);
  expect(relClose(1, 1 + 1e-10)).toBe(true);
});
