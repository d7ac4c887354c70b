// At 390×844 (a phone) no main page is wider than the screen: compare used to be 116 px wider
// (its measures grid cell grew to the table), so Δ% was cut off.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, openProject, signedIn } from "./browser";

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

describe("phone width", () => {
  it("fits compare, run, project and editor pages into 390 px, with compare's Δ% on screen", async () => {
    const { context, page } = await signedIn(browser, "designer@demo.test", { width: 390, height: 844 });
    const projectId = await openProject(page, "Reference oscillator board");
    // The project page streams in after the URL changes: wait until its run links are there.
    const runLinks = async () => {
      const hrefs = await page
        .locator('a[href^="/runs/"]')
        .evaluateAll((as) => as.map((a) => /^\/runs\/[0-9a-f-]{36}/.exec(a.getAttribute("href") ?? "")?.[0]));
      return [...new Set(hrefs.filter((h): h is string => Boolean(h)))];
    };
    await expect.poll(async () => (await runLinks()).length, { timeout: 30_000 }).toBeGreaterThanOrEqual(2);
    const [runA, runB] = await runLinks();
    const pages = [
      `/compare?a=${runA!.slice(6)}&b=${runB!.slice(6)}`,
      runA!,
      `/projects/${projectId}`,
      `/projects/${projectId}/new`,
    ];
    for (const path of pages) {
      await page.goto(path);
      await page
        .locator("[data-plot][data-hydrated]")
        .first()
        .waitFor({ timeout: 30_000 })
        .catch(() => undefined);
      const over = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(over, `${path} is wider than the screen`).toBeLessThanOrEqual(0);
    }
    // Compare's measures: each Δ% cell lies inside the screen and is labelled on the card.
    await page.goto(pages[0]!);
    const cells = page.getByRole("region", { name: "Measures" }).locator('td[data-label="Δ%"]');
    await expect.poll(() => cells.count()).toBeGreaterThan(0);
    const rights = await cells.evaluateAll((tds) => tds.map((td) => td.getBoundingClientRect().right));
    for (const r of rights) expect(r).toBeLessThanOrEqual(390);
    await context.close();
  }, 240_000);
});
