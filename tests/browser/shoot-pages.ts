// Screenshots of every main page at 1440×900 and 390×844 for one role, for a person to look at;
// also reports any page that scrolls sideways on a phone.
// Usage: E2E_BASE_URL=http://127.0.0.1:3801 npx tsx tests/browser/shoot-pages.ts [outDir] [email]
import { mkdirSync } from "node:fs";
import type { Page } from "playwright-core";
import { launch, openProject, signedIn } from "./browser";

async function settle(page: Page): Promise<void> {
  await page.waitForLoadState("networkidle").catch(() => undefined);
  await page.waitForTimeout(1500);
}

async function main(): Promise<void> {
  const out = process.argv[2] ?? "/tmp/page-shots";
  const email = process.argv[3] ?? "designer@demo.test";
  mkdirSync(out, { recursive: true });
  const browser = await launch();
  const sizes = { wide: { width: 1440, height: 900 }, phone: { width: 390, height: 844 } };
  for (const [size, viewport] of Object.entries(sizes)) {
    const { context, page } = await signedIn(browser, email, viewport);
    const shots: [string, string][] = [];
    const projectId = await openProject(page, "Reference oscillator board");
    shots.push(
      ["projects", "/projects"],
      ["project", `/projects/${projectId}`],
      ["editor", `/projects/${projectId}/new`],
    );
    const runLinks = await page
      .locator('a[href^="/runs/"]')
      .evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).getAttribute("href") ?? ""));
    const runs = [...new Set(runLinks)].slice(0, 4);
    for (const [i, href] of runs.entries()) shots.push([`run${i + 1}`, href]);
    if (runs.length >= 2) {
      const [a, b] = runs.map((r) => r.replace("/runs/", ""));
      shots.push(["compare", `/compare?a=${a}&b=${b}`]);
    }
    shots.push(["settings", "/settings"], ["forgot", "/forgot"]);
    for (const [name, url] of shots) {
      await page.goto(url);
      await settle(page);
      await page.screenshot({ path: `${out}/${name}-${size}.png`, fullPage: true });
      const wide = await page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
      if (wide) console.log(`sideways scroll: ${name} at ${size} (${url})`);
    }
    await context.close();
  }
  await browser.close();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
