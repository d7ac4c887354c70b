// The LU's WebAssembly kernels (solver/engine/lu-kernels.wat) do the arithmetic of the TypeScript
// kernels they replaced, in the same order: the same numbers bit for bit. The reference functions
// below are those TypeScript kernels, unchanged but for taking plain arrays; each test runs both on
// the same seeded random pencils and compares every double with Object.is. Comparing a rewrite
// against the straightforward form on seeded random inputs is common practice.
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { Equilibration, MAX_SWEEPS } from "@/solver/engine/equilibrate";
import type { Symbolic } from "@/solver/engine/markowitz";
import type { PencilMaxima } from "@/solver/engine/pencil-maxima";
import { SparseComplexLU } from "@/solver/engine/sparse-lu";
import type { LUFactors } from "@/solver/engine/sparse-lu-factors";
import type { PivotTests } from "@/solver/engine/sparse-lu-scaling";
import { type SparseComplexMatrix, sparseFromDense } from "@/solver/engine/sparse-matrix";
import { generated } from "../../scripts/build-wasm.mjs";
import { mulberry32 } from "./engine-circuits";

/** A random pencil G + s·C: a dominant diagonal, ~10 % fill, entries over six decades, some tiny. */
function randomPencil(n: number, seed: number): { a: SparseComplexMatrix; g: Float64Array; c: Float64Array } {
  const rnd = mulberry32(seed);
  const re = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const im = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (i !== j && rnd() > 0.1) continue;
      re[i]![j] = rnd() < 0.2 ? 1e-12 : (rnd() - 0.5) * 10 ** Math.floor(rnd() * 6 - 3);
      im[i]![j] = rnd() < 0.5 ? 0 : (rnd() - 0.5) * 1e-9;
    }
    re[i]![i] = re[i]![i]! + 20;
  }
  const a = sparseFromDense(re, im);
  return { a, g: Float64Array.from(a.re), c: Float64Array.from(a.im) };
}

/** The TypeScript elimination the WebAssembly one replaced (returns the failed step or −1). */
function eliminateReference(
  s: Symbolic,
  updStart: Int32Array,
  upd: Int32Array,
  fac: Float64Array,
  inv: Float64Array,
  w: Float64Array,
  cm: Float64Array,
  rm: Float64Array,
  absTol: number,
  tau: number,
  bRe: Float64Array | null,
  bIm: Float64Array | null,
): number {
  const { lPtr, lIdx, uPtr, uIdx, rowPerm, n } = s;
  const fwd = bRe !== null && bIm !== null;
  const offU = lIdx.length;
  const offD = offU + uIdx.length;
  const tol2 = absTol * absTol;
  const half = 0.5 * tau * tau;
  let l0 = 0;
  let u0 = offU;
  for (let k = 0; k < n; k++) {
    const l1 = lPtr[k + 1]!;
    const u1 = offU + uPtr[k + 1]!;
    const dk = 2 * (offD + k);
    let yr = 0;
    let yi = 0;
    if (fwd) {
      yr = bRe[rowPerm[k]!]!;
      yi = bIm[rowPerm[k]!]!;
    }
    for (let q = l0; q < l1; q++) {
      const j = lIdx[q]!;
      const xr = fac[2 * q]!;
      const xi = fac[2 * q + 1]!;
      const ir = inv[2 * j]!;
      const ii = inv[2 * j + 1]!;
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      fac[2 * q] = lr;
      fac[2 * q + 1] = li;
      if (fwd) {
        const wr = w[2 * j]!;
        const wi = w[2 * j + 1]!;
        yr -= lr * wr - li * wi;
        yi -= lr * wi + li * wr;
      }
      if (lr === 0 && li === 0) continue;
      const t0 = offU + uPtr[j]!;
      for (let m = updStart[q]!, t = t0; m < updStart[q + 1]!; m++, t++) {
        const c = 2 * upd[m]!;
        const ur = fac[2 * t]!;
        const ui = fac[2 * t + 1]!;
        fac[c] = fac[c]! - (lr * ur - li * ui);
        fac[c + 1] = fac[c + 1]! - (lr * ui + li * ur);
      }
    }
    const pr = fac[dk]!;
    const pi = fac[dk + 1]!;
    const d = pr * pr + pi * pi;
    const ck = cm[k]!;
    const hk = half * ck;
    let small = d <= tol2 * rm[k]! * ck;
    for (let t = u0; t < u1 && !small; t++) {
      const ur = fac[2 * t]!;
      const ui = fac[2 * t + 1]!;
      const m = (ur < 0 ? -ur : ur) + (ui < 0 ? -ui : ui);
      if (d * cm[uIdx[t - offU]!]! < hk * m * m) small = true;
    }
    l0 = l1;
    u0 = u1;
    if (small) return k;
    const id = 1 / d;
    inv[2 * k] = pr * id;
    inv[2 * k + 1] = -pi * id;
    w[2 * k] = yr;
    w[2 * k + 1] = yi;
  }
  return -1;
}

/** The TypeScript maxima of the pivot tests (pencil-maxima.ts `pencilTests`), as replaced. */
function pencilTestsReference(pen: PencilMaxima, w: number, cm: Float64Array, rm: Float64Array): void {
  const { rowPtr, rowG, rowC, colPtr, colG, colC } = pen;
  for (let k = 0; k < cm.length; k++) {
    let m = 0;
    for (let p = colPtr[k]!; p < colPtr[k + 1]!; p++) {
      const v = colG[p]! + w * colC[p]!;
      if (v > m) m = v;
    }
    cm[k] = m > 0 && m < Number.POSITIVE_INFINITY ? m : 1;
    m = 0;
    for (let p = rowPtr[k]!; p < rowPtr[k + 1]!; p++) {
      const v = rowG[p]! + w * rowC[p]!;
      if (v > m) m = v;
    }
    rm[k] = m > 0 && m < Number.POSITIVE_INFINITY ? m : 1;
  }
}

/** The TypeScript backward pass over every step (x = Q·z), as replaced. */
function backwardReference(
  s: Symbolic,
  fac: Float64Array,
  inv: Float64Array,
  w: Float64Array,
  x: Float64Array[],
) {
  const { colPerm, lIdx, uPtr, uIdx, n } = s;
  const offU = 2 * lIdx.length;
  let finite = 0;
  for (let k = n - 1; k >= 0; k--) {
    let yr = w[2 * k]!;
    let yi = w[2 * k + 1]!;
    for (let t = uPtr[k]!; t < uPtr[k + 1]!; t++) {
      const j = 2 * uIdx[t]!;
      const ur = fac[offU + 2 * t]!;
      const ui = fac[offU + 2 * t + 1]!;
      yr -= ur * w[j]! - ui * w[j + 1]!;
      yi -= ur * w[j + 1]! + ui * w[j]!;
    }
    const zr = yr * inv[2 * k]! - yi * inv[2 * k + 1]!;
    const zi = yr * inv[2 * k + 1]! + yi * inv[2 * k]!;
    w[2 * k] = zr;
    w[2 * k + 1] = zi;
    x[0]![colPerm[k]!] = zr;
    x[1]![colPerm[k]!] = zi;
    finite += zr * 0 + zi * 0;
  }
  return finite === 0;
}

/** The TypeScript forward pass of −M·v, as replaced. */
function forwardOfProductReference(
  s: Symbolic,
  fac: Float64Array,
  w: Float64Array,
  m: { ptr: Int32Array; idx: Int32Array; val: Float64Array },
  vRe: Float64Array,
  vIm: Float64Array,
) {
  const { rowPerm, lPtr, lIdx, n } = s;
  let q0 = 0;
  for (let k = 0; k < n; k++) {
    const r = rowPerm[k]!;
    let yr = 0;
    let yi = 0;
    for (let p = m.ptr[r]!; p < m.ptr[r + 1]!; p++) {
      yr -= m.val[p]! * vRe[m.idx[p]!]!;
      yi -= m.val[p]! * vIm[m.idx[p]!]!;
    }
    for (let q = q0; q < lPtr[k + 1]!; q++) {
      const j = 2 * lIdx[q]!;
      yr -= fac[2 * q]! * w[j]! - fac[2 * q + 1]! * w[j + 1]!;
      yi -= fac[2 * q]! * w[j + 1]! + fac[2 * q + 1]! * w[j]!;
    }
    q0 = lPtr[k + 1]!;
    w[2 * k] = yr;
    w[2 * k + 1] = yi;
  }
}

/** The TypeScript Ruiz sweeps the WebAssembly ones replaced: factors, largest entry, sweeps. */
function equilibrateReference(a: SparseComplexMatrix, re: Float64Array, im: Float64Array) {
  const { rowPtr, colIdx, n } = a;
  const row = new Float64Array(n).fill(1);
  const col = new Float64Array(n).fill(1);
  const rmax = new Float64Array(n);
  const cmax = new Float64Array(n);
  const buf = new Float64Array(1);
  const bits = new Int32Array(buf.buffer);
  const rescale = (factor: Float64Array, max: Float64Array) => {
    let moved = 0;
    for (let i = 0; i < factor.length; i++) {
      const m = max[i]!;
      if (m === 0 || (m >= 0.5 && m < 2) || !(m < Number.POSITIVE_INFINITY) || m < 2.3e-308) continue;
      buf[0] = m;
      const k = -((((bits[1]! >>> 20) & 0x7ff) - 1023 + 1) >> 1);
      bits[0] = 0;
      bits[1] = (k + 1023) << 20;
      const f = factor[i]! * buf[0]!;
      if (f === 0 || !Number.isFinite(f)) continue;
      factor[i] = f;
      moved++;
    }
    return moved;
  };
  let biggest = 0;
  let sweeps = 0;
  for (let sweep = 0; sweep <= MAX_SWEEPS; sweep++) {
    rmax.fill(0);
    cmax.fill(0);
    biggest = 0;
    for (let i = 0; i < n; i++) {
      let m = 0;
      for (let p = rowPtr[i]!; p < rowPtr[i + 1]!; p++) {
        const x = re[p]!;
        const y = im[p]!;
        const v = ((x < 0 ? -x : x) + (y < 0 ? -y : y)) * row[i]! * col[colIdx[p]!]!;
        if (v > m) m = v;
        if (v > cmax[colIdx[p]!]!) cmax[colIdx[p]!] = v;
      }
      rmax[i] = m;
      if (m > biggest) biggest = m;
    }
    sweeps = sweep;
    if (sweep === MAX_SWEEPS) break;
    if (rescale(row, rmax) + rescale(col, cmax) === 0) break;
  }
  return { row, col, biggest, sweeps };
}

/** The TypeScript passes of the transposed solve in steps (w holds Qᵀ·d), as replaced. */
function transposedReference(
  s: Symbolic,
  fac: Float64Array,
  inv: Float64Array,
  w: Float64Array,
  first: number,
) {
  const { lPtr, lIdx, uPtr, uIdx, n } = s;
  const offU = 2 * lIdx.length;
  for (let k = first; k < n; k++) {
    const br = w[2 * k]!;
    const bi = w[2 * k + 1]!;
    if (br === 0 && bi === 0) continue;
    const yr = br * inv[2 * k]! - bi * inv[2 * k + 1]!;
    const yi = br * inv[2 * k + 1]! + bi * inv[2 * k]!;
    w[2 * k] = yr;
    w[2 * k + 1] = yi;
    for (let t = uPtr[k]!; t < uPtr[k + 1]!; t++) {
      const j = 2 * uIdx[t]!;
      w[j] = w[j]! - (fac[offU + 2 * t]! * yr - fac[offU + 2 * t + 1]! * yi);
      w[j + 1] = w[j + 1]! - (fac[offU + 2 * t]! * yi + fac[offU + 2 * t + 1]! * yr);
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const vr = w[2 * k]!;
    const vi = w[2 * k + 1]!;
    if (vr === 0 && vi === 0) continue;
    for (let q = lPtr[k]!; q < lPtr[k + 1]!; q++) {
      const j = 2 * lIdx[q]!;
      w[j] = w[j]! - (fac[2 * q]! * vr - fac[2 * q + 1]! * vi);
      w[j + 1] = w[j + 1]! - (fac[2 * q]! * vi + fac[2 * q + 1]! * vr);
    }
  }
}

const same = (a: ArrayLike<number>, b: ArrayLike<number>) => {
  expect(a.length).toBe(b.length);
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) expect([i, a[i]]).toEqual([i, b[i]]);
};

type Inside = { f: LUFactors; t: PivotTests; opt: { pivotThreshold: number } };

describe("the LU's WebAssembly kernels", () => {
  it("are the binary of lu-kernels.wat (run `npm run build:wasm` after editing it)", async () => {
    const file = path.join(__dirname, "../../solver/engine/lu-kernels-wasm.ts");
    expect(readFileSync(file, "utf8")).toBe(await generated());
  });

  it("equilibrate with the TypeScript sweeps' factors, bit for bit (12 matrices over 600 decades)", () => {
    for (let seed = 1; seed <= 12; seed++) {
      const { a, g, c } = randomPencil(30, seed);
      // Spread the rows and columns over many decades, with a zero row and a NaN-free tiny one.
      const rnd = mulberry32(500 + seed);
      const rs = Array.from({ length: 30 }, () => 10 ** Math.floor(rnd() * 600 - 300));
      const re = Float64Array.from(g, (x, p) => x * rs[a.colIdx[p]!]! * (seed % 3 === 0 ? 1e-300 : 1));
      const im = Float64Array.from(c, (x, p) => x * rs[a.colIdx[p]!]!);
      for (let p = a.rowPtr[3]!; p < a.rowPtr[4]!; p++) re[p] = im[p] = 0;
      const eq = new Equilibration(30);
      const big = eq.compute(a, re, im);
      const ref = equilibrateReference(a, re, im);
      same(eq.row, ref.row);
      same(eq.col, ref.col);
      expect(Object.is(big, ref.biggest)).toBe(true);
      expect(eq.sweeps).toBe(ref.sweeps);
      // Spread over 600 decades, each matrix needs many sweeps (10–11 here): the rescaling is exercised.
      expect(ref.sweeps).toBeGreaterThanOrEqual(5);
      // A second matrix in the same space (the pattern kept, the values copied in again).
      const big2 = eq.compute(a, g, c);
      const ref2 = equilibrateReference(a, g, c);
      same(eq.row, ref2.row);
      same(eq.col, ref2.col);
      expect(Object.is(big2, ref2.biggest)).toBe(true);
    }
  });

  it("eliminate, substitute, solve and solve transposed with the TypeScript kernels' numbers, bit for bit (8 seeds × 5 ω)", () => {
    let failures = 0;
    for (let seed = 1; seed <= 8; seed++) {
      const n = 40;
      const { a, g, c } = randomPencil(n, seed);
      const lu = new SparseComplexLU(a);
      lu.setPencil(g, c);
      const { f, t, opt } = lu as unknown as Inside;
      const rnd = mulberry32(100 + seed);
      const bRe = Float64Array.from({ length: n }, () => rnd() - 0.5);
      const bIm = Float64Array.from({ length: n }, () => (rnd() < 0.5 ? 0 : rnd()));
      for (const omega of [0, 1, 2e3, 1e6, 1e9]) {
        const ok = lu.refactorAt(omega, bRe, bIm);
        const s = f.sym!;
        const plan = f.plan!;
        if (!ok || s !== (lu as unknown as { base: Symbolic }).base) {
          failures++;
          continue;
        }
        // The tests: the maxima of one Ruiz step at ω from the plan's pencil, as the TypeScript had them.
        const cm = new Float64Array(n);
        const rm = new Float64Array(n);
        pencilTestsReference(plan.pencil!, omega, cm, rm);
        same(f.space!.tests.cm, cm);
        same(f.space!.tests.rm, rm);
        // The reference from the same loaded slots, tests and b.
        const fac = new Float64Array(plan.slotG!);
        for (let i = 0; i < plan.cSlots!.length; i++)
          fac[2 * plan.cSlots![i]! + 1] = omega * plan.cValues![i]!;
        const inv = new Float64Array(2 * n);
        const w = new Float64Array(2 * n + 2);
        expect(
          eliminateReference(
            s,
            plan.updStart,
            plan.upd!,
            fac,
            inv,
            w,
            cm,
            rm,
            t.absTol,
            opt.pivotThreshold,
            bRe,
            bIm,
          ),
        ).toBe(-1);
        same(f.fac, fac);
        same(f.inv, inv);
        same(f.w, w);
        // The solve (its forward pass ran along the elimination) and dx/ds's product solve.
        const x = [new Float64Array(n), new Float64Array(n)];
        expect(lu.solve(bRe, bIm, x[0], x[1])).toBe(true);
        const xr = [new Float64Array(n), new Float64Array(n)];
        expect(backwardReference(s, fac, inv, w, xr)).toBe(true);
        same(x[0]!, xr[0]!);
        same(x[1]!, xr[1]!);
        const m = { ptr: a.rowPtr, idx: a.colIdx, val: c };
        const dx = [new Float64Array(n), new Float64Array(n)];
        expect(lu.solveProduct(m, x[0]!, x[1]!, dx[0]!, dx[1]!)).toBe(true);
        forwardOfProductReference(s, fac, w, m, xr[0]!, xr[1]!);
        const dxr = [new Float64Array(n), new Float64Array(n)];
        backwardReference(s, fac, inv, w, dxr);
        same(dx[0]!, dxr[0]!);
        same(dx[1]!, dxr[1]!);
        // The adjoint (noise) solve: Aᵀ·z = d for a d of two entries, z left in pivot order in w.
        const d = {
          index: Int32Array.of(seed % n, (7 * seed) % n),
          re: Float64Array.of(1, -0.5),
          im: Float64Array.of(0, 2),
        };
        const wt = new Float64Array(2 * n + 2);
        let first = n;
        for (let e = 0; e < 2; e++) {
          const k = s.colPos[d.index[e]!]!;
          wt[2 * k] = d.re[e]!;
          wt[2 * k + 1] = d.im[e]!;
          first = Math.min(first, k);
        }
        transposedReference(s, fac, inv, wt, first);
        same(lu.solveTransposedInSteps(d).w, wt);
      }
    }
    // Most of the 40 frequencies keep the first order (the comparison above ran on them).
    expect(failures).toBeLessThan(10);
  });

  it("stop at the same step as the TypeScript elimination when a pivot fails its test", () => {
    let stopped = 0;
    for (let seed = 1; seed <= 8; seed++) {
      const n = 40;
      const { a, g, c } = randomPencil(n, seed);
      const lu = new SparseComplexLU(a);
      lu.setPencil(g, c);
      const { f, t } = lu as unknown as Inside;
      expect(lu.refactorAt(1e3)).toBe(true);
      const s = f.sym!;
      const plan = f.plan!;
      // A threshold no off-diagonal entry of U can meet makes the first row with one fail.
      for (const tau of [1e3, 1e9]) {
        const load = () => {
          const fac = new Float64Array(plan.slotG!);
          for (let i = 0; i < plan.cSlots!.length; i++)
            fac[2 * plan.cSlots![i]! + 1] = 1e3 * plan.cValues![i]!;
          return fac;
        };
        const fac = load();
        const inv = new Float64Array(2 * n);
        const w = new Float64Array(2 * n + 2);
        const k = eliminateReference(
          s,
          plan.updStart,
          plan.upd!,
          fac,
          inv,
          w,
          t.cm,
          t.rm,
          t.absTol,
          tau,
          null,
          null,
        );
        f.fac.set(load());
        f.inv.fill(0);
        f.w.fill(0);
        expect(f.space!.eliminate(t.cm, t.rm, t.absTol * t.absTol, 0.5 * tau * tau, null, null)).toBe(k);
        same(f.fac, fac);
        same(f.inv, inv);
        if (k >= 0) stopped++;
      }
    }
    expect(stopped).toBeGreaterThan(8);
  });
});
