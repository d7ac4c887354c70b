// Plots are drawn before the charting library loads (issue 12): a run page arrives with the Bode plot
// as our own SVG in its HTML, no charting script is fetched until the pointer reaches the plot, and
// then the interactive chart takes the SVG's place at the same size, with the same frequency labels.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, openProject, signedIn } from "./browser";

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

/** Scripts fetched so far, by size: the charting library is the only one over 2 MB decoded. */
const bigScripts = (page: Page) =>
  page.evaluate(() =>
    (performance.getEntriesByType("resource") as PerformanceResourceTiming[])
      .filter((r) => r.initiatorType === "script" || /\.js(\?|$)/.test(r.name))
      .filter((r) => r.decodedBodySize > 2_000_000)
      .map((r) => r.name),
  );

describe("static plot first", () => {
  it("serves the run's Bode plot as SVG, loads the charting library only on hover, at the same size", async () => {
    const { context, page } = await signedIn(browser, "viewer@demo.test", { width: 1440, height: 900 });
    await openProject(page, "Reference oscillator board");
    const link = page.locator('a[href^="/runs/"]').first();
    await link.waitFor();
    const href = (await link.getAttribute("href")) ?? "";
    expect(href).toMatch(/^\/runs\/[0-9a-f-]{36}$/);

    // The HTML as served already holds the plot: an SVG with the traces' paths and the frequency axis.
    const html = await (await context.request.get(href)).text();
    const svg =
      [...html.matchAll(/<svg\b[^>]*>[\s\S]*?<\/svg>/g)]
        .map((m) => m[0])
        .find((t) => /^<svg[^>]*data-static-plot/.test(t) && /^<svg[^>]*aria-label="Bode plot/.test(t)) ?? "";
    expect(svg).not.toBe("");
    expect(svg.match(/<path[^>]*data-line/g)?.length ?? 0).toBeGreaterThanOrEqual(2);
    expect(svg).toContain(">frequency (Hz)</text>");
    expect(svg).toContain(">1k</text>");

    await page.goto(href);
    const plot = page.locator("[data-bode-plot] [data-plot]").first();
    await plot.and(page.locator("[data-hydrated]")).waitFor({ timeout: 60_000 });
    await page.waitForLoadState("networkidle");
    // Hydrated and idle, the pointer elsewhere: still our SVG, and no charting script fetched.
    expect(await plot.getAttribute("data-plot")).toBe("static");
    // Magnitude and phase of at least one trace.
    expect(await plot.locator("svg[data-static-plot] path[data-line]").count()).toBeGreaterThanOrEqual(2);
    expect(await page.locator(".js-plotly-plot").count()).toBe(0);
    expect(await bigScripts(page)).toEqual([]);
    await plot.scrollIntoViewIfNeeded();
    const staticBox = await plot.boundingBox();
    const staticLabels = await plot.locator("svg[data-static-plot] text").allTextContents();

    await plot.hover();
    await plot
      .locator(".js-plotly-plot .scatterlayer .trace path.js-line")
      .first()
      .waitFor({ timeout: 60_000 });
    await expect.poll(() => plot.getAttribute("data-plot")).toBe("interactive");
    expect((await bigScripts(page)).length).toBe(1);
    expect(await plot.locator("svg[data-static-plot]").count()).toBe(0);
    // In place: the same box, and the frequency labels the static plot showed.
    const liveBox = await plot.boundingBox();
    expect(liveBox).toEqual(staticBox);
    const liveTicks = await plot
      .locator(".xaxislayer-above .xtick text, .xaxislayer-above .x2tick text")
      .allTextContents();
    expect(liveTicks.length).toBeGreaterThan(3);
    for (const t of liveTicks) expect(staticLabels).toContain(t);
    await context.close();
  });
});
