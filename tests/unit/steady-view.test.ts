/** The steady view renders its words and controls on the server (charts are client-only placeholders). */
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it, vi } from "vitest";
import { solveNetlist } from "@/solver";

vi.mock("@/components/analyses/lazy-plot", () => ({
  ChartFigure: ({ label }: { label: string }) =>
    createElement("figure", { "aria-label": label, "data-chart": "1" }),
}));

const { SteadyView } = await import("@/components/analyses/steady-view");

const bridge = (rf: string, limiter: string) => `Rs: resistor out mid 10k
Cs: capacitor mid pos 10n
Rp: resistor pos gnd 10k
Cp: capacitor pos gnd 10n
U1: opamp pos neg out
Rg: resistor neg gnd 10k
${rf}
${limiter}
show network = volts(pos) / volts(out)
loop T cut out before Rs
steady T`;

describe("SteadyView", () => {
  it("shows the verdict sentence, the probe choice, the THD and three charts", () => {
    const r = solveNetlist(
      bridge("Rf1: resistor neg x 15k\nRf2: resistor x out 7k", "D1: diode x out\nD2: diode out x"),
    );
    if (!r.ok) throw new Error(r.errors[0]!.message);
    const html = renderToStaticMarkup(createElement(SteadyView, { steady: r.steady! }));
    expect(html).toContain("Settles at 4.0 V peak at out, 1.585 kHz, 4.1 % distortion");
    expect(html).toContain('<option value="0" selected="">volts(out)</option>');
    expect(html).toContain("volts(pos)");
    expect(html).toMatch(/THD\s*(<!-- -->)?4\.11(<!-- -->)? %/);
    expect(html.match(/data-chart="1"/g)).toHaveLength(3);
  });

  it("says why when there is no steady oscillation", () => {
    const r = solveNetlist(bridge("Rf: resistor neg out 24k", ""));
    if (!r.ok) throw new Error(r.errors[0]!.message);
    const html = renderToStaticMarkup(createElement(SteadyView, { steady: r.steady! }));
    expect(html).toContain("nothing in the netlist limits the amplitude");
    expect(html).not.toContain("data-chart");
  });
});
