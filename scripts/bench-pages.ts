/**
 * Page loads in headless Chromium (section 4 of scripts/bench-app.ts; a benchmark, not a test):
 *   - editor, run and compare pages "usable" = the main (Bode) plot's first trace drawn — our static SVG
 *     or the interactive chart's — AND the plot hydrated (its wrapper's `data-hydrated`):
 *     cold (a fresh browser context: empty cache) < 2.5 s, warm (same context, loaded again) < 1 s;
 *   - reported beside it, no goal: the interactive chart after the first hover (pointer onto the plot →
 *     the charting library's first trace drawn), cold and warm;
 *   - the editor starts only the editor's own worker (no CSS/JSON/HTML/TypeScript language workers);
 *   - live preview of the demo oscillator: keystroke → plot redrawn, minus the 300 ms debounce, < 150 ms.
 * Debian's Chromium through playwright-core (never a downloaded browser), against the bench app
 * (BENCH_OWN_URL: the .next build on the bench database). Times are taken inside the page
 * (performance.now() from navigation start), so they include the server, the JavaScript and the plot.
 */
import { randomBytes } from "node:crypto";
import { existsSync } from "node:fs";
import { loadavg } from "node:os";
import bcrypt from "bcryptjs";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { sequelize } from "@/lib/db";
import { createRun } from "@/lib/run-create";
import { benchWorkspace } from "./bench-fixture";

export const COLD_GOAL_MS = 2500;
export const WARM_GOAL_MS = 1000;
export const PREVIEW_GOAL_MS = 150;
/** useLiveSolve's debounce (components/editor/use-live-solve.ts). */
export const PREVIEW_DEBOUNCE_MS = 300;
const CHROMIUM = "/usr/bin/chromium";
const REPEATS = 3;
const PREVIEW_KEYSTROKES = 7;
/** The main plot's wrapper (components/plot/deferred-plot.tsx inside the Bode plot's figure). */
const MAIN_PLOT = "[data-bode-plot] [data-plot]";
/** A trace drawn by the charting library: it has laid out the figure and drawn data into it. */
const PLOTLY_DRAWN = ".js-plotly-plot .scatterlayer .trace path.js-line";
/** The main plot's first trace drawn, static or interactive. */
const PLOT_DRAWN = `${MAIN_PLOT} svg[data-static-plot] path[data-line], ${MAIN_PLOT} ${PLOTLY_DRAWN}`;

export interface PagesFixture {
  email: string;
  password: string;
  projectId: string;
  runA: string;
  runB: string;
}

/** A user who can sign in, a project and two saved runs of the demo oscillator (A, and B with Rf changed). */
export async function ensurePagesFixture(oscillator: string): Promise<PagesFixture> {
  const email = "bench-pages@bench.test";
  const password = randomBytes(12).toString("base64url");
  const passwordHash = await bcrypt.hash(password, 10);
  const { user, project } = await sequelize.transaction(async (transaction) => {
    // A fresh password per bench: nothing outside this process knows it.
    return benchWorkspace(
      { email, name: "Bench Pages", passwordHash, project: "Page loads", verified: true },
      transaction,
    );
  });
  const actor = { userId: user.id, email, name: user.name };
  const a = await createRun(actor, project.id, { title: "Oscillator as designed", netlist: oscillator });
  const b = await createRun(actor, project.id, {
    title: "Oscillator, Rf 22k",
    netlist: oscillator.replace(/^(Rf:.*?)20\.5k/m, "$122k"),
  });
  return { email, password, projectId: project.id, runA: a.id, runB: b.id };
}

/** Signs in over HTTP (next-auth's credentials callback), so the browser's cache stays empty. */
async function sessionCookies(base: string, email: string, password: string) {
  const jar = new Map<string, string>();
  const keep = (res: Response) => {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const eq = pair!.indexOf("=");
      jar.set(pair!.slice(0, eq), pair!.slice(eq + 1));
    }
  };
  const cookieHeader = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  const csrf = await fetch(`${base}/api/auth/csrf`);
  keep(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const res = await fetch(`${base}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: cookieHeader() },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${base}/projects` }),
  });
  keep(res);
  if (![...jar.keys()].some((k) => k.includes("session-token"))) {
    throw new Error(`sign-in as ${email} gave no session (HTTP ${res.status})`);
  }
  const url = new URL(base);
  return [...jar].map(([name, value]) => ({ name, value, domain: url.hostname, path: "/" }));
}

interface Load {
  usableMs: number;
  /** From the hover onto the plot to the interactive chart's first trace. */
  interactiveMs: number;
  serverMs: number;
  domReadyMs: number;
  scriptKb: number;
  requests: number;
}

/** Pointer onto the main plot; resolves with the time from then until the interactive chart has drawn. */
async function hoverToInteractive(page: Page): Promise<number> {
  const plot = page.locator(MAIN_PLOT).first();
  const box = await plot.boundingBox();
  if (!box) throw new Error("main plot not found");
  const t0 = (await page.evaluate(() => performance.now())) as number;
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  const handle = await page.waitForFunction(
    (sel) => (document.querySelector(sel) ? performance.now() : null),
    `${MAIN_PLOT} ${PLOTLY_DRAWN}`,
    { polling: "raf", timeout: 60_000 },
  );
  const t1 = (await handle.jsonValue()) as number;
  // Off the plot again, so the next load does not start under the pointer.
  await page.mouse.move(0, 0);
  return t1 - t0;
}

/** Loads `path` and returns when the main plot is drawn and hydrated, with where the time went. */
async function loadOnce(page: Page, path: string): Promise<Load> {
  await page.goto(path, { waitUntil: "commit" });
  const handle = await page.waitForFunction(
    ([sel, wrapper]) =>
      document.querySelector(sel) && document.querySelector(wrapper)?.hasAttribute("data-hydrated")
        ? performance.now()
        : null,
    [PLOT_DRAWN, MAIN_PLOT] as const,
    { polling: "raf", timeout: 60_000 },
  );
  const usableMs = (await handle.jsonValue()) as number;
  const detail = await page.evaluate(() => {
    const nav = performance.getEntriesByType("navigation")[0] as PerformanceNavigationTiming | undefined;
    const res = performance.getEntriesByType("resource") as PerformanceResourceTiming[];
    const scripts = res.filter((r) => r.initiatorType === "script" || /\.js(\?|$)/.test(r.name));
    return {
      serverMs: nav ? nav.responseStart - nav.requestStart : Number.NaN,
      domReadyMs: nav ? nav.domContentLoadedEventEnd : Number.NaN,
      scriptKb: scripts.reduce((s, r) => s + r.transferSize, 0) / 1000,
      requests: res.length + 1,
    };
  });
  const interactiveMs = await hoverToInteractive(page);
  return { usableMs, interactiveMs, ...detail };
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? s[Math.floor((s.length - 1) / 2)]! : Number.NaN;
};
const ms = (x: number) => (Number.isFinite(x) ? `${Math.round(x)} ms` : "—");
const verdict = (value: number, goal: number) => (value < goal ? "PASS" : "MISS");

type Cookies = Awaited<ReturnType<typeof sessionCookies>>;

async function freshContext(browser: Browser, base: string, cookies: Cookies): Promise<BrowserContext> {
  const context = await browser.newContext({ baseURL: base, viewport: { width: 1440, height: 900 } });
  await context.addCookies(cookies);
  return context;
}

/** Cold and warm loads of one page, REPEATS of each (a fresh context for every cold load). */
async function benchPage(browser: Browser, base: string, cookies: Cookies, path: string) {
  const cold: Load[] = [];
  const warm: Load[] = [];
  const workers = new Set<string>();
  let started = 0;
  for (let i = 0; i < REPEATS; i++) {
    const context = await freshContext(browser, base, cookies);
    const page = await context.newPage();
    // Monaco starts each worker from a blob that imports its script: count the workers, name the scripts.
    page.on("worker", () => started++);
    page.on("request", (r) => {
      if (/worker/i.test(new URL(r.url()).pathname)) workers.add(new URL(r.url()).pathname);
    });
    cold.push(await loadOnce(page, path));
    warm.push(await loadOnce(page, path));
    // Let late chunks (the editor, its worker) arrive before the context goes.
    await page.waitForLoadState("networkidle", { timeout: 10_000 }).catch(() => undefined);
    await context.close();
  }
  return { cold, warm, workers: [...workers].sort(), workersPerLoad: started / (2 * REPEATS) };
}

/**
 * Keystroke → plot redrawn on the editor with the demo oscillator: a digit typed into Rf's value,
 * timed from the keydown event to Plotly's next `plotly_afterplot`, less the debounce. Each digit
 * makes a new text, so every sample is a real solve (no cached answer).
 */
async function benchPreview(browser: Browser, base: string, cookies: Cookies, path: string) {
  const context = await freshContext(browser, base, cookies);
  const page = await context.newPage();
  await page.goto(path);
  await page.waitForSelector(PLOT_DRAWN, { timeout: 60_000 });
  // The redraws timed below are the interactive chart's: bring it in first (hover the preview plot).
  await hoverToInteractive(page);
  await page.getByLabel("Start from").selectOption("wien-bridge");
  await page.waitForFunction(() => {
    const w = window as unknown as { pwMonaco?: { editor: { getEditors(): { getValue(): string }[] } } };
    return w.pwMonaco?.editor.getEditors()[0]?.getValue().includes("Rf: resistor") ?? false;
  });
  await page.waitForFunction(() => !document.querySelector('[data-testid="preview-plot"][data-stale]'));
  await page.waitForTimeout(1000);
  const samples: { totalMs: number; serverMs: number }[] = [];
  for (let i = 0; i < PREVIEW_KEYSTROKES; i++) {
    // Caret just before the "k" of Rf's value; the typed digit lengthens the mantissa (20.5 → 20.51…).
    await page.evaluate(() => {
      type Ed = {
        getModel(): { getLinesContent(): string[] };
        setPosition(p: { lineNumber: number; column: number }): void;
        focus(): void;
      };
      const w = window as unknown as { pwMonaco: { editor: { getEditors(): Ed[] } } };
      const ed = w.pwMonaco.editor.getEditors()[0]!;
      const lines = ed.getModel().getLinesContent();
      const row = lines.findIndex((l) => /^Rf:/.test(l));
      const col = /20\.5\d*k/.exec(lines[row]!)!;
      ed.setPosition({ lineNumber: row + 1, column: col.index + col[0].length });
      ed.focus();
      const gd = document.querySelector('[data-testid="preview-plot"] .js-plotly-plot') as unknown as {
        on(ev: string, fn: () => void): void;
      };
      const probe = window as unknown as { pwBench: { key?: number; drawn: number[]; hooked?: boolean } };
      if (!probe.pwBench?.hooked) {
        probe.pwBench = { drawn: [], hooked: true };
        gd.on("plotly_afterplot", () => probe.pwBench.drawn.push(performance.now()));
      }
      probe.pwBench.key = undefined;
      probe.pwBench.drawn = [];
      document.addEventListener("keydown", () => (probe.pwBench.key = performance.now()), {
        capture: true,
        once: true,
      });
      performance.clearResourceTimings();
    });
    await page.keyboard.type(String((i % 9) + 1));
    // The redraw that counts is the first one after the solve's answer arrived (a redraw right after
    // the keystroke only marks the plot stale).
    const t = (await (
      await page.waitForFunction(
        () => {
          const p = (window as unknown as { pwBench: { key?: number; drawn: number[] } }).pwBench;
          const solve = (performance.getEntriesByType("resource") as PerformanceResourceTiming[]).find(
            (r) => r.name.endsWith("/api/solve") && r.responseEnd > 0,
          );
          const drawn = solve ? p.drawn.find((d) => d >= solve.responseEnd) : undefined;
          if (p.key === undefined || !solve || drawn === undefined) return null;
          return { total: drawn - p.key, server: solve.responseEnd - solve.requestStart };
        },
        undefined,
        { timeout: 30_000 },
      )
    ).jsonValue()) as { total: number; server: number };
    samples.push({ totalMs: t.total - PREVIEW_DEBOUNCE_MS, serverMs: t.server });
    await page.waitForTimeout(400);
  }
  await context.close();
  return samples;
}

/** Prints section 4; returns false when a goal is missed. */
export async function benchPages(
  base: string | undefined,
  fixture: PagesFixture | null,
  print: (header: string[], rows: (string | number)[][]) => void,
): Promise<boolean> {
  if (!base || !fixture) {
    console.log("skipped — no bench app (needs a .next build and BENCH_SERVE=1)");
    return true;
  }
  if (!existsSync(CHROMIUM)) {
    console.log(`skipped — no ${CHROMIUM} (apt-get install chromium); no browser is downloaded`);
    return true;
  }
  const { chromium } = await import("playwright-core");
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--no-first-run",
      "--disable-background-networking",
    ],
  });
  let ok = true;
  try {
    const cookies = await sessionCookies(base, fixture.email, fixture.password);
    const pages: [string, string][] = [
      ["editor", `/projects/${fixture.projectId}/new`],
      ["run", `/runs/${fixture.runA}`],
      ["compare", `/compare?a=${fixture.runA}&b=${fixture.runB}`],
    ];
    const rows: (string | number)[][] = [];
    const interactive: (string | number)[][] = [];
    const detail: (string | number)[][] = [];
    let editorWorkers: string[] = [];
    let workersPerLoad = 0;
    for (const [name, path] of pages) {
      const r = await benchPage(browser, base, cookies, path);
      if (name === "editor") {
        editorWorkers = r.workers;
        workersPerLoad = r.workersPerLoad;
      }
      const cold = median(r.cold.map((l) => l.usableMs));
      const warm = median(r.warm.map((l) => l.usableMs));
      ok &&= cold < COLD_GOAL_MS && warm < WARM_GOAL_MS;
      rows.push([
        name,
        ms(cold),
        `< ${COLD_GOAL_MS} ms`,
        verdict(cold, COLD_GOAL_MS),
        ms(warm),
        `< ${WARM_GOAL_MS} ms`,
        verdict(warm, WARM_GOAL_MS),
      ]);
      interactive.push([
        name,
        ms(median(r.cold.map((l) => l.interactiveMs))),
        r.cold.map((l) => Math.round(l.interactiveMs)).join(" / "),
        ms(median(r.warm.map((l) => l.interactiveMs))),
        r.warm.map((l) => Math.round(l.interactiveMs)).join(" / "),
      ]);
      for (const [kind, loads] of [
        ["cold", r.cold],
        ["warm", r.warm],
      ] as const) {
        detail.push([
          `${name} ${kind}`,
          loads.map((l) => Math.round(l.usableMs)).join(" / "),
          ms(median(loads.map((l) => l.serverMs))),
          ms(median(loads.map((l) => l.domReadyMs))),
          `${median(loads.map((l) => l.scriptKb)).toFixed(0)} kB`,
          median(loads.map((l) => l.requests)),
        ]);
      }
    }
    print(["page", "cold (median)", "goal", "", "warm (median)", "goal", ""], rows);
    console.log("\nWhere the time went (medians; JS = script bytes over the wire, 0 when cached):");
    print(["load", `usable, ${REPEATS} runs (ms)`, "server (HTML)", "DOM ready", "JS", "requests"], detail);
    console.log(
      "\nInteractive plot after the first hover (pointer onto the usable plot → the charting library's first trace; no goal):",
    );
    print(["page", "cold (median)", "cold runs (ms)", "warm (median)", "warm runs (ms)"], interactive);

    const foreign = editorWorkers.filter((w) => w !== "/monaco/editor.worker.js");
    const workersOk = foreign.length === 0 && editorWorkers.length === 1;
    ok &&= workersOk;
    console.log(
      `\nEditor workers: ${workersPerLoad.toFixed(1)} started per load, scripts ${editorWorkers.join(", ") || "none"}` +
        ` — goal: only /monaco/editor.worker.js → ${workersOk ? "PASS" : "MISS"}`,
    );

    const preview = await benchPreview(browser, base, cookies, pages[0]![1]);
    const total = median(preview.map((p) => p.totalMs));
    const server = median(preview.map((p) => p.serverMs));
    ok &&= total < PREVIEW_GOAL_MS;
    console.log(
      `\nLive preview, demo oscillator (wien-bridge, asked sweep first, its Monte Carlo in a second request): keystroke → plot redrawn, ` +
        `less the ${PREVIEW_DEBOUNCE_MS} ms debounce, ${PREVIEW_KEYSTROKES} keystrokes`,
    );
    print(
      ["step", "median", "samples (ms)", "goal", ""],
      [
        [
          "keystroke → plot, after debounce",
          ms(total),
          preview.map((p) => Math.round(p.totalMs)).join(" / "),
          `< ${PREVIEW_GOAL_MS} ms`,
          verdict(total, PREVIEW_GOAL_MS),
        ],
        ["  of it POST /api/solve (request → response end)", ms(server), "", "", ""],
      ],
    );
  } finally {
    await browser.close();
  }
  const [one] = loadavg();
  console.log(
    `Headless Chromium (${CHROMIUM}), ${REPEATS} cold (fresh context) and ${REPEATS} warm loads per page, ` +
      `1440×900; load average ${one!.toFixed(2)} at the end (the goals assume a quiet machine).`,
  );
  return ok;
}
