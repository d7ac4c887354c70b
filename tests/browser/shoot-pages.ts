// Screenshots of every main page at 1440×900 and 390×844 for each role (designer, reviewer, viewer and
// a new user who just signed up, in no team but their own), and of the signed-out pages, for a person to
// look at; reports every page wider than the screen (document scrollWidth > innerWidth) and exits 1 then.
// Usage: E2E_BASE_URL=http://127.0.0.1:3801 npx tsx tests/browser/shoot-pages.ts [outDir] [role|email…]
//   roles: designer reviewer viewer newcomer (default: all four)
import { mkdirSync } from "node:fs";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { BASE_URL, launch, openProject, signedIn } from "./browser";

const SIZES = { wide: { width: 1440, height: 900 }, phone: { width: 390, height: 844 } } as const;
type Viewport = (typeof SIZES)[keyof typeof SIZES];

async function settle(page: Page): Promise<void> {
  await page.waitForLoadState("networkidle").catch(() => undefined);
  await page.waitForTimeout(1500);
}

/** How much wider than the viewport the page is, in CSS pixels (0 when it fits). */
export async function overflowX(page: Page): Promise<number> {
  return page.evaluate(() => Math.max(0, document.documentElement.scrollWidth - window.innerWidth));
}

const wider: string[] = [];
/** A demo run's address (from the first demo role), to show what someone outside the team is told. */
let demoRun = "/runs/00000000-0000-4000-8000-000000000000";

async function shoot(page: Page, out: string, name: string, url: string | null): Promise<void> {
  if (url) await page.goto(url);
  await settle(page);
  await page.screenshot({ path: `${out}/${name}.png`, fullPage: true });
  const over = await overflowX(page);
  if (over > 1) {
    wider.push(`${name} (${page.url()}): ${over} px wider than the screen`);
    console.log(`sideways scroll: ${name}, ${over} px`);
  }
}

/** The pages a member of the demo team sees, from the oscillator project. */
async function demoRole(browser: Browser, out: string, role: string, size: string, viewport: Viewport) {
  const email = role.includes("@") ? role : `${role}@demo.test`;
  const tag = role.replace(/@.*/, "");
  const { context, page } = await signedIn(browser, email, viewport);
  const projectId = await openProject(page, "Reference oscillator board");
  const shots: [string, string][] = [
    ["projects", "/projects"],
    ["project", `/projects/${projectId}`],
    ["editor", `/projects/${projectId}/new`],
  ];
  await page.goto(`/projects/${projectId}`);
  const runLinks = await page
    .locator('a[href^="/runs/"]')
    .evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).getAttribute("href") ?? ""));
  const runs = [...new Set(runLinks)].slice(0, 4);
  for (const [i, href] of runs.entries()) shots.push([`run${i + 1}`, href]);
  if (runs[0]) demoRun = runs[0];
  if (runs.length >= 2) {
    const [a, b] = runs.map((r) => r.replace("/runs/", ""));
    shots.push(["compare", `/compare?a=${a}&b=${b}`]);
  }
  shots.push(["teams", "/teams"], ["settings", "/settings"], ["settings-api", "/settings/api"]);
  await page.goto("/teams");
  const team = await page.locator('a[href^="/teams/"]').first().getAttribute("href");
  if (team) shots.push(["team", team]);
  for (const [name, url] of shots) await shoot(page, out, `${tag}-${name}-${size}`, url);
  // Keyboard focus is visible: three Tabs into the first run page.
  if (runs[0] && size === "wide") {
    await page.goto(runs[0]);
    await settle(page);
    for (let i = 0; i < 3; i++) await page.keyboard.press("Tab");
    await page.screenshot({ path: `${out}/${tag}-run1-focus-${size}.png` });
  }
  await context.close();
}

/** Signs a new user up through the form (their own workbench only) and shoots what they see. */
async function newcomer(browser: Browser, out: string, size: string, viewport: Viewport, email: string) {
  const context: BrowserContext = await browser.newContext({ viewport, baseURL: BASE_URL });
  const page = await context.newPage();
  await page.goto("/signup");
  await page.locator("form[data-hydrated]").waitFor();
  await page.getByRole("button", { name: "Create account" }).click();
  await shoot(page, out, `newcomer-signup-errors-${size}`, null);
  await page.getByLabel("Your name").fill("Wren Okafor");
  await page.getByLabel("Work e-mail").fill(email);
  await page.getByLabel("Password", { exact: true }).fill("a quiet bench at noon");
  await page.getByRole("button", { name: "Create account" }).click();
  await page.getByText("Check your mail").waitFor({ timeout: 30_000 });
  await shoot(page, out, `newcomer-signup-done-${size}`, null);
  const shots: [string, string][] = [
    ["projects", "/projects"],
    ["teams", "/teams"],
    ["settings", "/settings"],
    // A demo team's run by address: what someone outside the team is told.
    ["foreign-run", demoRun],
  ];
  for (const [name, url] of shots) await shoot(page, out, `newcomer-${name}-${size}`, url);
  await context.close();
}

async function signedOut(browser: Browser, out: string, size: string, viewport: Viewport) {
  const context = await browser.newContext({ viewport, baseURL: BASE_URL });
  const page = await context.newPage();
  for (const name of ["signin", "signup", "forgot"])
    await shoot(page, out, `out-${name}-${size}`, `/${name}`);
  await context.close();
}

async function main(): Promise<void> {
  const out = process.argv[2] ?? "/tmp/page-shots";
  const roles = process.argv.slice(3);
  const chosen = roles.length ? roles : ["designer", "reviewer", "viewer", "newcomer"];
  mkdirSync(out, { recursive: true });
  const browser = await launch();
  const stamp = Date.now().toString(36);
  for (const [size, viewport] of Object.entries(SIZES)) {
    if (!roles.length) await signedOut(browser, out, size, viewport);
    for (const role of chosen) {
      if (role === "newcomer")
        await newcomer(browser, out, size, viewport, `wren-${stamp}-${size}@example.test`);
      else await demoRole(browser, out, role, size, viewport);
    }
  }
  await browser.close();
  if (wider.length) {
    console.log(`\n${wider.length} page(s) wider than the screen:\n${wider.join("\n")}`);
    process.exit(1);
  }
  console.log(`screenshots in ${out}; no page wider than the screen`);
}

if (require.main === module) {
  main().catch((err) => {
    console.error(err);
    process.exit(1);
  });
}
