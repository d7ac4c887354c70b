// Contrast of the palette's text and control colours (WCAG 2.x relative luminance and contrast ratio:
// ≥ 4.5:1 for text, ≥ 3:1 for the boundary of a control, disabled ones included).
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import config from "@/tailwind.config";

const c = config.theme.extend.colors;

function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => Number.parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = (v: number) => (v <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4);
  return 0.2126 * lin(r!) + 0.7152 * lin(g!) + 0.0722 * lin(b!);
}
const ratio = (a: string, b: string) => {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
};

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    return statSync(p).isDirectory() ? sources(p) : /\.tsx?$/.test(name) ? [p] : [];
  });
}

describe("palette contrast", () => {
  it("checks the formula on black and white (21:1)", () => {
    expect(ratio("#000000", "#ffffff")).toBeCloseTo(21, 6);
  });

  it("the lightest grey used for text (ink-500) reads at ≥ 4.5:1 on white and on the page", () => {
    expect(ratio(c.ink[500], "#ffffff")).toBeGreaterThanOrEqual(4.5);
    expect(ratio(c.ink[500], c.paper[50])).toBeGreaterThanOrEqual(4.5);
    expect(ratio(c.ink[500], c.paper[100])).toBeGreaterThanOrEqual(4.5);
  });

  it("no screen uses a lighter grey for text", () => {
    const root = path.resolve(import.meta.dirname, "../..");
    const offenders = [...sources(path.join(root, "app")), ...sources(path.join(root, "components"))].filter(
      (f) => /\btext-ink-(300|400)\b/.test(readFileSync(f, "utf8")),
    );
    expect(offenders).toEqual([]);
  });

  it("disabled controls keep a ≥ 3:1 boundary (ink-400 border, board-400 fill)", () => {
    expect(ratio(c.ink[400], "#ffffff")).toBeGreaterThanOrEqual(3);
    expect(ratio(c.board[400], c.paper[50])).toBeGreaterThanOrEqual(3);
  });
});
