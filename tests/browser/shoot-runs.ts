// Screenshots of the runs area (project, run, compare, outbox, invitation) at laptop and phone size.
// Usage: E2E_BASE_URL=http://127.0.0.1:3401 npx tsx tests/browser/shoot-runs.ts [outDir]
import { mkdirSync } from "node:fs";
import { interactivePlot, launch, openProject, signedIn } from "./browser";

async function main(): Promise<void> {
  const out = process.argv[2] ?? "/tmp/runs-shots";
  mkdirSync(out, { recursive: true });
  const browser = await launch();
  const sizes = { laptop: { width: 1280, height: 800 }, phone: { width: 390, height: 844 } };
  let compareUrl = "";
  for (const [size, viewport] of Object.entries(sizes)) {
    const { context, page } = await signedIn(browser, "reviewer@demo.test", viewport);
    const projectId = await openProject(page, "Reference oscillator board");
    await page.getByRole("heading", { name: "Runs" }).waitFor();
    await page.screenshot({ path: `${out}/project-${size}.png`, fullPage: true });
    const hrefOf = (name: RegExp) => page.getByRole("link", { name }).first().getAttribute("href");
    const [hrefA, hrefB] = [await hrefOf(/rev A/), await hrefOf(/rev B/)];
    const revA = page.getByRole("link", { name: /rev A/ }).first();
    await revA.click();
    await page.waitForURL(/\/runs\//);
    await interactivePlot(page);
    await page.waitForTimeout(1200);
    await page.screenshot({ path: `${out}/run-${size}.png`, fullPage: true });
    await page.screenshot({ path: `${out}/run-top-${size}.png` });
    compareUrl ||= `/compare?a=${hrefA}&b=${hrefB}`.replaceAll("/runs/", "");
    await page.goto(compareUrl);
    await interactivePlot(page);
    await page.waitForTimeout(1200);
    await page.screenshot({ path: `${out}/compare-${size}.png`, fullPage: true });
    await page.goto("/dev/outbox");
    await page.screenshot({ path: `${out}/outbox-${size}.png`, fullPage: true });
    await page.goto(`/projects/${projectId}?sort=title&dir=asc&review=signed_off`);
    await page.getByRole("heading", { name: "Runs" }).waitFor();
    await page.screenshot({ path: `${out}/project-filtered-${size}.png` });
    await page.goto("/invite/not-a-real-token-at-all-000000000000");
    await page.screenshot({ path: `${out}/invite-${size}.png` });
    await context.close();
  }
  await browser.close();
  console.log(`screenshots in ${out}`);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exitCode = 1;
});
