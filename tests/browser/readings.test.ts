// Bench readings on the run page in a real browser (seeded demo): the demo's two readings with their
// verdicts, a reading recorded with the keyboard alone and deleted again, and a viewer without the form.
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

async function openSpreadRun(page: Page) {
  await openProject(page, "Reference oscillator board");
  await page
    .getByRole("link", { name: /parts spread/ })
    .first()
    .click();
  await page.waitForURL(/\/runs\//);
  const panel = page.getByRole("region", { name: "Bench readings" });
  await panel.waitFor();
  return panel;
}

describe("bench readings", () => {
  it("shows the demo's readings inside and outside the spread", async () => {
    const { context, page } = await signedIn(browser, "viewer@demo.test");
    const panel = await openSpreadRun(page);
    const rows = panel.getByRole("table").locator("tbody tr");
    await expect.poll(() => rows.count()).toBe(2);
    await expect
      .poll(() => rows.nth(0).textContent())
      .toContain("inside the spread parts tolerances explain");
    await expect
      .poll(() => rows.nth(1).textContent())
      .toContain("outside: look for a build fault or a wrong part");
    // A viewer reads; the form and the delete buttons are for designers and owners.
    expect(await panel.getByRole("form", { name: "Record a bench reading" }).count()).toBe(0);
    expect(await panel.getByRole("button", { name: /Delete reading/ }).count()).toBe(0);
    await context.close();
  });

  it("records a scope period with the keyboard, shows the arithmetic, and deletes it", async () => {
    const { context, page } = await signedIn(browser, "designer@demo.test");
    const panel = await openSpreadRun(page);
    await panel.getByLabel("One period spans (divisions)").focus();
    await page.keyboard.type("9.8");
    await page.keyboard.press("Tab"); // to "Time per division"
    await page.keyboard.type("10");
    // 9.8 div × 10 µs/div = 98 µs; 1/98 µs = 10.204 kHz (issue 9's worked example).
    await expect
      .poll(() => panel.locator("output").textContent())
      .toContain("9.8 div × 10 µs/div = 98 µs → 10.2 kHz");
    await page.keyboard.press("Enter");
    const rows = panel.getByRole("table").locator("tbody tr");
    await expect.poll(() => rows.count()).toBe(3);
    page.once("dialog", (d) => void d.accept());
    await panel
      .getByRole("button", { name: "Delete reading 9.8 div × 10 µs/div = 98 µs → 10.2 kHz" })
      .click();
    await expect.poll(() => rows.count()).toBe(2);
    await context.close();
  });

  it("names each missing number under its own field, and the table stacks on a phone", async () => {
    const { context, page } = await signedIn(browser, "designer@demo.test", { width: 390, height: 844 });
    const panel = await openSpreadRun(page);
    // Only the divisions typed: the scale per division is named as missing, under its own input.
    await panel.getByLabel("One period spans (divisions)").fill("9.8");
    await panel.getByRole("button", { name: "Record reading" }).click();
    const per = panel.getByLabel("Time per division");
    await expect.poll(() => per.getAttribute("aria-invalid")).toBe("true");
    const describedBy = (await per.getAttribute("aria-describedby")) ?? "";
    expect(await page.locator(`[id="${describedBy}"]`).textContent()).toContain(
      "Enter the scale per division.",
    );
    expect(await panel.getByLabel("One period spans (divisions)").getAttribute("aria-invalid")).toBeNull();
    // Nothing was saved: still the demo's two readings.
    const rows = panel.getByRole("table").locator("tbody tr");
    expect(await rows.count()).toBe(2);

    // 390 px: no sideways scroll, neither of the page nor inside the readings; each reading a card
    // whose cells carry their column names.
    const fit = await page.evaluate(() => {
      const table = document.querySelector('[aria-labelledby="readings-h"] table');
      const scroller = table?.parentElement as HTMLElement | null | undefined;
      return {
        page: document.documentElement.scrollWidth - window.innerWidth,
        inside: scroller ? scroller.scrollWidth - scroller.clientWidth : -1,
        right: Math.max(
          ...[...(table?.querySelectorAll("tbody tr") ?? [])].map((r) => r.getBoundingClientRect().right),
        ),
        width: window.innerWidth,
      };
    });
    expect(fit.inside).toBe(0);
    expect(fit.page).toBeLessThanOrEqual(0);
    expect(fit.right).toBeLessThanOrEqual(fit.width);
    const predicted = rows.nth(0).locator('td[data-label="Predicted"]');
    expect(await predicted.evaluate((td) => getComputedStyle(td, "::before").content)).toBe('"Predicted"');
    await context.close();
  });
});
