/**
 * Global search for extrema and crossings (issue 8, items 2 and 5). Each reference is the circuit's
 * closed-form response, evaluated and searched here by bisection on its exact derivative or value.
 */
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { hiddenExtrema, type Pt, type Quantity, resolvable } from "@/solver/engine/extrema";
import type { Dual } from "@/solver/engine/probes";
import type { SolveSuccess } from "@/solver/types";
import { expectClose } from "./engine-tolerance";

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}
const measure = (r: SolveSuccess, name: string) => r.measures.find((m) => m.name === name)!;

type C = [number, number];
const add = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]];
const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const inv = (a: C): C => {
  const d = a[0] * a[0] + a[1] * a[1];
  return [a[0] / d, -a[1] / d];
};
const abs = (a: C) => Math.hypot(a[0], a[1]);

/** Bisection of a continuous g with g(a)·g(b) < 0, to the last bit. */
function bisect(g: (x: number) => number, a: number, b: number): number {
  let ga = g(a);
  for (let i = 0; i < 200; i++) {
    const m = (a + b) / 2;
    if (m === a || m === b) break;
    const gm = g(m);
    if (gm * ga > 0) {
      a = m;
      ga = gm;
    } else b = m;
  }
  return (a + b) / 2;
}

describe("peak, bandwidth and q follow the taller peak that falls between samples", () => {
  // Current-driven series of two parallel tanks (common practice: a parallel RLC's impedance
  // peaks at R where ωC = 1/(ωL)). Tank 1: sharp, ≈10 kHz, Q = R1·√(C1/L1) ≈ 50, 7.958 kΩ tall.
  // Tank 2: broad, ≈1 kHz, Q ≈ 1, 3 kΩ tall. Sampled at 5 per decade from 120 Hz, the sharp peak
  // falls between 9.51 kHz and 12 kHz; its samples stay below the broad peak's.
  const [R1, L1, C1, R2, L2, C2] = [7958, 2.533e-3, 100e-9, 3000, 477e-3, 53e-9];
  const z = (f: number): C => {
    const w = 2 * Math.PI * f;
    const tank = (r: number, l: number, c: number) => inv([1 / r, w * c - 1 / (w * l)]);
    return add(tank(R1, L1, C1), tank(R2, L2, C2));
  };
  /** d|Z|²/dω ∝ Re(conj(Z)·dZ/dω), dZ/dω = Σ −Y′/Y², Y′ = j(C + 1/(ω²L)). */
  const slope = (f: number) => {
    const w = 2 * Math.PI * f;
    let dz: C = [0, 0];
    for (const [r, l, c] of [
      [R1, L1, C1],
      [R2, L2, C2],
    ] as const) {
      const y: C = [1 / r, w * c - 1 / (w * l)];
      const yi = inv(y);
      dz = add(dz, mul([0, -(c + 1 / (w * w * l))], mul(yi, yi)));
    }
    const zz = z(f);
    return zz[0] * dz[0] + zz[1] * dz[1];
  };
  const text = `I1: isource gnd a 1
R1: resistor a b 7.958k
L1: inductor a b 2.533m
C1: capacitor a b 100n
R2: resistor b gnd 3k
L2: inductor b gnd 477m
C2: capacitor b gnd 53n
sweep 120Hz to 100kHz log 5 per decade
show H = volts(a)
measure pk = peak(H)
measure bw = bandwidth(H)
measure qq = q(H)
`;

  it("the samples alone would pick the broad peak near 1 kHz", () => {
    const r = solve(text);
    const h = r.traces.find((t) => t.name === "H")!;
    const mags = h.re.map((x, k) => Math.hypot(x, h.im[k]!));
    const k = mags.indexOf(Math.max(...mags));
    expect(r.frequencies[k]).toBeLessThan(2000);
  });

  it("peak = the sharp tank's maximum, bandwidth and q around it (closed form, bisection)", () => {
    const r = solve(text);
    const fpk = bisect(slope, 9900, 10100);
    const top = abs(z(fpk));
    const edge = (f: number) => abs(z(f)) - top / Math.SQRT2;
    const lo = bisect(edge, 9000, fpk);
    const hi = bisect(edge, fpk, 11000);
    expectClose(measure(r, "pk").value, fpk, 1e-9);
    expectClose(measure(r, "bw").value, hi - lo, 1e-8);
    expectClose(measure(r, "qq").value, fpk / (hi - lo), 1e-8);
    expect(top).toBeGreaterThan(7000); // the taller peak indeed
  });
});

describe("a notch between two samples crosses a level and comes back", () => {
  // Series LC to gnd behind 10 Ω: H = jX/(R + jX), X = ωL − 1/(ωC) (common practice). |H| = 0.1
  // where X = ±R/√99; below the notch X < 0: Lω² + (R/√99)ω − 1/C = 0. The −20 dB band is about
  // 16 Hz wide; the nearest samples (3.98 kHz, 5.01 kHz) sit above −20 dB.
  const [R, L, Cn] = [10, 10e-3, 158.3e-9];
  const text = `V1: vsource in gnd 1
R1: resistor in out 10
L1: inductor out m 10m
C1: capacitor m gnd 158.3n
sweep 100Hz to 100kHz log 10 per decade
show H = volts(out) / volts(in)
measure c20 = crossing(H, -20dB)
measure notch = dip(H)
`;
  it("crossing(H, −20 dB) is the notch's lower edge, dip its centre 1/(2π√(LC))", () => {
    const r = solve(text);
    const h = r.traces.find((t) => t.name === "H")!;
    for (let k = 0; k < h.re.length; k++) expect(Math.hypot(h.re[k]!, h.im[k]!)).toBeGreaterThan(0.1);
    const b = R / Math.sqrt(99);
    const w = (-b + Math.sqrt(b * b + (4 * L) / Cn)) / (2 * L);
    expectClose(measure(r, "c20").value, w / (2 * Math.PI), 1e-9);
    expectClose(measure(r, "notch").value, 1 / (2 * Math.PI * Math.sqrt(L * Cn)), 1e-9);
  });
});

describe("two zero-phase crossings close together between samples", () => {
  // H = 1/(1 + R0·Y), Y = jωC0 + 1/(Rl + jX), X = ωL − 1/(ωC): ∠H = 0 where Im Y = 0, i.e.
  // ωC0(Rl² + X²) = X (common practice, admittance algebra). With Rl < 1/(2ωC0) there are two
  // roots, ≈0.25 % apart, just above the series resonance 1/(2π√(LC)); the samples at 50.1 kHz and
  // 63.1 kHz both have negative phase.
  const [Rl, L, C, C0] = [1, 10e-3, 1e-9, 100e-9];
  const text = `V1: vsource in gnd 1
R0: resistor in out 1k
C0: capacitor out gnd 100n
Rl: resistor out m 1
L1: inductor m n 10m
Cs: capacitor n gnd 1n
sweep 1kHz to 1MHz log 10 per decade
show H = volts(out) / volts(in)
measure z0 = zero-phase(H)
`;
  it("zero-phase(H) is the first root (closed form, bisection)", () => {
    const r = solve(text);
    const g = (w: number) => {
      const x = w * L - 1 / (w * C);
      return w * C0 * (Rl * Rl + x * x) - x;
    };
    const ws = 1 / Math.sqrt(L * C);
    const wx = (Rl + Math.sqrt(Rl * Rl + (4 * L) / C)) / (2 * L); // X = Rl: g < 0 there
    expect(g(ws)).toBeGreaterThan(0);
    expect(g(wx)).toBeLessThan(0);
    expectClose(measure(r, "z0").value, bisect(g, ws, wx) / (2 * Math.PI), 1e-9);
  });
});

describe("measures with no meaningful answer are null with a reason", () => {
  it("a flat magnitude (resistive divider) has no peak, dip or band", () => {
    const r = solve(`V1: vsource in gnd 1
R1: resistor in out 1k
R2: resistor out gnd 1k
show H = volts(out) / volts(in)
measure p = peak(H)
measure d = dip(H)
measure b = bandwidth(H)
measure q = q(H)
`);
    for (const name of ["p", "d", "b", "q"]) {
      expect(measure(r, name).value).toBeNull();
      expect(measure(r, name).reason).toMatch(/flat to within rounding/);
    }
  });

  it("unity() of a first-order all-pass, |H| = 1 at every f, is null; its −90° point is 1/(2πRC)", () => {
    // H = (1 − sRC)/(1 + sRC) for the op-amp all-pass with equal R1 = R2 (common practice).
    const r = solve(`V1: vsource in gnd 1
R1: resistor in neg 10k
R2: resistor neg out 10k
R: resistor in p 10k
C: capacitor p gnd 10n
U1: opamp p neg out
sweep 10Hz to 1MHz log 97 per decade
show H = volts(out) / volts(in)
measure u = unity(H)
measure pm = phase-margin(H)
measure f90 = crossing(H, -90deg)
`);
    expect(measure(r, "u").value).toBeNull();
    expect(measure(r, "u").reason).toMatch(/does not cross 1/);
    expect(measure(r, "pm").value).toBeNull();
    expectClose(measure(r, "f90").value, 1 / (2 * Math.PI * 1e-4), 1e-9);
  });
});

describe("no search among samples below the smallest normal double", () => {
  // A trace that zigzags: every interior sample is a local extremum. ln|X| as the quantity.
  const magnitude: Quantity = {
    value: (re, im) => Math.log(Math.hypot(re, im)),
    slope: () => 0,
  };
  const zigzag = (scale: number): Pt[] =>
    Array.from({ length: 9 }, (_, k) => ({ f: 100 * 2 ** k, re: scale * (k % 2 === 0 ? 1 : 3), im: 0 }));

  it("subnormal samples (rounding noise deep in a stop band) cost no solve", () => {
    let solves = 0;
    const at = (): Dual => {
      solves++;
      return { re: 1e-310, im: 0, dRe: 0, dIm: 0 };
    };
    expect(hiddenExtrema(zigzag(1e-310), magnitude, at)).toEqual([]);
    expect(solves).toBe(0);
  });

  it("the same zigzag at normal magnitudes is searched (a solve per candidate at least)", () => {
    let solves = 0;
    const at = (): Dual => {
      solves++;
      return { re: 1e-3, im: 0, dRe: 0, dIm: 0 };
    };
    hiddenExtrema(zigzag(1e-3), magnitude, at);
    expect(solves).toBeGreaterThanOrEqual(7);
  });

  it("resolvable: the smallest normal double is the edge (2^−1022), by max(|Re|, |Im|)", () => {
    expect(resolvable(2 ** -1022, 0)).toBe(true);
    expect(resolvable(0, -(2 ** -1022))).toBe(true);
    expect(resolvable(2 ** -1023, 2 ** -1023)).toBe(false);
    expect(resolvable(0, 0)).toBe(false);
    expect(resolvable(Number.POSITIVE_INFINITY, 0)).toBe(false);
  });
});
