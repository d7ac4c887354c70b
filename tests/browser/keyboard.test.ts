// Keyboard use of the app shell in a real browser: skip link, and where focus goes after a
// client-side navigation (it starts on the new page's content, as after a full page load).
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, signedIn } from "./browser";

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

const activeId = (page: import("playwright-core").Page) =>
  page.evaluate(() => document.activeElement?.id ?? "");

describe("keyboard", () => {
  it("the first Tab reaches the skip link, which moves focus to the content", async () => {
    const { context, page } = await signedIn(browser, "viewer@demo.test");
    await page.goto("/projects");
    await page.getByRole("heading", { level: 1 }).waitFor();
    await page.keyboard.press("Tab");
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe("Skip to content");
    await page.keyboard.press("Enter");
    await expect.poll(() => activeId(page)).toBe("main");
    await context.close();
  });

  it("after following a header link, focus is on the new page's content, not left in the header", async () => {
    const { context, page } = await signedIn(browser, "viewer@demo.test");
    await page.goto("/projects");
    await page.getByRole("heading", { level: 1 }).waitFor();
    const teams = page.getByRole("navigation").getByRole("link", { name: "Teams", exact: true });
    await teams.focus();
    await page.keyboard.press("Enter");
    await page.waitForURL(/\/teams$/);
    await expect.poll(() => activeId(page)).toBe("main");
    // The next Tab lands inside the new page, not back on the header's links.
    await page.keyboard.press("Tab");
    expect(await page.evaluate(() => Boolean(document.activeElement?.closest("#main")))).toBe(true);
    await context.close();
  });
});
