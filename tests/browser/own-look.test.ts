// Our own look in a real browser: the plot has our controls and cursor readout (no library icon
// bar, our hover labels), and the compare page shows the netlist diff by statement.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { interactivePlot, launch, openProject, signedIn } from "./browser";

// First-order RC low-pass, R = 1 kΩ, C = 100 nF: corner fc = 1/(2π·R·C) = 1591.549 Hz, where
// |H| = 1/√2 (−3.0103 dB) and the phase is −45°; at 10·fc, |H| = 1/√101 (−20.043 dB) and the
// phase is −atan(10) = −84.289° (common practice: the single-pole low-pass).
const lowpass = (r: string, extra: string[] = []) =>
  [
    "title Corner check, single RC",
    "# An invented bench jig: one RC section into a buffer.",
    "Vin: vsource in gnd 1",
    `R1: resistor in out ${r} tol=1%`,
    "C1: capacitor out gnd 100n tol=5%",
    ...extra,
    "Rload: resistor out gnd 1G",
    "sweep 10Hz to 1MHz log 200 per decade",
    "show H = volts(out) / volts(in)",
    "measure fc = crossing(H, half-power)",
    "check fc between 1kHz and 2kHz",
  ].join("\n");

let browser: Browser;
let projectId = "";
const stamp = Date.now().toString(36);

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

async function saveRun(page: Page, title: string, netlist: string): Promise<string> {
  const res = await page.request.post(`/api/projects/${projectId}/runs`, { data: { title, netlist } });
  expect(res.status()).toBe(201);
  return ((await res.json()) as { run: { id: string } }).run.id;
}

/** The numbers in a readout cell ("−3.01 dB" → −3.01). */
const num = (text: string | null) => Number((text ?? "").replace("−", "-").replace(/[^0-9.+-]/g, ""));

describe("our own look", () => {
  let first = "";
  let second = "";

  it("plots without the library's icon bar, with our hover label, reset, PNG and cursor readout", async () => {
    const { context, page } = await signedIn(browser, "designer@demo.test");
    projectId = await openProject(page, "Anti-alias filter board");
    first = await saveRun(page, `Corner check ${stamp}`, lowpass("1k"));
    await page.goto(`/runs/${first}`);
    await interactivePlot(page);
    await page.locator(".js-plotly-plot .nsewdrag").first().waitFor({ timeout: 60_000 });
    expect(await page.locator(".modebar").count()).toBe(0);
    expect(await page.locator(".modebar-container .modebar-btn").count()).toBe(0);
    const plot = page.getByRole("figure", { name: /Bode plot/ });
    for (const name of ["Reset view", "PNG", "cursor A", "cursor B", "comment pin"]) {
      expect(await plot.getByRole("button", { name }).count()).toBe(1);
    }

    // Our hover label: value, a space, SI-prefixed unit; a true minus sign.
    const drag = page.locator(".js-plotly-plot .nsewdrag").first();
    const box = await drag.boundingBox();
    if (!box) throw new Error("plot area not found");
    await page.mouse.move(box.x + box.width * 0.45, box.y + box.height * 0.5);
    await expect
      .poll(() => page.locator(".hoverlayer .hovertext").first().textContent(), { timeout: 10_000 })
      // The label starts with the trace's name (H), then our text.
      .toMatch(/^H[0-9.]+ (k|M)?Hz {2}· {2}−?[0-9]+\.[0-9]{2} dB$/);

    // Click mode "cursor A", then a click on the plot places A (and the mode moves on to B).
    await plot.getByRole("button", { name: "cursor A" }).click();
    await page.mouse.click(box.x + box.width * 0.3, box.y + box.height * 0.5);
    const readout = page.getByRole("region", { name: "Cursor readout" });
    const freqA = readout.getByLabel("Cursor A frequency");
    await expect.poll(() => freqA.inputValue()).toMatch(/^[0-9.]+ (k)?Hz$/);
    expect(await plot.getByRole("button", { name: "cursor B" }).getAttribute("aria-pressed")).toBe("true");

    // Typed frequencies: A at the corner, B a decade above.
    await freqA.fill("1.5915k");
    await freqA.press("Enter");
    const freqB = readout.getByLabel("Cursor B frequency");
    await freqB.fill("15.915 kHz");
    await freqB.press("Enter");
    const cells = (id: string) => readout.locator(`tr[data-cursor="${id}"] td`).allTextContents();
    await expect.poll(async () => (await cells("A"))[1]).toMatch(/dB$/);
    const [, aDb, aDeg] = await cells("A");
    const [, bDb, bDeg] = await cells("B");
    expect(num(aDb ?? null)).toBeCloseTo(-3.01, 1);
    expect(num(aDeg ?? null)).toBeCloseTo(-45.0, 0);
    expect(num(bDb ?? null)).toBeCloseTo(-20.04, 1);
    expect(num(bDeg ?? null)).toBeCloseTo(-84.29, 0);
    const [dHz, dDb, dDeg] = await cells("delta");
    expect(dHz).toMatch(/^\+14\.32\d? kHz$/); // five significant figures, like every frequency on the page
    expect(num(dDb ?? null)).toBeCloseTo(-17.03, 1);
    expect(num(dDeg ?? null)).toBeCloseTo(-39.29, 0);
    expect(aDb).toMatch(/^−3\.0[01] dB$/);
    expect(aDeg).toMatch(/^−4[45]\.[0-9]°$/);

    // The cursors are drawn on the plot with their letters.
    await expect
      .poll(() => page.locator(".js-plotly-plot .annotation-text").allTextContents())
      .toEqual(expect.arrayContaining(["A", "B"]));

    // PNG download beside the plot, with a title, date and hash band above the plot.
    const [download] = await Promise.all([
      page.waitForEvent("download"),
      plot.getByRole("button", { name: "PNG" }).click(),
    ]);
    expect(download.suggestedFilename()).toBe(`Corner check ${stamp}.png`);
    await context.close();
  });

  it("compare shows one changed row per edited part with old → new, and added/removed parts in words", async () => {
    expect(first).not.toBe("");
    const { context, page } = await signedIn(browser, "designer@demo.test");
    second = await saveRun(
      page,
      `Corner check ${stamp} rev 2`,
      lowpass("1k2", ["C2: capacitor out gnd 1n"]).replace("Rload: resistor out gnd 1G\n", ""),
    );
    await page.goto(`/compare?a=${first}&b=${second}`);
    const diff = page.getByRole("region", { name: "Netlist changes" });
    const changed = diff.locator('[data-diff-row="changed"]');
    await expect.poll(() => changed.count(), { timeout: 30_000 }).toBe(1);
    expect(await changed.textContent()).toContain("changed");
    expect(await changed.locator("del").textContent()).toBe("1k");
    expect(await changed.locator("ins").textContent()).toBe("1k2");
    expect(await changed.locator("code").textContent()).toBe("R1: resistor in out 1k→ becomes 1k2 tol=1%");
    const added = diff.locator('[data-diff-row="added"]');
    expect(await added.count()).toBe(1);
    expect(await added.textContent()).toMatch(/added.*C2: capacitor out gnd 1n$/);
    const removed = diff.locator('[data-diff-row="removed"]');
    expect(await removed.count()).toBe(1);
    expect(await removed.textContent()).toMatch(/removed.*Rload: resistor out gnd 1G$/);
    // Two lines of context stay beside the changes; the rest folds, in our words, and opens on demand.
    const fold = diff.locator("summary");
    expect(await fold.count()).toBe(1);
    expect(await fold.textContent()).toContain("2 lines as in both runs (lines 9–10 of B)");
    expect(await diff.getByText("check fc between 1kHz and 2kHz").isVisible()).toBe(false);
    await fold.focus();
    await page.keyboard.press("Enter");
    await expect.poll(() => diff.getByText("check fc between 1kHz and 2kHz").isVisible()).toBe(true);
    expect(await diff.textContent()).not.toMatch(/unchanged lines|⋯/);
    await context.close();
  });
});
