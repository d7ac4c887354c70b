/**
 * The op-amp's second pole (LANGUAGE-NEXT §6) against closed forms.
 */
import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import type { SolveSuccess } from "@/solver/types";
import { expectClose } from "./engine-tolerance";

function solve(text: string): SolveSuccess {
  const r = solveNetlist(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r;
}
const value = (r: SolveSuccess, name: string) => {
  const m = r.measures.find((x) => x.name === name);
  if (m?.value == null) throw new Error(`${name}: ${m?.reason}`);
  return m.value;
};

/**
 * Follower of an op-amp with A(s) = ωT/(s·(1 + s/ω2)) (gbw only, A0 → ∞): the loop gain crosses unity
 * at x = ωc/ω2 with x²(1 + x²) = (ωT/ω2)², and the phase margin is 90° − atan(x). Derivation from the
 * two-pole model (CHECKS "Also usable": no published source; the same algebra as S. Franco, *Design with
 * Operational Amplifiers and Analog Integrated Circuits*, ch. 8 — from memory).
 */
function followerPm(gbw: number, pole2: number) {
  const k = gbw / pole2;
  const x = Math.sqrt((Math.sqrt(1 + 4 * k * k) - 1) / 2);
  return { pm: 90 - (Math.atan(x) * 180) / Math.PI, fc: x * pole2 };
}

const follower = (gbw: string, pole2: string, extra = "") => `
Vin: vsource in gnd 1
U1:  opamp in neg out gbw=${gbw} pole2=${pole2} ${extra}
Rf:  resistor out neg 1
Rl:  resistor out gnd 10k
sweep 1kHz to 100MHz log 50 per decade
loop T cut out before Rf
measure pm = phase-margin(T)
measure fc = unity(T)
`;

describe("op-amp pole2 (LANGUAGE-NEXT §6)", () => {
  it("follower, GBW = pole2 = 1 MHz: phase margin 51.83° at 0.786 MHz (closed form)", () => {
    const r = solve(follower("1M", "1M"));
    const want = followerPm(1e6, 1e6);
    expectClose(want.pm, 51.827, 1e-4); // x² = (√5 − 1)/2, the golden-ratio case
    expectClose(value(r, "pm"), want.pm, 1e-7);
    expectClose(value(r, "fc"), want.fc, 1e-7);
  });

  it("follower, GBW 10 MHz, pole2 3 MHz, A0 = 1e6: within 1e-4 of the infinite-gain closed form", () => {
    const r = solve(follower("10M", "3M", "gain=1e6"));
    expectClose(value(r, "pm"), followerPm(10e6, 3e6).pm, 1e-4);
  });

  it("pole2 adds a pole at −2π·F2 to `poles` and needs gbw or gain", () => {
    const r = solve(`${follower("5M", "1M")}\npoles\n`);
    // Closed loop 1/(1 + s/ωT + s²/(ωT·ω2)): ω0² = ωT·ω2 = (2π)²·5e12, Q = √(ωT/ω2) (common practice).
    const w0 = 2 * Math.PI * Math.sqrt(5e12);
    const pair = r.poles!.filter((p) => p.im !== 0);
    expect(pair).toHaveLength(2);
    expectClose(Math.hypot(pair[0]!.re, pair[0]!.im), w0, 1e-9);
    expectClose(pair[0]!.q!, Math.sqrt(5), 1e-9);
    const bad = solveNetlist("Vin: vsource in gnd 1\nU1: opamp in out out pole2=1M\nshow v = volts(out)\n");
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors[0]!.message).toContain("pole2= needs gbw= or gain=");
  });
});
