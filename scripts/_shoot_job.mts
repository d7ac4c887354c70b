import { spawn } from "node:child_process";
import { readFileSync } from "node:fs";
import { chromium } from "playwright-core";
const base = "http://127.0.0.1:3517";
const { runId } = JSON.parse(readFileSync("/tmp/mc/job3.json", "utf8"));
async function main() {
  const browser = await chromium.launch({
    executablePath: "/usr/bin/chromium",
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, baseURL: base });
  const page = await context.newPage();
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill("designer@demo.test");
  await page.getByLabel("Password").fill("phasewright-demo");
  await Promise.all([
    page.waitForURL((u) => !u.pathname.startsWith("/signin"), { timeout: 60_000 }),
    page.locator("form").getByRole("button", { name: /sign in/i }).click(),
  ]);
  await page.goto(`/dev/analyses?job=${runId}`, { waitUntil: "networkidle", timeout: 120_000 });
  await page.waitForTimeout(1500);
  await page.screenshot({ path: "/tmp/mc/shots/job-queued.png" });
  const worker = spawn("npx", ["tsx", "scripts/worker.ts"], { stdio: "inherit", detached: true });
  await page.waitForFunction(() => {
    const el = document.querySelector('[role="progressbar"]');
    return Number(el?.getAttribute("aria-valuenow") ?? 0) >= 30;
  }, undefined, { timeout: 120_000 });
  await page.screenshot({ path: "/tmp/mc/shots/job-running.png" });
  await page.getByRole("button", { name: "Cancel" }).click();
  await page.waitForFunction(() => document.body.innerText.includes("Cancelled"), undefined, { timeout: 60_000 });
  await page.screenshot({ path: "/tmp/mc/shots/job-cancelled.png" });
  // Snap helper: insert the first pair.
  const snap = page.getByRole("button", { name: /^Insert R = 16k/ });
  await snap.scrollIntoViewIfNeeded();
  await snap.click();
  await page.waitForTimeout(500);
  await page.screenshot({ path: "/tmp/mc/shots/snap.png" });
  await browser.close();
  process.kill(-worker.pid!, "SIGTERM");
}
main().catch((e) => { console.error(e); process.exit(1); });
