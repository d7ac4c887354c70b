// Screenshots of the bench readings panel (list, live arithmetic, field errors) and of compare, at
// laptop and phone size. Usage: E2E_BASE_URL=http://127.0.0.1:3652 npx tsx tests/browser/shoot-readings.ts [outDir]
import { mkdirSync } from "node:fs";
import { launch, openProject, signedIn } from "./browser";

async function main(): Promise<void> {
  const out = process.argv[2] ?? "/tmp/readings-shots";
  mkdirSync(out, { recursive: true });
  const browser = await launch();
  const sizes = { laptop: { width: 1280, height: 900 }, phone: { width: 390, height: 844 } };
  for (const [size, viewport] of Object.entries(sizes)) {
    const { context, page } = await signedIn(browser, "designer@demo.test", viewport);
    await openProject(page, "Reference oscillator board");
    const spreadHref = await page
      .getByRole("link", { name: /parts spread/ })
      .first()
      .getAttribute("href");
    const revBHref = await page
      .getByRole("link", { name: /rev B, 1 MHz/ })
      .first()
      .getAttribute("href");
    await page.goto(String(spreadHref));
    const panel = page.getByRole("region", { name: "Bench readings" });
    await panel.waitFor();
    await page.waitForTimeout(800);
    await panel.screenshot({ path: `${out}/readings-${size}.png` });
    await panel.getByLabel("One period spans (divisions)").fill("6.3");
    await panel.getByLabel("Time per division").fill("100");
    await panel.screenshot({ path: `${out}/readings-typing-${size}.png` });
    await panel.getByLabel("What was measured").selectOption("amplitude");
    await panel.getByLabel("Peak-to-peak spans (divisions)").fill("-2");
    await panel.getByRole("button", { name: "Record reading" }).click();
    await panel.getByText("Enter the scale per division.").waitFor();
    await panel.screenshot({ path: `${out}/readings-errors-${size}.png` });
    const a = String(revBHref).replace("/runs/", "");
    const b = String(spreadHref).replace("/runs/", "");
    await page.goto(`/compare?a=${a}&b=${b}`);
    const cmp = page.getByRole("region", { name: "Bench readings" });
    await cmp.waitFor();
    await cmp.screenshot({ path: `${out}/compare-readings-${size}.png` });
    await context.close();
  }
  await browser.close();
  console.log(`screenshots in ${out}`);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exitCode = 1;
});
