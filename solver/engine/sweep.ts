import type { Sweep } from "../types";

/** The default sweep when a netlist has none (NETLIST.md "Sweep"). */
export const DEFAULT_SWEEP: Sweep = { kind: "log", start: 10, stop: 10e6, perDecade: 100 };

/** Most points a sweep may have (NETLIST.md). */
export const MAX_SWEEP_POINTS = 100_000;

/** How many points a sweep has, without building it (NaN when it is malformed). */
export function sweepLength(s: Sweep): number {
  switch (s.kind) {
    case "log":
      return Math.max(1, Math.round(s.perDecade * Math.log10(s.stop / s.start))) + 1;
    case "linear":
      return s.points;
    case "list":
      return s.points.length;
  }
}

/**
 * The frequencies of a sweep, ascending. Log: both ends included, the interval count is
 * perDecade·decades rounded (so 10 Hz…100 kHz at 200 per decade is 801 points, each point
 * start·(stop/start)^(k/N)); linear: both ends, `points` points; list: sorted, duplicates dropped.
 * Returns a message when the sweep is malformed.
 */
export function sweepFrequencies(s: Sweep): number[] | string {
  switch (s.kind) {
    case "log": {
      if (!(s.start > 0) || !(s.stop > s.start) || !Number.isFinite(s.stop)) {
        return "a log sweep needs 0 < start < stop";
      }
      if (!(s.perDecade >= 1)) return "a log sweep needs at least 1 point per decade";
      const n = sweepLength(s) - 1;
      if (n + 1 > MAX_SWEEP_POINTS)
        return `the sweep has ${n + 1} points; at most ${MAX_SWEEP_POINTS} are allowed`;
      const ratio = s.stop / s.start;
      const out: number[] = [];
      for (let k = 0; k < n; k++) out.push(s.start * ratio ** (k / n));
      out.push(s.stop);
      return out;
    }
    case "linear": {
      if (!(s.start >= 0) || !(s.stop > s.start) || !Number.isFinite(s.stop)) {
        return "a linear sweep needs 0 ≤ start < stop";
      }
      if (!Number.isInteger(s.points) || s.points < 2) return "a linear sweep needs at least 2 points";
      if (s.points > MAX_SWEEP_POINTS)
        return `the sweep has ${s.points} points; at most ${MAX_SWEEP_POINTS} are allowed`;
      const out: number[] = [];
      for (let k = 0; k < s.points - 1; k++) out.push(s.start + ((s.stop - s.start) * k) / (s.points - 1));
      out.push(s.stop);
      return out;
    }
    case "list": {
      const pts = [...new Set(s.points)].sort((a, b) => a - b);
      if (pts.length === 0) return "the sweep lists no frequencies";
      if (pts.some((f) => !(f >= 0) || !Number.isFinite(f)))
        return "sweep frequencies must be finite and ≥ 0";
      if (pts.length > MAX_SWEEP_POINTS)
        return `the sweep has ${pts.length} points; at most ${MAX_SWEEP_POINTS} are allowed`;
      return pts;
    }
  }
}
