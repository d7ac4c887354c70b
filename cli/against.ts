/**
 * `--against RUN`: the local solve of a design beside a saved run of the service (a signed-off
 * baseline). The run is read from `GET /api/runs/:id` with the API token of Settings, then compared
 * with the same pure logic as `/api/compare` (lib/compare.ts: no database, no Sequelize), and judged
 * against the `--tolerance` limits.
 */
import { compareRuns, type MeasureComparison } from "@/lib/compare";
import type { RunDetail } from "@/lib/run-types";
import type { SolveSuccess } from "@/solver/types";
import { type Tolerance, toleranceFor, within } from "./tolerance";

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;

export interface Baseline {
  id: string;
  title: string;
  url: string;
  netlist: string;
  result: SolveSuccess;
}

/** Where to read RUN: an id with PHASEWRIGHT_URL, or a URL of the run's page or API address. */
export function locateRun(
  ref: string,
  env: Record<string, string | undefined>,
): { origin: string; id: string } | { error: string } {
  if (/^https?:\/\//i.test(ref)) {
    let url: URL;
    try {
      url = new URL(ref);
    } catch {
      return { error: `--against ${ref}: not a valid URL` };
    }
    const id = UUID.exec(url.pathname)?.[0];
    if (!id) return { error: `--against ${ref}: the URL names no run (expected …/runs/<run id>)` };
    // A service under a path prefix keeps it: https://host/pw/runs/<id> → https://host/pw.
    const prefix = url.pathname.slice(0, url.pathname.search(/\/(api\/)?runs\//i));
    return { origin: `${url.origin}${prefix}`, id: id.toLowerCase() };
  }
  if (!UUID.test(ref) || ref.length !== 36)
    return { error: `--against ${ref}: give a run id or the run's URL` };
  const base = env.PHASEWRIGHT_URL?.trim();
  if (!base) return { error: "--against with a run id needs PHASEWRIGHT_URL (the service's address)" };
  return { origin: base.replace(/\/+$/, ""), id: ref.toLowerCase() };
}

/** Read the saved run, or a message saying why it cannot be read. */
export async function fetchBaseline(
  ref: string,
  env: Record<string, string | undefined>,
): Promise<Baseline | { error: string }> {
  const where = locateRun(ref, env);
  if ("error" in where) return where;
  const token = env.PHASEWRIGHT_TOKEN?.trim();
  if (!token) return { error: "--against needs PHASEWRIGHT_TOKEN (an API token from Settings → API tokens)" };
  const url = `${where.origin}/api/runs/${where.id}`;
  let res: Response;
  try {
    res = await fetch(url, { headers: { authorization: `Bearer ${token}`, accept: "application/json" } });
  } catch (error) {
    const cause = (error as { cause?: { message?: string } }).cause?.message;
    return {
      error: `cannot reach ${where.origin}: ${cause ?? (error instanceof Error ? error.message : error)}`,
    };
  }
  if (res.status === 401) return { error: `${url}: 401 — PHASEWRIGHT_TOKEN is not a valid API token there` };
  if (res.status === 404) return { error: `${url}: 404 — no run ${where.id} that this token's user may see` };
  if (!res.ok) return { error: `${url}: HTTP ${res.status}` };
  let run: RunDetail;
  try {
    run = ((await res.json()) as { run: RunDetail }).run;
  } catch {
    return { error: `${url}: the answer is not the JSON of a run` };
  }
  if (!run?.result)
    return { error: `run ${where.id} has no result yet (status ${run?.status ?? "unknown"})` };
  return {
    id: run.id,
    title: run.title,
    url: `${where.origin}/runs/${run.id}`,
    netlist: run.netlist,
    result: run.result,
  };
}

export interface MeasureVerdict extends MeasureComparison {
  ok: boolean;
  /** The limit applied ("rounding" when none was given), or why the measure fails outright. */
  limit: string;
}

export interface TraceVerdict {
  name: string;
  /** Largest |b − a| in dB and in degrees, with the frequency it occurs at (null: nothing shared). */
  maxDb: { value: number; at: number } | null;
  maxDeg: { value: number; at: number } | null;
  /** Only traces named by a `--tolerance` in dB or deg are judged. */
  ok: boolean;
  limit: string | null;
}

export interface BaselineComparison {
  baseline: { id: string; title: string; url: string };
  partsChanged: number;
  measures: MeasureVerdict[];
  flippedChecks: { expression: string; before: boolean; after: boolean }[];
  traces: TraceVerdict[];
  /** Messages about the tolerances themselves (a unit that does not fit): they fail the design. */
  problems: string[];
  ok: boolean;
}

function judgeMeasure(m: MeasureComparison, tolerances: Tolerance[], problems: string[]): MeasureVerdict {
  if (m.presentIn === "b") return { ...m, ok: true, limit: "new measure" };
  if (m.presentIn === "a") return { ...m, ok: false, limit: "no longer measured" };
  if (m.a === null || m.b === null) {
    const same = m.a === null && m.b === null;
    return {
      ...m,
      ok: same,
      limit: same ? "no value on either side" : m.b === null ? "lost its value" : "gained a value",
    };
  }
  const v = within(m.a, m.b, m.unit, toleranceFor(m.name, tolerances));
  if ("error" in v) {
    problems.push(v.error);
    return { ...m, ok: false, limit: "unit mismatch" };
  }
  return { ...m, ...v };
}

function largest(values: (number | null)[], freqs: number[]): { value: number; at: number } | null {
  let best: { value: number; at: number } | null = null;
  values.forEach((v, k) => {
    if (v !== null && Number.isFinite(v) && (best === null || Math.abs(v) > Math.abs(best.value)))
      best = { value: v, at: freqs[k]! };
  });
  return best;
}

/** Compare the local solve (b) with the baseline (a) and judge every measure and named trace. */
export function judgeAgainst(
  baseline: Baseline,
  netlist: string,
  local: SolveSuccess,
  tolerances: Tolerance[],
): BaselineComparison {
  const cmp = compareRuns({ netlist: baseline.netlist, result: baseline.result }, { netlist, result: local });
  const problems: string[] = [];
  const measures = cmp.measures.map((m) => judgeMeasure(m, tolerances, problems));
  const measureNames = new Set(cmp.measures.map((m) => m.name));
  const traces = cmp.traces.map((t): TraceVerdict => {
    const maxDb = largest(t.diffDb, t.frequencies);
    const maxDeg = largest(t.diffDeg, t.frequencies);
    const tol = measureNames.has(t.name) ? null : tolerances.find((x) => x.name === t.name);
    if (!tol) return { name: t.name, maxDb, maxDeg, ok: true, limit: null };
    if (tol.kind !== "absolute" || (tol.unit !== "dB" && tol.unit !== "deg")) {
      problems.push(`--tolerance ${t.name}=${tol.text}: a trace's limit is in dB or deg`);
      return { name: t.name, maxDb, maxDeg, ok: false, limit: tol.text };
    }
    const worst = tol.unit === "dB" ? maxDb : maxDeg;
    return {
      name: t.name,
      maxDb,
      maxDeg,
      ok: worst === null || Math.abs(worst.value) <= tol.value,
      limit: tol.text,
    };
  });
  for (const t of tolerances) {
    if (t.name !== "*" && !measureNames.has(t.name) && !cmp.traces.some((x) => x.name === t.name))
      problems.push(`--tolerance ${t.name}=${t.text}: no measure or trace named ${t.name}`);
  }
  const flippedChecks = cmp.flippedChecks.map((c) => ({
    expression: c.expression,
    before: c.a!,
    after: c.b!,
  }));
  return {
    baseline: { id: baseline.id, title: baseline.title, url: baseline.url },
    partsChanged: cmp.parts.length,
    measures,
    flippedChecks,
    traces,
    problems,
    ok: problems.length === 0 && measures.every((m) => m.ok) && traces.every((t) => t.ok),
  };
}
