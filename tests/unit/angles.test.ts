import { describe, expect, it } from "vitest";
import { wrapDeg as traceWrap } from "@/lib/trace-math";
import { deg, wrapDeg } from "@/solver/angles";
import { wrapDeg as refineWrap } from "@/solver/engine/refine";

describe("angles (solver/angles.ts)", () => {
  it("is the one wrap: the engine and the pages read the same function", () => {
    expect(refineWrap).toBe(wrapDeg);
    expect(traceWrap).toBe(wrapDeg);
  });

  it("wraps any angle into (−180, 180] by whole turns", () => {
    // A spread of angles over ±20 turns, with the boundary values themselves.
    const xs = [-7200, -540, -180, -179.999, 0, -0, 179.999, 180, 180.001, 359, 720.5, 7199.25];
    for (let k = 0; k < 200; k++) xs.push(-7200 + 72.37 * k);
    for (const x of xs) {
      const w = wrapDeg(x);
      expect(w).toBeGreaterThan(-180);
      expect(w).toBeLessThanOrEqual(180);
      const turns = (x - w) / 360;
      expect(Math.abs(turns - Math.round(turns))).toBeLessThan(1e-9);
    }
    expect(Object.is(wrapDeg(-720), 0)).toBe(true); // never −0
    expect(wrapDeg(-180)).toBe(180);
  });

  it("gives the phase of a complex number in (−180, 180]", () => {
    expect(deg(1, 0)).toBe(0);
    expect(deg(0, 1)).toBe(90);
    expect(deg(0, -1)).toBe(-90);
    expect(deg(-1, 0)).toBe(180);
    expect(deg(-1, -0)).toBe(180); // atan2 gives −π here; the range keeps +180
    expect(deg(1, 1)).toBeCloseTo(45, 12);
    expect(deg(-1, -1)).toBeCloseTo(-135, 12);
  });
});
