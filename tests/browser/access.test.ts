// Pages of another team's project or run answer a real 404 (status and screen) — the same as an id
// that matches nothing — while a member of the team sees them (PRODUCT.md: not visible → 404).
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

describe("pages of another team", () => {
  it("answer 404 with the not-found screen for the outsider, 200 for a member", async () => {
    const member = await signedIn(browser, "viewer@demo.test");
    const projectId = await openProject(member.page, "Reference oscillator board");
    const runHref = await member.page.getByRole("link", { name: /rev A/ }).first().getAttribute("href");
    expect(runHref).toMatch(/^\/runs\/[0-9a-f-]{36}$/);
    const runB = await member.page.getByRole("link", { name: /rev B/ }).first().getAttribute("href");
    const pages = [
      `/projects/${projectId}`,
      `/projects/${projectId}/new`,
      runHref!,
      `/compare?a=${runHref!.slice(6)}&b=${runB!.slice(6)}`,
    ];
    for (const path of pages) {
      const res = await member.page.goto(path);
      expect(res?.status(), `member ${path}`).toBe(200);
    }
    // The tab names what the member may see (the run's title, the project's name).
    await member.page.goto(runHref!);
    expect(await member.page.title()).toMatch(/^Bridge oscillator rev A.* · Phasewright$/);
    await member.page.goto(`/projects/${projectId}`);
    expect(await member.page.title()).toBe("Reference oscillator board · Phasewright");

    const outsider = await signedIn(browser, "outsider@demo.test");
    const missing = "00000000-0000-4000-8000-000000000000";
    for (const path of [...pages, `/runs/${missing}`, `/projects/${missing}`, "/runs/not-an-id"]) {
      const res = await outsider.page.goto(path);
      expect(res?.status(), `outsider ${path}`).toBe(404);
      expect(await outsider.page.getByRole("heading", { level: 1 }).textContent()).toBe("Nothing here");
      expect(await outsider.page.title()).not.toContain("Reference oscillator board");
    }
    await member.context.close();
    await outsider.context.close();
  });
});
