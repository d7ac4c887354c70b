// Shared set-up of the browser tests: Debian's Chromium through playwright-core, and sign-in as a demo user.
import { type Browser, type BrowserContext, chromium, type Page } from "playwright-core";

export const BASE_URL = (process.env.E2E_BASE_URL ?? "http://127.0.0.1:3101").replace(/\/+$/, "");
export const DEMO_PASSWORD = "phasewright-demo";

export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: "/usr/bin/chromium",
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
}

/** A fresh context (own cookies) at the given viewport, signed in as `email`. */
export async function signedIn(
  browser: Browser,
  email: string,
  viewport = { width: 1280, height: 800 },
): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport, baseURL: BASE_URL });
  const page = await context.newPage();
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await Promise.all([
    page.waitForURL((u) => !u.pathname.startsWith("/signin"), { timeout: 30_000 }),
    page
      .locator("form")
      .getByRole("button", { name: /sign in/i })
      .click(),
  ]);
  return { context, page };
}

/** Opens a demo project from /projects by its name and returns its id. */
export async function openProject(page: Page, name: string): Promise<string> {
  await page.goto("/projects");
  await page.getByRole("link", { name }).first().click();
  await page.waitForURL(/\/projects\/[0-9a-f-]{36}/);
  const id = /\/projects\/([0-9a-f-]{36})/.exec(page.url())?.[1];
  if (!id) throw new Error(`no project id in ${page.url()}`);
  return id;
}

/**
 * Plots are drawn first as our static SVG; the interactive chart loads when the pointer reaches one.
 * Hovers the `nth` plot on the page (once hydrated) and waits for its interactive chart: call it before
 * reading or clicking anything of the charting library's (`.js-plotly-plot`, `.nsewdrag`, hover labels).
 */
export async function interactivePlot(page: Page, nth = 0): Promise<void> {
  const plot = page.locator("[data-plot]").nth(nth);
  await plot.and(page.locator("[data-hydrated]")).waitFor({ timeout: 60_000 });
  await plot.hover();
  await plot.locator(".js-plotly-plot .trace").first().waitFor({ timeout: 60_000 });
}
