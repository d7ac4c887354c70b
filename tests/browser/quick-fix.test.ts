// The editor offers our hints as one-step fixes: an earlier probe spelling gets a marker, our own
// hover (no stock "View Problem" / "No quick fixes available"), and a quick fix whose result solves.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, openProject, signedIn } from "./browser";

// Equal-part bridge network (R = 10 kΩ, C = 10 nF), written with the earlier probe words. CHECKS.md §2:
// the output is in phase with the input at f0 = 1/(2πRC) = 1591.5494309 Hz.
const OLD_BRIDGE = `title Bridge with old probes
Vin: vsource   in  gnd 1
Rs:  resistor  in  mid 10k
Cs:  capacitor mid out 10n
Rp:  resistor  out gnd 10k
Cp:  capacitor out gnd 10n
sweep 100Hz to 100kHz log 50 per decade
show bridge = v(out) / v(in)
measure f0  = zero-phase(bridge)
`;

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

/** The editor's text as rendered (Monaco draws blanks as no-break spaces). */
async function editorText(page: Page): Promise<string> {
  const text = (await page.locator(".monaco-editor .view-lines").first().textContent()) ?? "";
  return text.replace(/\u00a0/g, " ");
}

/** Screenshots for a person to look at, when QUICK_FIX_SHOTS names a folder. */
async function shoot(page: Page, name: string): Promise<void> {
  const dir = process.env.QUICK_FIX_SHOTS;
  if (dir) await page.screenshot({ path: `${dir}/${name}.png` });
}

async function applyQuickFix(page: Page, label: RegExp): Promise<void> {
  await page.keyboard.press("ControlOrMeta+.");
  const item = page.locator(".action-widget").getByText(label).first();
  await item.waitFor({ timeout: 15_000 });
  await shoot(page, `menu-${label.source.replace(/\W+/g, "")}`);
  await page.keyboard.press("Enter");
  await item.waitFor({ state: "detached", timeout: 15_000 });
}

describe("quick fixes from our hints", () => {
  it("old probe form → marker and our hover → quick fix → the rewritten netlist solves", async () => {
    const { context, page } = await signedIn(browser, "designer@demo.test");
    // The editor loads only its own script and worker — no language-service workers it never uses.
    const scripts: string[] = [];
    page.on("request", (r) => {
      if (r.url().includes("/monaco/")) scripts.push(new URL(r.url()).pathname);
    });
    await context.grantPermissions(["clipboard-read", "clipboard-write"]);
    const projectId = await openProject(page, "Reference oscillator board");
    await page.goto(`/projects/${projectId}/new`);
    const editor = page.locator(".monaco-editor").first();
    await editor.waitFor({ timeout: 60_000 });
    await editor.click();
    await page.keyboard.press("ControlOrMeta+A");
    await page.keyboard.press("Delete");
    await page.evaluate((text) => navigator.clipboard.writeText(text), OLD_BRIDGE);
    await page.keyboard.press("ControlOrMeta+V");
    await shoot(page, "pasted");

    // Two error markers: `v(out)` and `v(in)` (the live check runs after a short pause).
    await expect
      .poll(() => page.locator(".monaco-editor .squiggly-error").count(), { timeout: 30_000 })
      .toBe(2);

    // Our hover explains the problem and the fix; Monaco's stock action bar stays hidden.
    await page.locator(".monaco-editor .squiggly-error").first().hover({ force: true });
    const hover = page.locator(".monaco-hover").filter({ hasText: "Netlist error" }).first();
    await hover.waitFor({ timeout: 15_000 });
    await shoot(page, "hover");
    const hoverText = (await hover.textContent()) ?? "";
    expect(hoverText).toContain("write volts(out)");
    expect(hoverText).toContain("One-step fix: Write volts(out)");
    const stock = page.getByText(/View Problem|No quick fixes available/);
    expect(
      await stock.evaluateAll((els) => els.filter((e) => (e as HTMLElement).offsetParent !== null).length),
    ).toBe(0);
    await page.mouse.move(0, 0);

    // Line 8 is `show bridge = v(out) / v(in)`: the cursor on the first `v`, then on the second.
    await editor.click();
    await page.keyboard.press("ControlOrMeta+Home");
    for (let k = 0; k < 7; k++) await page.keyboard.press("ArrowDown");
    await page.keyboard.press("Home");
    for (let k = 0; k < 15; k++) await page.keyboard.press("ArrowRight");
    await applyQuickFix(page, /Write `?volts\(out\)`?/);
    // Fixes act only on markers of the current text: wait for the check of the edited text (one error left).
    await expect
      .poll(() => page.locator(".monaco-editor .squiggly-error").count(), { timeout: 30_000 })
      .toBe(1);
    await page.keyboard.press("End");
    for (let k = 0; k < 4; k++) await page.keyboard.press("ArrowLeft");
    await applyQuickFix(page, /Write `?volts\(in\)`?/);

    await expect
      .poll(() => editorText(page), { timeout: 15_000 })
      .toContain("show bridge = volts(out) / volts(in)");
    await expect
      .poll(() => page.locator(".monaco-editor .squiggly-error").count(), { timeout: 30_000 })
      .toBe(0);
    // The fixed netlist solves: the zero-phase frequency of the bridge, 1.5915 kHz.
    await expect.poll(() => page.getByText("1.5915 kHz").count(), { timeout: 60_000 }).toBeGreaterThan(0);
    const js = [...new Set(scripts.filter((p) => p.endsWith(".js")))];
    expect(js).toContain("/monaco/pw-editor.js");
    expect(js.filter((p) => p !== "/monaco/pw-editor.js" && p !== "/monaco/editor.worker.js")).toEqual([]);
    await context.close();
  }, 240_000);
});
