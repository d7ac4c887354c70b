// Signing up in a real browser: the form names what is wrong per field, and once the account exists
// the page says where the verification link went before the user moves on to their own workbench.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, launch } from "./browser";

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

describe("sign-up", () => {
  it("tells the new user to check their mail for the verification link", async () => {
    const context = await browser.newContext({ baseURL: BASE_URL, viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await page.goto("/signup");
    await page.locator("form[data-hydrated]").waitFor();
    await page.getByRole("button", { name: "Create account" }).click();
    await expect.poll(() => page.getByLabel("Work e-mail").getAttribute("aria-invalid")).toBe("true");

    const email = `signup-${Date.now().toString(36)}@example.test`;
    await page.getByLabel("Your name").fill("Wren Okafor");
    await page.getByLabel("Work e-mail").fill(email);
    await page.getByLabel("Password", { exact: true }).fill("a quiet bench at noon");
    await page.getByRole("button", { name: "Create account" }).click();
    const done = page.getByTestId("signup-check-mail");
    await done.waitFor({ timeout: 30_000 });
    const text = (await done.textContent()) ?? "";
    expect(text).toContain("Check your mail");
    expect(text).toContain(email);
    expect(text).toContain("open it to confirm your address");
    // The page stays until the user moves on, signed in, to their own (empty) workbench.
    expect(new URL(page.url()).pathname).toBe("/signup");
    await page.getByRole("link", { name: "Continue to your projects" }).click();
    await page.waitForURL((u) => u.pathname === "/projects");
    await expect.poll(() => page.locator("body").textContent()).toContain("Wren's workbench");
    // Settings says the address is not confirmed yet; asking again within the minute is refused politely.
    await page.goto("/settings");
    const state = page.getByTestId("email-state");
    await expect.poll(() => state.textContent()).toContain(`${email} is not confirmed yet`);
    await page.getByRole("button", { name: "Send the link again" }).click();
    await expect.poll(() => state.textContent(), { timeout: 15_000 }).toContain("less than a minute ago"); // sign-up sent one just now
    await context.close();
  });
});
