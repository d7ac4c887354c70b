/**
 * Radix-2 complex FFT, in place, iterative (J. W. Cooley and J. W. Tukey, "An algorithm for the
 * machine calculation of complex Fourier series", Math. Comp. 19, 1965). Forward transform:
 * X[k] = Σ x[i]·e^(−j2πik/M) (no scaling); the caller divides by M for two-sided coefficients.
 */

/** The smallest power of two ≥ n. */
export function powerOfTwoAtLeast(n: number): number {
  let m = 1;
  while (m < n) m *= 2;
  return m;
}

const twiddles = new Map<number, { cos: Float64Array; sin: Float64Array }>();

function table(m: number) {
  let t = twiddles.get(m);
  if (!t) {
    const cos = new Float64Array(m / 2);
    const sin = new Float64Array(m / 2);
    for (let i = 0; i < m / 2; i++) {
      cos[i] = Math.cos((2 * Math.PI * i) / m);
      sin[i] = Math.sin((2 * Math.PI * i) / m);
    }
    t = { cos, sin };
    twiddles.set(m, t);
  }
  return t;
}

/** In-place forward FFT of (re, im); the length must be a power of two. */
export function fft(re: Float64Array, im: Float64Array): void {
  const m = re.length;
  if (m <= 1) return;
  if ((m & (m - 1)) !== 0) throw new Error(`fft: length ${m} is not a power of two`);
  for (let i = 1, j = 0; i < m; i++) {
    let bit = m >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      const tr = re[i]!;
      re[i] = re[j]!;
      re[j] = tr;
      const ti = im[i]!;
      im[i] = im[j]!;
      im[j] = ti;
    }
  }
  const { cos, sin } = table(m);
  for (let len = 2; len <= m; len *= 2) {
    const half = len / 2;
    const step = m / len;
    for (let start = 0; start < m; start += len) {
      for (let k = 0; k < half; k++) {
        const wr = cos[k * step]!;
        const wi = -sin[k * step]!;
        const a = start + k;
        const b = a + half;
        const xr = re[b]! * wr - im[b]! * wi;
        const xi = re[b]! * wi + im[b]! * wr;
        re[b] = re[a]! - xr;
        im[b] = im[a]! - xi;
        re[a] = re[a]! + xr;
        im[a] = im[a]! + xi;
      }
    }
  }
}

/**
 * Two-sided harmonic coefficients 0…count−1 of a real periodic signal sampled at M = samples.length
 * uniform points over one period: C_k = (1/M)·Σ x_i·e^(−j2πik/M).
 */
export function harmonicsOf(samples: Float64Array, count: number): { re: Float64Array; im: Float64Array } {
  const m = samples.length;
  const re = Float64Array.from(samples);
  const im = new Float64Array(m);
  fft(re, im);
  const outRe = new Float64Array(count);
  const outIm = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    outRe[k] = re[k]! / m;
    outIm[k] = im[k]! / m;
  }
  return { re: outRe, im: outIm };
}

/**
 * Samples of x(t) = C_0 + Σ_{k=1..N} 2·Re(C_k·e^(jkθ)) at θ_i = 2πi/M (two-sided coefficients C_k,
 * C_0 real), by one inverse transform.
 */
export function synthesize(cRe: Float64Array, cIm: Float64Array, m: number): Float64Array {
  const re = new Float64Array(m);
  const im = new Float64Array(m);
  const n = cRe.length;
  // x_i = Σ_k C_k e^{+j..}: conjugate in, forward FFT, conjugate out (real result).
  re[0] = cRe[0]!;
  for (let k = 1; k < n && k < m / 2; k++) {
    re[k] = cRe[k]!;
    im[k] = -cIm[k]!;
    re[m - k] = cRe[k]!;
    im[m - k] = cIm[k]!;
  }
  fft(re, im);
  return re;
}
