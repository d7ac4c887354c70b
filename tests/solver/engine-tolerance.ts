import { expect } from "vitest";

/**
 * Relative closeness with an absolute floor: |a − b| ≤ rel·max(|a|, |b|) + abs.
 * NaN is close only to NaN, ±Infinity only to itself, and 0 is compared by the absolute floor.
 */
export function relClose(a: number, b: number, rel = 1e-9, abs = 0): boolean {
  if (Number.isNaN(a) || Number.isNaN(b)) return Number.isNaN(a) && Number.isNaN(b);
  if (!Number.isFinite(a) || !Number.isFinite(b)) return a === b;
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b)) + abs;
}

/** Assert relClose with a message that shows both numbers and the relative error. */
export function expectClose(actual: number | null | undefined, expected: number, rel = 1e-9, abs = 0): void {
  if (actual === null || actual === undefined) throw new Error(`expected ${expected}, got ${actual}`);
  const err = Math.abs(actual - expected) / Math.max(Math.abs(expected), Number.MIN_VALUE);
  expect(
    relClose(actual, expected, rel, abs),
    `${actual} vs ${expected} (relative error ${err.toExponential(2)})`,
  ).toBe(true);
}
