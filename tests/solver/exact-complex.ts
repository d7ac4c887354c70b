/**
 * An independent reference solver for tests: dense complex Gaussian elimination with FULL pivoting
 * in double-double arithmetic (about 32 significant digits), sharing no code with the engine.
 *
 * Double-double: T. J. Dekker, "A floating-point technique for extending the available precision",
 * Numerische Mathematik 18 (1971) 224–242 (exact product by splitting, add2/mul2/div2); exact sum
 * of two doubles as in D. E. Knuth, The Art of Computer Programming vol. 2, §4.2.2 (TwoSum).
 * A value is the unevaluated sum hi + lo with |lo| ≤ ulp(hi)/2.
 */
export type DD = [number, number];

function twoSum(a: number, b: number): DD {
  const s = a + b;
  const bb = s - a;
  return [s, a - (s - bb) + (b - bb)];
}
function quick(a: number, b: number): DD {
  const s = a + b;
  return [s, b - (s - a)];
}
function split(a: number): DD {
  const c = 134217729 * a; // 2^27 + 1 (Dekker's splitter)
  const hi = c - (c - a);
  return [hi, a - hi];
}
function twoProd(a: number, b: number): DD {
  const p = a * b;
  const [ah, al] = split(a);
  const [bh, bl] = split(b);
  return [p, ah * bh - p + ah * bl + al * bh + al * bl];
}
export const dd = (x: number): DD => [x, 0];
export function add(a: DD, b: DD): DD {
  const [s, e] = twoSum(a[0], b[0]);
  const [t, f] = twoSum(a[1], b[1]);
  const [s2, e2] = quick(s, e + t);
  return quick(s2, e2 + f);
}
export const neg = (a: DD): DD => [-a[0], -a[1]];
export const sub = (a: DD, b: DD): DD => add(a, neg(b));
export function mul(a: DD, b: DD): DD {
  const [p, e] = twoProd(a[0], b[0]);
  return quick(p, e + (a[0] * b[1] + a[1] * b[0]));
}
export function div(a: DD, b: DD): DD {
  const q1 = a[0] / b[0];
  let r = sub(a, mul(dd(q1), b));
  const q2 = r[0] / b[0];
  r = sub(r, mul(dd(q2), b));
  const q3 = r[0] / b[0];
  return add(quick(q1, q2), dd(q3));
}

/** A complex double-double. */
export interface CDD {
  re: DD;
  im: DD;
}
export const cdd = (re: number, im = 0): CDD => ({ re: dd(re), im: dd(im) });
const cadd = (a: CDD, b: CDD): CDD => ({ re: add(a.re, b.re), im: add(a.im, b.im) });
const csub = (a: CDD, b: CDD): CDD => ({ re: sub(a.re, b.re), im: sub(a.im, b.im) });
const cmul = (a: CDD, b: CDD): CDD => ({
  re: sub(mul(a.re, b.re), mul(a.im, b.im)),
  im: add(mul(a.re, b.im), mul(a.im, b.re)),
});
function cdiv(a: CDD, b: CDD): CDD {
  const d = add(mul(b.re, b.re), mul(b.im, b.im));
  const nr = add(mul(a.re, b.re), mul(a.im, b.im));
  const ni = sub(mul(a.im, b.re), mul(a.re, b.im));
  return { re: div(nr, d), im: div(ni, d) };
}
const cabs = (a: CDD) => Math.hypot(a.re[0], a.im[0]);

/**
 * Solve A·x = b (A dense n×n of complex double-doubles, b length n) by Gaussian elimination with
 * full pivoting (largest remaining |entry| as pivot). Returns x rounded to doubles, or null when a
 * pivot is exactly zero. O(n³) double-double operations; meant for n ≲ 60.
 */
export function solveExact(a: CDD[][], b: CDD[]): { re: number; im: number }[] | null {
  const n = b.length;
  const m = a.map((row) => row.slice());
  const rhs = b.slice();
  const colOf = Array.from({ length: n }, (_, j) => j);
  for (let k = 0; k < n; k++) {
    let pr = k;
    let pc = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      for (let j = k; j < n; j++) {
        const v = cabs(m[i]![j]!);
        if (v > best) {
          best = v;
          pr = i;
          pc = j;
        }
      }
    }
    if (!(best > 0)) return null;
    [m[k], m[pr]] = [m[pr]!, m[k]!];
    [rhs[k], rhs[pr]] = [rhs[pr]!, rhs[k]!];
    for (const row of m) [row[k], row[pc]] = [row[pc]!, row[k]!];
    [colOf[k], colOf[pc]] = [colOf[pc]!, colOf[k]!];
    const piv = m[k]![k]!;
    for (let i = k + 1; i < n; i++) {
      const l = cdiv(m[i]![k]!, piv);
      if (l.re[0] === 0 && l.im[0] === 0) continue;
      for (let j = k + 1; j < n; j++) m[i]![j] = csub(m[i]![j]!, cmul(l, m[k]![j]!));
      rhs[i] = csub(rhs[i]!, cmul(l, rhs[k]!));
    }
  }
  const y: CDD[] = new Array(n);
  for (let k = n - 1; k >= 0; k--) {
    let s = rhs[k]!;
    for (let j = k + 1; j < n; j++) s = csub(s, cmul(m[k]![j]!, y[j]!));
    y[k] = cdiv(s, m[k]![k]!);
  }
  const x = new Array<{ re: number; im: number }>(n);
  for (let k = 0; k < n; k++) {
    const v = y[k]!;
    x[colOf[k]!] = { re: v.re[0] + v.re[1], im: v.im[0] + v.im[1] };
  }
  return x;
}

/** Sum of CDDs (exported for building matrices from stamps). */
export const csum = (a: CDD, b: CDD) => cadd(a, b);
