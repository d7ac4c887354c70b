import { describe, expect, it } from "vitest";
import { solveNetlist } from "@/solver";
import { BOLTZMANN, ELEMENTARY_CHARGE, thermalVoltage } from "@/solver/physics";
import { circuitOf, DIVIDER, errorsOf } from "./lang-helpers";

describe("temperature", () => {
  it("defaults to 27 °C = 300.15 K and reads C, °C and K", () => {
    expect(circuitOf(DIVIDER).temperature).toBe(300.15);
    expect(circuitOf(`${DIVIDER}temperature 85C`).temperature).toBeCloseTo(358.15, 12);
    expect(circuitOf(`${DIVIDER}temperature -40°C`).temperature).toBeCloseTo(233.15, 12);
    expect(circuitOf(`${DIVIDER}temperature 310K`).temperature).toBe(310);
  });

  it("refuses a bare number, absolute zero and a second statement, with the place", () => {
    expect(errorsOf(`${DIVIDER}temperature 27`)[0]).toMatchObject({
      line: 4,
      column: 13,
      message: "a temperature needs its unit",
    });
    expect(errorsOf(`${DIVIDER}temperature -300C`)[0]!.message).toMatch(/absolute zero/);
    expect(errorsOf(`${DIVIDER}temperature 27C\ntemperature 30C`)[0]).toMatchObject({ line: 5 });
  });

  it("gives Vt = kT/q = 25.864926 mV at 300.15 K", () => {
    // k = 1.380649e-23 J/K and q = 1.602176634e-19 C are exact (SI Brochure, 9th ed., 2019); CHECKS.md §12.
    expect(BOLTZMANN).toBe(1.380649e-23);
    expect(ELEMENTARY_CHARGE).toBe(1.602176634e-19);
    expect(thermalVoltage(300.15) * 1e3).toBeCloseTo(25.864926, 6);
  });
});

describe("diode and swing", () => {
  it("reads diode options with defaults and the netlist's temperature", () => {
    const c = circuitOf(`${DIVIDER}temperature 50C\nD1: diode out gnd\nD2: diode gnd out is=2n n=1.8`);
    expect(c.parts[3]).toMatchObject({ kind: "diode", diode: { is: 1e-14, n: 1, kelvin: 323.15 } });
    expect(c.parts[4]).toMatchObject({ nodes: ["gnd", "out"], diode: { is: 2e-9, n: 1.8 } });
    expect(errorsOf(`${DIVIDER}D1: diode out gnd is=0`)[0]!.message).toMatch(/saturation current/);
    expect(errorsOf(`${DIVIDER}D1: diode out gnd 1k`)[0]!.message).toMatch(/no value/);
  });

  it("reads swing= on an op-amp and refuses zero", () => {
    const c = circuitOf(`${DIVIDER}U1: opamp out fb fb swing=12V`);
    expect(c.parts[3]!.opamp).toEqual({ swing: 12 });
    expect(errorsOf(`${DIVIDER}U1: opamp out fb fb swing=0`)[0]!.message).toMatch(/swing/);
  });

  it("leaves a small-signal response unchanged: an unbiased diode is practically open, swing ignored", () => {
    // RC low-pass 10 kΩ, 10 nF: |H| = 1/√2 at 1/(2πRC) = 1591.549 Hz (CHECKS.md §1). A diode across the
    // capacitor adds is/(n·Vt) = 1e-14/0.025865 = 3.9e-13 S (NETLIST.md), 4e-9 of 1/R: no visible change.
    const base = `${DIVIDER}U1: opamp out buf buf\nsweep at 1591.549Hz\nshow h = volts(buf)\nmeasure m = mag(h) at 1591.549Hz\n`;
    const plain = solveNetlist(base);
    const limited = solveNetlist(
      `${base.replace("buf buf", "buf buf swing=1V")}D1: diode out gnd\nD2: diode gnd out`,
    );
    if (!plain.ok || !limited.ok) throw new Error("solve failed");
    expect(plain.measures[0]!.value).toBeCloseTo(Math.SQRT1_2, 4);
    expect(limited.measures[0]!.value).toBeCloseTo(plain.measures[0]!.value!, 8);
  });
});
