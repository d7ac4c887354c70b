// Screenshots of the app shell, signed out and as each demo user, at laptop and phone sizes.
//   BASE_URL=http://localhost:3200 npx tsx scripts/screenshots.ts [owner designer reviewer viewer]
//   BASE_URL=… npx tsx scripts/screenshots.ts new-account   (signs up a throw-away screen-check-…@example.test)
//   BASE_URL=… NEXTAUTH_SECRET=<the server's> npx tsx scripts/screenshots.ts db-down   (database stopped)
// Writes PNGs to tests/artifacts/screenshots/ (git-ignored). Needs Debian's /usr/bin/chromium.
import { mkdirSync } from "node:fs";
import path from "node:path";
import { encode } from "next-auth/jwt";
import { type Browser, chromium, type Page } from "playwright-core";
import { ROLES } from "@/lib/roles";

const BASE = process.env.BASE_URL ?? "http://localhost:3000";
const OUT = process.env.OUT_DIR ?? path.join("tests", "artifacts", "screenshots");
const PASSWORD = process.env.DEMO_PASSWORD ?? "phasewright-demo";
const SIZES = [
  { name: "laptop", width: 1280, height: 800 },
  { name: "phone", width: 390, height: 844 },
] as const;

async function shot(page: Page, name: string): Promise<void> {
  // Wait for streamed content to replace the loading skeleton (it has no heading).
  await page.locator("main h1").first().waitFor({ timeout: 20_000 });
  await page.waitForLoadState("networkidle");
  const file = path.join(OUT, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  console.log(`  ${file}`);
}

/** Opens a page and waits until React has hydrated it (forms answer clicks only then). */
async function open(page: Page, route: string): Promise<void> {
  await page.goto(`${BASE}${route}`, { waitUntil: "networkidle" });
  if (route === "/signin" || route === "/signup") await page.locator("form[data-hydrated]").waitFor();
}

async function signIn(page: Page, email: string): Promise<void> {
  await open(page, "/signin");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Sign in", exact: true }).click();
  await page.waitForURL(/\/projects$/, { timeout: 20_000 });
}

async function signedOut(browser: Browser): Promise<void> {
  for (const size of SIZES) {
    const page = await browser.newPage({ viewport: size });
    for (const [route, name] of [
      ["/", "landing"],
      ["/signin", "signin"],
      ["/signup", "signup"],
      ["/no-such-page", "not-found"],
    ] as const) {
      await open(page, route);
      await shot(page, `${name}-${size.name}`);
    }
    // Keyboard: the first Tab shows the skip link, the next ones a visible focus ring.
    await open(page, "/");
    await page.keyboard.press("Tab");
    await shot(page, `focus-skip-${size.name}`);
    await page.keyboard.press("Tab");
    await page.keyboard.press("Tab");
    await shot(page, `focus-ring-${size.name}`);
    // Field errors after an empty submit, and the answer to a wrong password.
    await open(page, "/signin");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.getByText("Enter your password.").waitFor();
    await shot(page, `signin-errors-${size.name}`);
    await page.getByLabel("E-mail").fill("owner@demo.test");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in", exact: true }).click();
    await page.getByText("E-mail or password is wrong.").waitFor();
    await shot(page, `signin-wrong-${size.name}`);
    await page.close();
  }
}

async function asUser(browser: Browser, role: string): Promise<void> {
  for (const size of SIZES) {
    const context = await browser.newContext({ viewport: size });
    const page = await context.newPage();
    await signIn(page, `${role}@demo.test`);
    await shot(page, `${role}-projects-${size.name}`);
    const teamHref = await page.locator('a[href^="/teams/"]').first().getAttribute("href");
    await page.goto(`${BASE}/teams`);
    await shot(page, `${role}-teams-${size.name}`);
    if (teamHref) {
      await page.goto(`${BASE}${teamHref}`);
      await shot(page, `${role}-team-${size.name}`);
    }
    await page.goto(`${BASE}/settings`);
    await shot(page, `${role}-settings-${size.name}`);
    if (size.name === "laptop") {
      await page.getByRole("button", { name: /Account menu/ }).click();
      await shot(page, `${role}-menu-${size.name}`);
    }
    await context.close();
  }
}

/** A new account end to end: sign-up errors, sign-up, empty state, a project, an API token shown once, revoked. */
async function newAccount(browser: Browser): Promise<void> {
  const context = await browser.newContext({ viewport: SIZES[0] });
  const page = await context.newPage();
  await open(page, "/signup");
  await page.getByRole("button", { name: "Create account", exact: true }).last().click();
  await page.getByText("Enter your name.").waitFor();
  await shot(page, "flow-signup-errors-laptop");
  await page.getByLabel("Your name").fill("Screen Check");
  await page.getByLabel("Work e-mail").fill(`screen-check-${Date.now()}@example.test`);
  await page.getByLabel("Password").fill("a long test passphrase");
  await page.getByRole("button", { name: "Create account", exact: true }).last().click();
  await page.waitForURL(/\/projects$/, { timeout: 20_000 });
  await shot(page, "flow-empty-projects-laptop");
  await page.getByLabel("Project name").fill("Twin-T notch trial");
  await page.getByRole("button", { name: "Create project" }).click();
  await page.getByText("Project “Twin-T notch trial” created.").waitFor();
  await shot(page, "flow-project-created-laptop");
  await open(page, "/settings");
  await page.getByLabel("Token name").fill("bench logger");
  await page.getByRole("button", { name: "Create token" }).click();
  await page.getByText("Copy it now").waitFor();
  await shot(page, "flow-token-created-laptop");
  await page.getByRole("button", { name: "Revoke token bench logger" }).click();
  await page.getByText("revoked", { exact: true }).waitFor();
  await shot(page, "flow-token-revoked-laptop");
  await context.close();
}

/**
 * With the database stopped (or DATABASE_URL pointing at a closed port): a hand-sealed session cookie
 * (NEXTAUTH_SECRET must match the server's) gets past sign-in, and the pages must explain the outage.
 */
async function databaseDown(browser: Browser): Promise<void> {
  const secret = process.env.NEXTAUTH_SECRET;
  if (!secret) throw new Error("db-down mode needs the server's NEXTAUTH_SECRET");
  const value = await encode({
    token: { sub: "00000000-0000-4000-8000-000000000001", name: "Outage Check", email: "outage@demo.test" },
    secret,
  });
  for (const size of SIZES) {
    const context = await browser.newContext({ viewport: size });
    await context.addCookies([{ name: "next-auth.session-token", value, url: BASE }]);
    const page = await context.newPage();
    for (const route of ["/projects", "/settings"]) {
      await page.goto(`${BASE}${route}`);
      await page.getByText("We can't reach the database just now").waitFor({ timeout: 20_000 });
      await shot(page, `db-down${route.replace("/", "-")}-${size.name}`);
    }
    await context.close();
  }
}

async function main(): Promise<void> {
  mkdirSync(OUT, { recursive: true });
  const roles = process.argv.slice(2);
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM ?? "/usr/bin/chromium",
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
  try {
    if (roles[0] === "new-account") {
      console.log("new account");
      await newAccount(browser);
      return;
    }
    if (roles[0] === "db-down") {
      console.log("database down");
      await databaseDown(browser);
      return;
    }
    console.log("signed out");
    await signedOut(browser);
    for (const role of roles.length ? roles : ROLES) {
      console.log(role);
      await asUser(browser, role);
    }
  } finally {
    await browser.close();
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
