// A sent-back (or any) run can be revised from its page: the editor opens with its netlist, and the run
// saved from there supersedes it — both pages link the pair.
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

describe("revise a run", () => {
  it("Revise opens the netlist in the editor; the saved revision supersedes the run", async () => {
    const { context, page } = await signedIn(browser, "designer@demo.test");
    await openProject(page, "Anti-alias filter board");
    await page.getByRole("link", { name: "Pilot-tone notch, twin-T" }).first().click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    const oldUrl = page.url();
    const oldTitle = (await page.locator("h1 span").first().textContent())?.trim() ?? "";
    await page.getByRole("link", { name: "Revise" }).click();
    await page.waitForURL(/\/new\?revise=/);
    await expect
      .poll(() => page.getByTestId("revising").textContent(), { timeout: 30_000 })
      .toContain(oldTitle);
    await page.locator(".monaco-editor").first().waitFor({ timeout: 60_000 });
    // The preview solves the revised run's netlist (its own text, not a draft or an example).
    await expect
      .poll(() => page.getByTestId("preview-status").textContent(), { timeout: 60_000 })
      .toMatch(/^Solved /);
    const title = page.getByLabel("Run title");
    expect(await title.inputValue()).toBe(`${oldTitle} (revised)`);
    // A title that does not contain the old one, so other tests' links to the original stay unique.
    await title.fill(`Notch revision ${Date.now()}`);
    await page.getByRole("button", { name: "Save revision" }).click();
    await page.waitForURL((u) => /\/runs\/[0-9a-f-]{36}$/.test(u.pathname) && u.href !== oldUrl, {
      timeout: 60_000,
    });
    const revises = page.getByText("Revises");
    await revises.waitFor({ timeout: 30_000 });
    expect(await page.getByRole("link", { name: oldTitle }).count()).toBeGreaterThan(0);
    await page.goto(oldUrl);
    await expect.poll(() => page.getByText("Superseded by").count(), { timeout: 30_000 }).toBeGreaterThan(0);
    await context.close();
  }, 240_000);
});
