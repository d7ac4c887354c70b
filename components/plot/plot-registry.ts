import { plotColors, plotFonts } from "./palette";

/**
 * Rendered plots by id, so a button elsewhere on the page (e.g. ExportButtons) can export one as PNG.
 * Plotly itself is imported only when an export or a reset is asked for. A plot still drawn as static
 * SVG registers a waker: an export wakes it (loads the interactive chart) and waits for it.
 */

/** What the exported PNG carries above the plot: a title, and the netlist hash when there is one. */
export interface PlotStamp {
  title: string;
  netlistHash?: string | null;
}

type Entry = { graphDiv: HTMLElement; stamp: PlotStamp | null };
const plots = new Map<string, Entry>();
const wakers = new Map<string, () => void>();
const waiting = new Map<string, (() => void)[]>();
/** How long an export waits for a static plot to become interactive. */
const WAKE_TIMEOUT_MS = 30_000;

export function registerPlot(id: string, graphDiv: HTMLElement, stamp: PlotStamp | null = null): void {
  plots.set(id, { graphDiv, stamp });
  const list = waiting.get(id) ?? [];
  waiting.delete(id);
  for (const done of list) done();
}

/** A static plot's way to load its interactive chart on demand; returns the unregister function. */
export function registerPlotWaker(id: string, wake: () => void): () => void {
  wakers.set(id, wake);
  return () => {
    if (wakers.get(id) === wake) wakers.delete(id);
  };
}

/** The plot's entry, waking a static plot and waiting for its interactive chart when needed. */
async function interactive(id: string): Promise<Entry | undefined> {
  const entry = plots.get(id);
  if (entry) return entry;
  const wake = wakers.get(id);
  if (!wake) return undefined;
  return new Promise((resolve) => {
    const timer = setTimeout(() => resolve(plots.get(id)), WAKE_TIMEOUT_MS);
    waiting.set(id, [
      ...(waiting.get(id) ?? []),
      () => {
        clearTimeout(timer);
        resolve(plots.get(id));
      },
    ]);
    wake();
  });
}

export function unregisterPlot(id: string, graphDiv?: HTMLElement): void {
  if (!graphDiv || plots.get(id)?.graphDiv === graphDiv) plots.delete(id);
}

/** Back to the full sweep on every axis (what a double click does too); a static plot already shows it. */
export async function resetPlotView(id: string): Promise<boolean> {
  const entry = plots.get(id);
  if (!entry) return wakers.has(id);
  const Plotly = (await import("plotly.js-dist-min")).default;
  const update: Record<string, boolean> = {
    "xaxis.autorange": true,
    "xaxis2.autorange": true,
    "yaxis.autorange": true,
    "yaxis2.autorange": true,
  };
  await Plotly.relayout(entry.graphDiv, update as unknown as Parameters<typeof Plotly.relayout>[1]);
  return true;
}

const EXPORT = { width: 1400, height: 900, header: 84, pad: 32 };

/** "2026-12-02 20:31 UTC": the moment of the export, the same in every locale. */
function stampDate(now: Date): string {
  return `${now.toISOString().slice(0, 16).replace("T", " ")} UTC`;
}

/** The plot's PNG under a header with the title, the export date and the netlist hash. */
async function stampedPng(plotPng: string, stamp: PlotStamp): Promise<string> {
  const canvas = document.createElement("canvas");
  canvas.width = EXPORT.width;
  canvas.height = EXPORT.height + EXPORT.header;
  const ctx = canvas.getContext("2d");
  if (!ctx) return plotPng;
  await document.fonts?.ready;
  ctx.fillStyle = plotColors.plotBg;
  ctx.fillRect(0, 0, canvas.width, canvas.height);
  ctx.fillStyle = plotColors.hoverEdge;
  ctx.fillRect(EXPORT.pad, EXPORT.header - 10, canvas.width - 2 * EXPORT.pad, 2);
  ctx.fillStyle = plotColors.text;
  ctx.font = `600 26px ${plotFonts.sans}`;
  ctx.fillText(stamp.title, EXPORT.pad, 38, canvas.width - 2 * EXPORT.pad);
  ctx.fillStyle = plotColors.muted;
  ctx.font = `15px ${plotFonts.mono}`;
  const hash = stamp.netlistHash ? `   netlist sha256 ${stamp.netlistHash}` : "";
  ctx.fillText(`${stampDate(new Date())}${hash}`, EXPORT.pad, 62, canvas.width - 2 * EXPORT.pad);
  const image = new Image();
  await new Promise<void>((resolve, reject) => {
    image.onload = () => resolve();
    image.onerror = () => reject(new Error("The plot image did not load."));
    image.src = plotPng;
  });
  ctx.drawImage(image, 0, EXPORT.header);
  return canvas.toDataURL("image/png");
}

/** Downloads the plot with this id as a PNG (with its stamp); false when no such plot is on the page. */
export async function downloadPlotPng(id: string, filename: string): Promise<boolean> {
  const entry = await interactive(id);
  if (!entry) return false;
  const Plotly = (await import("plotly.js-dist-min")).default;
  const plotPng = await Plotly.toImage(entry.graphDiv, {
    format: "png",
    width: EXPORT.width,
    height: EXPORT.height,
  });
  const url = entry.stamp ? await stampedPng(plotPng, entry.stamp) : plotPng;
  const link = document.createElement("a");
  link.href = url;
  link.download = `${filename.replace(/[\\/:*?"<>|]+/g, "-")}.png`;
  document.body.appendChild(link);
  link.click();
  link.remove();
  return true;
}
