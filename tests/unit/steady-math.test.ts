import { describe, expect, it } from "vitest";
import { analysisSections } from "@/components/analyses/analysis-math";
import { spectrumDbc, timeAxis } from "@/components/analyses/steady-math";
import { solveNetlist } from "@/solver";
import type { SteadyProbe } from "@/solver/types";

const probe = (amplitudes: number[]): SteadyProbe => ({
  probe: "volts(out)",
  amplitudes,
  phasesDeg: amplitudes.map(() => 0),
  dc: 0,
  thdPercent: 0,
  waveform: { t: [], value: [] },
});

describe("steady view helpers", () => {
  it("puts harmonics in dB below the fundamental (a tenth is −20 dB, a thousandth −60 dB: 20·log10, common practice)", () => {
    expect(spectrumDbc(probe([2, 0.2, 0, 0.002]))).toEqual({ harmonic: [2, 4], dbc: [-20, -60] });
    expect(spectrumDbc(probe([0, 1]))).toEqual({ harmonic: [], dbc: [] });
  });

  it("reads a period of 98 µs in µs and one of 2 ms in ms", () => {
    expect(timeAxis([0, 49e-6, 98e-6])).toEqual({ values: [0, 49, 98], unit: "µs" });
    expect(timeAxis([0, 1e-3, 2e-3]).unit).toBe("ms");
  });

  it("shows the steady section after the verdict when the result has one", () => {
    const r = solveNetlist(`Rs: resistor out mid 10k
Cs: capacitor mid pos 10n
Rp: resistor pos gnd 10k
Cp: capacitor pos gnd 10n
U1: opamp pos neg out swing=12V
Rf: resistor neg out 24k
Rg: resistor neg gnd 10k
loop T cut out before Rs
steady T
poles`);
    if (!r.ok) throw new Error(r.errors[0]!.message);
    expect(analysisSections(r, "ok")).toEqual(["verdict", "steady", "poles"]);
  });
});
