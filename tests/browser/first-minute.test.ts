// The four things a user must manage in the first minutes (PRODUCT.md), in a real browser against
// the running app and its seeded demo data.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { interactivePlot, launch, openProject, signedIn } from "./browser";

// Equal-part bridge network: R = 10 kΩ, C = 10 nF. CHECKS.md §2 (OAFE §15.7.1, Eqs. 15-7…15-9 —
// confirmed): the output is in phase with the input at f0 = 1591.5494309 Hz, where it is 1/3 (−9.542425 dB).
const BRIDGE = `title Pasted bridge network
Vin: vsource   in  gnd 1
Rs:  resistor  in  mid 10k
Cs:  capacitor mid out 10n
Rp:  resistor  out gnd 10k
Cp:  capacitor out gnd 10n
sweep 100Hz to 100kHz log 50 per decade
show bridge = volts(out) / volts(in)
measure f0  = zero-phase(bridge)
measure att = db(bridge) at f0
`;

let browser: Browser;
const stamp = Date.now().toString(36);

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

describe("first minutes", () => {
  let savedRunUrl = "";

  it("1 · paste a bridge network and see magnitude and phase plotted, then save it", async () => {
    const { context, page } = await signedIn(browser, "designer@demo.test");
    await context.grantPermissions(["clipboard-read", "clipboard-write"]);
    const projectId = await openProject(page, "Reference oscillator board");
    await page.getByRole("link", { name: "New run" }).click();
    await page.waitForURL(`**/projects/${projectId}/new`);
    const editor = page.locator(".monaco-editor").first();
    await editor.waitFor({ timeout: 60_000 });
    await editor.click();
    await page.keyboard.press("ControlOrMeta+A");
    await page.keyboard.press("Delete");
    await page.evaluate((text) => navigator.clipboard.writeText(text), BRIDGE);
    await page.keyboard.press("ControlOrMeta+V");
    // The live preview solves on the server and plots both rows (log frequency axis); the pointer on
    // the plot brings in the interactive chart.
    await interactivePlot(page);
    await expect
      .poll(() => page.locator(".js-plotly-plot .xaxislayer-above").count(), { timeout: 30_000 })
      .toBeGreaterThan(0);
    const axisTypes = await page.evaluate(() => {
      const gd = document.querySelector(".js-plotly-plot") as unknown as {
        _fullLayout?: Record<string, { type?: string }>;
      };
      return Object.entries(gd._fullLayout ?? {})
        .filter(([k]) => k.startsWith("xaxis"))
        .map(([, v]) => v.type);
    });
    expect(axisTypes.length).toBeGreaterThanOrEqual(1);
    expect(axisTypes.every((t) => t === "log")).toBe(true);
    await expect.poll(() => page.getByText("1.5915 kHz").count(), { timeout: 30_000 }).toBeGreaterThan(0);

    await page.getByLabel(/title/i).fill(`Pasted bridge ${stamp}`);
    await Promise.all([
      page.waitForURL(/\/runs\/[0-9a-f-]{36}$/, { timeout: 60_000 }),
      page.getByRole("button", { name: "Save run" }).click(),
    ]);
    savedRunUrl = page.url();
    await expect
      .poll(() => page.getByRole("heading", { level: 1 }).textContent())
      .toContain(`Pasted bridge ${stamp}`);
    await context.close();
  });

  it("2 · read the zero-phase frequency: a number in the measures and a marker on the plot", async () => {
    const { context, page } = await signedIn(browser, "viewer@demo.test");
    await page.goto(savedRunUrl || "/projects");
    expect(savedRunUrl).not.toBe("");
    const measures = page.getByRole("region", { name: "Measures" });
    const f0Row = measures.getByRole("row").filter({ hasText: "f0" });
    await expect.poll(() => f0Row.textContent()).toContain("1.5915 kHz"); // CHECKS.md §2: 1591.5494 Hz
    const attRow = measures.getByRole("row").filter({ hasText: "att" });
    await expect.poll(() => attRow.textContent()).toMatch(/−9\.542\d? dB/); // CHECKS.md §2: −9.542425 dB
    await interactivePlot(page);
    await expect
      .poll(() => page.locator(".js-plotly-plot .annotation-text").allTextContents(), { timeout: 30_000 })
      .toEqual(expect.arrayContaining([expect.stringContaining("f0")]));
    await context.close();
  });

  it("3 · diff two saved runs: parts changed, measures with Δ, overlaid traces", async () => {
    const { context, page } = await signedIn(browser, "reviewer@demo.test");
    await openProject(page, "Reference oscillator board");
    await page.getByRole("checkbox", { name: /rev A/ }).check();
    await page.getByRole("checkbox", { name: /rev B/ }).check();
    await Promise.all([
      page.waitForURL(/\/compare\?a=.+&b=.+/),
      page.getByRole("link", { name: "Compare selected" }).click(),
    ]);
    const parts = page.getByRole("region", { name: "Parts changed" });
    await expect.poll(() => parts.textContent()).toContain("U1");
    const measures = page.getByRole("region", { name: "Measures" });
    await expect.poll(() => measures.textContent()).toContain("gain");
    await expect.poll(() => measures.textContent()).toMatch(/%/);
    const diff = page.getByRole("region", { name: "Netlist changes" });
    await expect.poll(() => diff.textContent()).toContain("gbw=1MHz");
    // Part-aware: U1 edited in place is one changed row with the new options marked.
    const u1 = diff.locator('[data-diff-row="changed"]').filter({ hasText: "U1: opamp" });
    expect(await u1.count()).toBe(1);
    expect(await u1.locator("ins").textContent()).toContain("gain=100k gbw=1MHz");
    await interactivePlot(page);
    await context.close();
  });

  it("4 · comment on a teammate's run, pinned to a frequency, and the author's e-mail is in the outbox", async () => {
    const { context, page } = await signedIn(browser, "reviewer@demo.test");
    await openProject(page, "Anti-alias filter board");
    await page.getByRole("link", { name: "Pilot-tone notch, twin-T" }).click();
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}$/);
    const body = `Notch depth looks fine ${stamp}`;
    // Click the magnitude row to pin the comment to a frequency on a trace.
    await interactivePlot(page);
    const drag = page.locator(".js-plotly-plot .nsewdrag").first();
    await drag.waitFor();
    const box = await drag.boundingBox();
    if (!box) throw new Error("plot area not found");
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.5);
    await page.mouse.click(box.x + box.width * 0.5, box.y + box.height * 0.5);
    await expect
      .poll(() => page.getByRole("button", { name: "Remove pin" }).count(), { timeout: 15_000 })
      .toBe(1);
    await page.getByLabel("Add a comment").fill(body);
    await page.getByRole("button", { name: "Post comment" }).click();
    const comments = page.getByRole("region", { name: /Comments/ });
    await expect.poll(() => comments.textContent(), { timeout: 30_000 }).toContain(body);
    // The saved comment carries its pin (a frequency inside the 100 Hz – 20 kHz sweep) on trace N.
    const pin = comments
      .locator("article")
      .filter({ hasText: body })
      .getByRole("button", { name: /on the plot/ });
    const pinText = (await pin.textContent()) ?? "";
    expect(pinText).toMatch(/(Hz|kHz) · N$/);

    // The outbox shows each person only their own mail: the commenter does not see it there...
    await page.goto("/dev/outbox");
    expect(await page.locator("details").filter({ hasText: body }).count()).toBe(0);
    await context.close();
    // ...the run's author does (delivered or still pending: both listed).
    const author = await signedIn(browser, "designer@demo.test");
    const mail = author.page.locator("details").filter({ hasText: body });
    await expect
      .poll(
        async () => {
          await author.page.goto("/dev/outbox");
          return mail.count();
        },
        { timeout: 30_000 },
      )
      .toBe(1);
    const summary = await mail.locator("summary").textContent();
    expect(summary).toContain('commented on "Pilot-tone notch, twin-T"');
    expect(summary).toContain("to designer@demo.test");
    expect(await mail.textContent()).toMatch(/left a comment at [0-9.]+ k?Hz on N on the run/);
    await author.context.close();
  });

  it("review on the saved run: designer asks for sign-off, reviewer sends back (note required), then signs off", async () => {
    expect(savedRunUrl).not.toBe("");
    const designer = await signedIn(browser, "designer@demo.test");
    await designer.page.goto(savedRunUrl);
    const review = designer.page.getByRole("region", { name: "Review" });
    const designerTitle = designer.page.getByRole("heading", { level: 1 });
    await expect.poll(() => designerTitle.textContent()).toContain("Draft");
    await review.getByRole("button", { name: "Ask for sign-off" }).click();
    await expect.poll(() => designerTitle.textContent()).toContain("Awaiting sign-off");
    // The author cannot sign off their own run: no verdict buttons for the designer.
    expect(await review.getByRole("button", { name: "Sign off" }).count()).toBe(0);
    expect(await review.getByRole("button", { name: "Send back" }).count()).toBe(0);

    const reviewer = await signedIn(browser, "reviewer@demo.test");
    await reviewer.page.goto(savedRunUrl);
    const panel = reviewer.page.getByRole("region", { name: "Review" });
    await panel.getByRole("button", { name: "Send back" }).click();
    await expect
      .poll(() => panel.textContent())
      .toContain("Say what needs another look before sending the run back.");
    await panel
      .getByLabel(/Note \(required to send back\)/)
      .fill("Add the output buffer before the next revision.");
    await panel.getByRole("button", { name: "Send back" }).click();
    const title = reviewer.page.getByRole("heading", { level: 1 });
    await expect.poll(() => title.textContent()).toContain("Sent back");
    await expect.poll(() => panel.textContent()).toContain("Add the output buffer");
    expect(await title.locator("[data-review-state]").getAttribute("data-review-state")).toBe("sent_back");

    await designer.page.reload();
    await expect.poll(() => review.textContent()).toContain("Add the output buffer");
    await review.getByRole("button", { name: "Ask for sign-off" }).click();
    await expect.poll(() => designerTitle.textContent()).toContain("Awaiting sign-off");
    await reviewer.page.reload();
    await panel.getByRole("button", { name: "Sign off" }).click();
    await expect.poll(() => title.textContent()).toContain("Signed off");
    const history = await panel.getByRole("list", { name: "Review history" }).textContent();
    expect(history).toMatch(/asked for sign-off.*sent back.*asked for sign-off.*signed off/s);
    // None of the old words is left on the page.
    expect(await reviewer.page.locator("main").textContent()).not.toMatch(
      /Request review|Request changes|Approved|In review|Resolve\b|Reopen/,
    );
    await designer.context.close();
    await reviewer.context.close();
  }, 240_000);
});
