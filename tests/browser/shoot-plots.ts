// Screenshots of the run, compare and editor pages at 1440×900 and 390×844, each before the plot is
// touched (our static SVG) and after a hover (the interactive chart), for a person to compare: same
// colours, ticks and labels, no jump. Prints each main plot's box before and after.
// Usage: E2E_BASE_URL=http://127.0.0.1:3931 npx tsx tests/browser/shoot-plots.ts [outDir]
import { mkdirSync } from "node:fs";
import type { Page } from "playwright-core";
import { interactivePlot, launch, openProject, signedIn } from "./browser";

const SIZES = { wide: { width: 1440, height: 900 }, phone: { width: 390, height: 844 } } as const;
const MAIN = process.env.MAIN_PLOT ?? "[data-bode-plot]";
const out = process.argv[2] ?? "/tmp/phasewright-plots";
mkdirSync(out, { recursive: true });

async function plotBox(page: Page) {
  const box = await page.locator(`${MAIN} [data-plot]`).first().boundingBox();
  return box
    ? `${Math.round(box.x)},${Math.round(box.y)} ${Math.round(box.width)}×${Math.round(box.height)}`
    : "none";
}

async function pair(page: Page, name: string, url: string | null) {
  if (url) await page.goto(url);
  const main = page.locator(`${MAIN} [data-plot][data-hydrated]`).first();
  await main.waitFor({ timeout: 60_000 });
  await main.scrollIntoViewIfNeeded();
  await page.mouse.move(0, 0);
  await page.waitForTimeout(800);
  const before = await plotBox(page);
  await main.screenshot({ path: `${out}/${name}-static.png` });
  const index = await page
    .locator("[data-plot]")
    .evaluateAll((els, sel) => els.findIndex((e) => e.closest(sel) !== null), MAIN);
  await interactivePlot(page, Math.max(0, index));
  await page.mouse.move(0, 0);
  await page.waitForTimeout(800);
  const after = await plotBox(page);
  await main.screenshot({ path: `${out}/${name}-interactive.png` });
  console.log(`${name}: plot ${before} → ${after}${before === after ? "" : "  (moved!)"}`);
}

async function main() {
  const browser = await launch();
  /** Every chart on a page: full-page shots before any hover and after hovering each in turn. */
  async function allCharts(page: Page, name: string, url: string) {
    await page.goto(url);
    await page.locator("[data-plot][data-hydrated]").first().waitFor({ timeout: 60_000 });
    await page.evaluate(() => {
      for (const d of document.querySelectorAll("details")) d.open = true;
    });
    await page.waitForTimeout(1000);
    await page.screenshot({ path: `${out}/${name}-all-static.png`, fullPage: true });
    const n = await page.locator("[data-plot]").count();
    for (let i = 0; i < n; i++) {
      const chart = page.locator("[data-plot]").nth(i);
      if (!(await chart.isVisible())) continue;
      await chart.screenshot({ path: `${out}/${name}-chart${i}-static.png` });
      await interactivePlot(page, i);
      await page.mouse.move(0, 0);
      await page.waitForTimeout(300);
      await chart.screenshot({ path: `${out}/${name}-chart${i}-interactive.png` });
    }
    await page.mouse.move(0, 0);
    await page.waitForTimeout(1000);
    await page.screenshot({ path: `${out}/${name}-all-interactive.png`, fullPage: true });
    console.log(`${name}: ${n} charts`);
  }
  try {
    for (const [size, viewport] of Object.entries(SIZES)) {
      const { context, page } = await signedIn(browser, "designer@demo.test", viewport);
      const projectId = await openProject(page, "Reference oscillator board");
      await page.locator('a[href^="/runs/"]').first().waitFor();
      const runs = [
        ...new Set(
          await page
            .locator('a[href^="/runs/"]')
            .evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).getAttribute("href") ?? "")),
        ),
      ];

      await pair(page, `run-${size}`, runs[0]!);
      const [a, b] = runs.map((r) => r.replace("/runs/", ""));
      await pair(page, `compare-${size}`, `/compare?a=${a}&b=${b}`);
      await pair(page, `editor-${size}`, `/projects/${projectId}/new`);
      if (size === "wide")
        for (const [i, r] of runs.slice(0, 4).entries()) await allCharts(page, `run${i + 1}`, r);
      await context.close();
    }
  } finally {
    await browser.close();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
