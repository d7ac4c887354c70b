// The static chart drawn before the charting library loads: ticks, paths, bars and lines laid out from
// the same figure objects the interactive chart gets (components/plot/static-scene.ts).
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { histogramBars, histogramMarks } from "@/components/analyses/analysis-math";
import { buildBodeFigure } from "@/components/plot/bode-figure";
import { linearLabels, linearTicks, logTicks, niceStep, siLabel } from "@/components/plot/static-axes";
import { StaticFigure } from "@/components/plot/static-figure";
import { dashArray, layoutScene, plainText } from "@/components/plot/static-scene";

// A first-order low-pass, corner 1 kHz, 10 Hz … 100 kHz at 20 points per decade:
// |H| = −10·log10(1 + (f/fc)²) dB, ∠H = −atan(f/fc) (common practice).
const fc = 1000;
const frequencies = Array.from({ length: 81 }, (_, k) => 10 * 10 ** (k / 20));
const lowpass = {
  name: "H",
  frequencies,
  magnitudeDb: frequencies.map((f) => -10 * Math.log10(1 + (f / fc) ** 2)),
  phaseDeg: frequencies.map((f) => (-Math.atan(f / fc) * 180) / Math.PI),
};
const base = { overlays: [], measurements: [], markers: [], pins: [], focusHz: null, cursors: [] };

describe("static axes", () => {
  it("steps 1-2-5 × 10ⁿ above the rough step", () => {
    expect([0.3, 1.2, 3, 7, 42].map(niceStep)).toEqual([0.5, 2, 5, 10, 50]);
  });

  it("labels linear ticks plainly up to 9999, with an SI prefix beyond, and a true minus", () => {
    expect(linearLabels([-20, -10, 0, 10], 10)).toEqual(["−20", "−10", "0", "10"]);
    expect(linearLabels([0, 0.5, 1, 1.5], 0.5)).toEqual(["0", "0.5", "1", "1.5"]);
    expect(linearLabels([0, 10000, 20000], 10000)).toEqual(["0", "10k", "20k"]);
    expect(linearLabels([0, 0.0001, 0.0002], 0.0001)).toEqual(["0", "100µ", "200µ"]);
    expect(linearLabels([1000, 1500, 2000], 500)).toEqual(["1000", "1500", "2000"]);
    // A 2.5 step keeps its digits: "0.0025", not a rounded "0.003".
    expect(linearLabels([-0.005, -0.0025, 0, 0.0025], 0.0025)).toEqual(["−0.005", "−0.0025", "0", "0.0025"]);
  });

  it("writes log values with SI prefixes like the library's ~s", () => {
    expect([10, 100, 1000, 20_000, 1e6, 0.5, 2e-6].map(siLabel)).toEqual([
      "10",
      "100",
      "1k",
      "20k",
      "1M",
      "500m",
      "2µ",
    ]);
  });

  it("puts decade ticks on a log axis with dtick 1, and 1-2-5 ticks for D2", () => {
    const decades = logTicks(1, 5, { dtick: 1, tickformat: "~s" }, 900, "x");
    expect(decades.map((t) => t.at)).toEqual([1, 2, 3, 4, 5]);
    expect(decades.map((t) => t.label)).toEqual(["10", "100", "1k", "10k", "100k"]);
    const d2 = logTicks(2, 3.5, { dtick: "D2", tickformat: "~s" }, 900, "x");
    expect(d2.map((t) => t.label)).toEqual(["100", "200", "500", "1k", "2k"]);
    // No slack at the far end: a range ending a hair below 1 kHz leaves its tick out.
    expect(logTicks(2, Math.log10(999.999), { dtick: "D2", tickformat: "~s" }, 900, "x")).toHaveLength(3);
    // Without a tickformat the digits between decades are small plain digits.
    const bare = logTicks(2, 3.1, { dtick: "D2" }, 900, "x");
    expect(bare.map((t) => [t.label, Boolean(t.minor)])).toEqual([
      ["100", false],
      ["2", true],
      ["5", true],
      ["1000", false],
    ]);
    // …and decades are plain up to 1000, SI-prefixed beyond, as the library's default SI format.
    expect(logTicks(-4, 5, { dtick: 1 }, 900, "x").map((t) => t.label)).toEqual([
      "100µ",
      "0.001",
      "0.01",
      "0.1",
      "1",
      "10",
      "100",
      "1000",
      "10k",
      "100k",
    ]);
  });

  it("chooses the library's auto steps: about one tick per 40 px up a 400 px axis", () => {
    // 10 ticks over −42…2: rough 4.4 → step 5.
    expect(linearTicks(-42, 2, {}, 400, "y").map((t) => t.label)).toEqual([
      "−40",
      "−35",
      "−30",
      "−25",
      "−20",
      "−15",
      "−10",
      "−5",
      "0",
    ]);
    expect(linearTicks(-95, 5, { tick0: 0, dtick: 45 }, 200, "y").map((t) => t.at)).toEqual([-90, -45, 0]);
  });
});

describe("static Bode figure", () => {
  it("lays out decade frequency ticks 10 … 100k evenly across the plot on a phone", () => {
    const figure = buildBodeFigure({ ...base, series: [lowpass], compact: true });
    const scene = layoutScene(figure, 390, 416);
    const x2 = scene.axes.x2!;
    expect(x2.type).toBe("log");
    expect(x2.range).toEqual([1, 5]);
    expect(x2.ticks.map((t) => t.label)).toEqual(["10", "100", "1k", "10k", "100k"]);
    // margin l 46, r 12 → the plot spans 46…378 px: a decade is 83 px.
    const labels = scene.texts.filter((t) => ["10", "100", "1k", "10k", "100k"].includes(t.text));
    expect(labels.map((t) => Math.round(t.x))).toEqual([46, 129, 212, 295, 378]);
    // The magnitude row shows no frequency labels (its x axis hides them): each label appears once.
    expect(labels).toHaveLength(5);
  });

  it("draws the magnitude through the corner: −3.01 dB at 1 kHz on the row's own scale", () => {
    const figure = buildBodeFigure({ ...base, series: [lowpass], compact: false });
    const scene = layoutScene(figure, 1000, 520);
    const y = scene.axes.y!;
    const mag = scene.traces[0]!;
    const points = mag.path
      .slice(1)
      .split("L")
      .map((p) => p.split(",").map(Number) as [number, number]);
    expect(points).toHaveLength(81);
    // Point 40 is 1 kHz: its height on the y axis reads back −3.0103 dB.
    const [lo, hi] = y.range;
    const at = lo + ((y.start - points[40]![1]) / y.length) * (hi - lo);
    expect(at).toBeCloseTo(-3.0103, 1);
    // The phase ticks are the layout's 45° steps from 0.
    expect(scene.axes.y2!.ticks.map((t) => t.label)).toEqual(["−90", "−45", "0"]);
    // The legend names the trace once (its phase half is not listed).
    expect(scene.legend.map((l) => l.text)).toEqual(["H"]);
  });

  it("breaks a trace at a null, as the library does with connectgaps off", () => {
    const gap = {
      ...lowpass,
      magnitudeDb: lowpass.magnitudeDb.map((v, i) => (i === 30 || i === 60 || i === 62 ? null : v)),
    };
    const scene = layoutScene(buildBodeFigure({ ...base, series: [gap], compact: false }), 1000, 520);
    const runs = scene.traces[0]!.path.split("M").filter(Boolean);
    // 0…29, 31…59, [61 alone: no line], 63…80.
    expect(runs.map((r) => r.split("L").length)).toEqual([30, 29, 18]);
  });

  it("labels a marker with its value and escapes nothing twice", () => {
    const figure = buildBodeFigure({
      ...base,
      series: [{ ...lowpass, name: "a<b" }],
      markers: [{ frequencyHz: 1000, label: "fc" }],
      compact: false,
    });
    const scene = layoutScene(figure, 1000, 520);
    const marker = scene.texts.find((t) => t.text.startsWith("fc"));
    expect(marker?.text).toBe("fc 1 kHz");
    // The marker's label is centred on its line: 1 kHz is half way along 10 Hz … 100 kHz.
    const x = scene.axes.x!;
    expect(marker!.x).toBeCloseTo(x.start + x.length / 2, 5);
    expect(scene.legend[0]!.text).toBe("a<b");
    expect(plainText("<b>A</b>")).toEqual({ text: "A", bold: true });
  });
});

describe("static histogram", () => {
  it("draws the bars from their edges and a limit line at its value, the x range stretched to include it", () => {
    const edges = [1400, 1450, 1500, 1550, 1600, 1650];
    const bars = histogramBars(edges, [3, 10, 22, 9, 1]);
    const marks = histogramMarks(1520, [
      { name: "f0", op: "<", value: 1700, expression: "f0 < 1.7k", yield: 1 },
    ]);
    const figure = {
      data: [{ type: "bar", x: bars.x, y: bars.y, width: bars.width, marker: { color: "#123456" } }],
      layout: {
        margin: { l: 48, r: 12, t: 28, b: 44 },
        xaxis: { zeroline: false },
        yaxis: { rangemode: "tozero" },
        shapes: marks.map((m) => ({ type: "line", x0: m.x, x1: m.x, yref: "paper", y0: 0, y1: 1 })),
      },
    };
    const scene = layoutScene(figure, 460, 248);
    const x = scene.axes.x!;
    // Bars span 1400…1650; the limit at 1700 widens the range to it (shapes count in the auto range).
    expect(x.range).toEqual([1400, 1700]);
    const limit = scene.above.find((s) => "x1" in s && Math.abs(s.x1 - (48 + 400)) < 1e-6);
    expect(limit).toBeDefined();
    // The nominal line at 1520: 120/300 of the 400 px plot from its left edge.
    expect(scene.above.some((s) => "x1" in s && Math.abs(s.x1 - (48 + 160)) < 1e-6)).toBe(true);
    const rects = scene.traces[0]!.bars;
    expect(rects).toHaveLength(5);
    expect(rects[0]!.x).toBeCloseTo(48, 6);
    expect(rects[0]!.w).toBeCloseTo((50 / 300) * 400, 6);
    // Counts from zero: the tallest bar (22) reaches 1/1.0556 of the plot height (5 % padding on top).
    const plotH = 248 - 28 - 44;
    expect(rects[2]!.h).toBeCloseTo((22 / (22 * (1 + 0.05 / 0.9))) * plotH, 4);
  });

  it("scales dashes by the line width like the library (at least 3 px)", () => {
    expect(dashArray("dot", 1.5)).toBe("3,3");
    expect(dashArray("dash", 2)).toBe("9,9");
    expect(dashArray("dashdot", 4)).toBe("12,4,4,4");
    expect(dashArray("solid", 2)).toBeUndefined();
  });
});

describe("static figure markup", () => {
  it("server-renders an img with the plot's label, unique clip ids, and every trace clipped to one of them", () => {
    // A compare-like figure: a Δ overlay on its own axes shares its row's rectangle.
    const diff = {
      ...lowpass,
      name: "Δ",
      magnitudeDb: lowpass.magnitudeDb.map((v) => v / 100),
      role: "difference" as const,
    };
    const figure = buildBodeFigure({ ...base, series: [lowpass], overlays: [diff], compact: false });
    const html = renderToStaticMarkup(
      createElement(StaticFigure, {
        ...figure,
        label: "Bode plot of H",
        nominal: { width: 1000, height: 520 },
      }),
    );
    expect(html).toMatch(/^<svg role="img" aria-label="Bode plot of H" data-static-plot=""/);
    const ids = [...html.matchAll(/<clipPath id="([^"]+)"/g)].map((m) => m[1]);
    expect(ids).toHaveLength(4);
    expect(new Set(ids).size).toBe(ids.length);
    const used = [...html.matchAll(/clip-path="url\(#([^)]+)\)"/g)].map((m) => m[1]);
    expect(used).toHaveLength(4);
    for (const id of used) expect(ids).toContain(id);
    expect(html.match(/data-line=""/g)).toHaveLength(4);
  });
});
