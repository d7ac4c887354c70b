import { describe, expect, it } from "vitest";
import { buildBodeFigure } from "@/components/plot/bode-figure";
import { phaseTicks } from "@/components/plot/bode-layout";
import { GL_THRESHOLD } from "@/components/plot/bode-traces";
import { deltaTicks } from "@/components/plot/delta-ticks";

function series(name: string, n: number) {
  const frequencies = Array.from({ length: n }, (_, k) => 10 * 10 ** (k / 100));
  return { name, frequencies, magnitudeDb: frequencies.map(() => -3), phaseDeg: frequencies.map(() => -45) };
}

const base = { overlays: [], measurements: [], markers: [], pins: [], focusHz: null, compact: false };

describe("buildBodeFigure", () => {
  it("draws each trace as magnitude over phase on linked log axes", () => {
    const { data, layout } = buildBodeFigure({ ...base, series: [series("h", 201)] });
    expect(data).toHaveLength(2);
    const [mag, phase] = data as { type: string; xaxis: string; yaxis: string; showlegend: boolean }[];
    expect([mag!.xaxis, mag!.yaxis, phase!.xaxis, phase!.yaxis]).toEqual(["x", "y", "x2", "y2"]);
    expect(mag!.type).toBe("scatter");
    expect(mag!.showlegend).toBe(true);
    expect(phase!.showlegend).toBe(false);
    expect(layout.xaxis?.type).toBe("log");
    expect(layout.xaxis2?.matches).toBe("x");
  });

  it("switches to WebGL above the point threshold", () => {
    const { data } = buildBodeFigure({ ...base, series: [series("big", GL_THRESHOLD + 1)] });
    expect((data[0] as { type: string }).type).toBe("scattergl");
  });

  it("puts measure markers at their frequency and zooms to a focus frequency", () => {
    const { layout } = buildBodeFigure({
      ...base,
      series: [series("h", 301)],
      markers: [{ frequencyHz: 1591.549430919, label: "f0" }],
      focusHz: 1000,
    });
    expect(layout.shapes?.[0]?.x0).toBe(1591.549430919);
    expect(layout.annotations?.[0]?.text).toBe("f0 1.5915 kHz"); // the marker names its value
    // Log axes take their range in decades: 1 kHz ± half a decade.
    expect(layout.xaxis?.range).toEqual([2.5, 3.5]);
  });

  it("places a comment pin on its trace's magnitude at the pinned frequency", () => {
    const s = series("h", 301);
    s.magnitudeDb = s.frequencies.map((f) => -20 * Math.log10(f / 10)); // −20 dB per decade from 0 dB at 10 Hz
    const { data } = buildBodeFigure({
      ...base,
      series: [s],
      pins: [{ frequencyHz: 1000, trace: "h", label: "why?" }],
    });
    const pins = data.at(-1) as { x: number[]; y: number[]; text: string[]; customdata: string[] };
    expect(pins.x).toEqual([1000]);
    expect(pins.y[0]).toBeCloseTo(-40, 9);
    expect(pins.text).toEqual(["1 kHz<br>why?"]); // the hover names the pinned frequency before the note
    // A click on the diamond pins to the trace it sits on (a pin on "comments" was refused by the API).
    expect(pins.customdata).toEqual(["h"]);
  });

  it("escapes user text in legends, hover names, pins and marker labels (issue 13: a measurement name became a link)", () => {
    const evil = '<a href="https://evil.test">bench</a>';
    const { data, layout } = buildBodeFigure({
      ...base,
      series: [series("h", 11)],
      overlays: [{ ...series(`run <b>x</b>`, 11), role: "overlay" as const }],
      measurements: [series(evil, 11)],
      markers: [{ frequencyHz: 100, label: "<img src=x>" }],
      pins: [{ frequencyHz: 11, trace: "h", label: "<script>pin</script>" }],
    });
    // Rendered text only (legendgroup is an identifier, never drawn).
    const json = JSON.stringify({ data, layout }, (k, v) => (k === "legendgroup" ? undefined : v));
    expect(json).not.toMatch(/<a |<img|<script|<b>x/);
    const bench = data.find((d) => (d as { name?: string }).name?.includes("bench")) as {
      name: string;
      meta: string[];
    };
    expect(bench.name).toBe('&lt;a href="https://evil.test"&gt;bench&lt;/a&gt;');
    expect(bench.meta[0]).toBe(bench.name);
    const pins = data.at(-1) as { text: string[] };
    expect(pins.text[0]).toMatch(/<br>&lt;script&gt;pin&lt;\/script&gt;$/);
    expect(JSON.stringify(layout.annotations)).toContain("&lt;img src=x&gt;");
  });
});

describe("phase ticks and the difference axes", () => {
  it("phase ticks fall on multiples of 45° over a half-turn, 90° over a wider span", () => {
    expect(phaseTicks([{ phaseDeg: [-90, 0, 85] }])).toEqual({ tick0: 0, dtick: 45 });
    expect(phaseTicks([{ phaseDeg: [-270, 0, 200] }])).toEqual({ tick0: 0, dtick: 90 });
    expect(phaseTicks([{ phaseDeg: [null] }])).toEqual({});
  });

  it("draws a difference on its own Δ axes at the right of each row, the responses on the left", () => {
    const a = series("h", 51);
    const diff = { ...series("h Δ (B − A)", 51), role: "difference" as const };
    diff.magnitudeDb = diff.magnitudeDb.map(() => 0.24);
    const { data, layout } = buildBodeFigure({ ...base, series: [a], overlays: [diff] });
    const axes = (data as { yaxis: string }[]).map((d) => d.yaxis);
    expect(axes).toEqual(["y", "y2", "y3", "y4"]);
    expect(layout.yaxis3).toMatchObject({ overlaying: "y", side: "right" });
    expect(layout.yaxis4).toMatchObject({ overlaying: "y2", side: "right" });
    expect((layout.yaxis3 as { title: { text: string } }).title.text).toBe("Δ dB");
    // 0 … 0.24 dB: ticks every 0.1 dB from 0, not spaced to the left axis' grid.
    expect(layout.yaxis3).toMatchObject({ tickmode: "linear", tick0: 0, dtick: 0.1 });
  });

  it("puts the Δ axes' ticks on round steps from zero", () => {
    expect(deltaTicks([0.05, 0.543])).toEqual({ tickmode: "linear", tick0: 0, dtick: 0.2 });
    expect(deltaTicks([-0.96, 0.006])).toEqual({ tickmode: "linear", tick0: 0, dtick: 0.25 });
    expect(deltaTicks([-12, 3, null])).toEqual({ tickmode: "linear", tick0: 0, dtick: 5 });
    expect(deltaTicks([0, 0])).toEqual({ tickmode: "auto" });
  });
});
