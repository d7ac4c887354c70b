// The editor page's first preview comes with the page (solved on the server while it renders): no
// POST /api/solve at load. An edit is then asked sweep first, and a netlist with a Monte Carlo line
// gets its samples from a second request while the plot is already drawn from the first.
import type { Browser, Request } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launch, openProject, signedIn } from "./browser";

let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});

afterAll(async () => {
  await browser?.close();
});

// Runs in the page (serialized by playwright): the page's one Monaco editor.
type Edit = { getValue(): string; setValue(text: string): void };
type MonacoWindow = { pwMonaco?: { editor: { getEditors(): Edit[] } } };

describe("editor: the first preview is in the page", () => {
  it("shows the first netlist's result without asking for it, then solves edits sweep first", async () => {
    const { context, page } = await signedIn(browser, "designer@demo.test");
    const projectId = await openProject(page, "Anti-alias filter board");
    const solves: { stage: string; at: number }[] = [];
    page.on("request", (r: Request) => {
      if (new URL(r.url()).pathname === "/api/solve") {
        solves.push({
          stage: (JSON.parse(r.postData() ?? "{}") as { stage?: string }).stage ?? "",
          at: Date.now(),
        });
      }
    });
    // The HTML itself holds the solved status line (server-rendered from the seeded query cache).
    const html = await (await context.request.get(`/projects/${projectId}/new`)).text();
    expect(html).toMatch(/data-testid="preview-status"[^>]*>(?:<[^>]+>)*Solved [\d,]+ points/);

    await page.goto(`/projects/${projectId}/new`);
    await expect
      .poll(() => page.getByTestId("preview-status").textContent(), { timeout: 30_000 })
      .toMatch(/^Solved [\d,]+ points/);
    await page.locator(".monaco-editor").first().waitFor({ timeout: 60_000 });
    await page.waitForLoadState("networkidle");
    await page.waitForTimeout(1000); // past the debounce: a request for the first text would be out by now
    expect(solves).toEqual([]);

    // An edit with a Monte Carlo line: the sweep answer first (plot, measures), then the samples.
    await page.waitForFunction(() => !!(window as unknown as MonacoWindow).pwMonaco?.editor.getEditors()[0]);
    const text = await page.evaluate(() =>
      (window as unknown as MonacoWindow).pwMonaco!.editor.getEditors()[0]!.getValue(),
    );
    const withSamples = `${text.replace(/^(R1:[^\n#]*?)\s*$/m, "$1 tol=1%").trimEnd()}\nmonte-carlo 150 seed=3\n`;
    expect(withSamples).toContain("tol=1%");
    await page.evaluate(
      (t) => (window as unknown as MonacoWindow).pwMonaco!.editor.getEditors()[0]!.setValue(t),
      withSamples,
    );
    await expect.poll(() => solves.length, { timeout: 60_000 }).toBe(2);
    await expect
      .poll(() => page.getByTestId("preview-status").textContent(), { timeout: 60_000 })
      .toMatch(/^Solved [\d,]+ points[^;]*\.$/);
    expect(solves.map((s) => s.stage)).toEqual(["sweep", "all"]);
    // The samples' section of the studies, from the whole answer.
    await page.getByTestId("preview-analyses").getByText("150 samples · seed 3").waitFor({ timeout: 30_000 });
    expect(await page.getByTestId("preview-analyses").getAttribute("data-stale")).toBeNull();
    await context.close();
  }, 180_000);
});
