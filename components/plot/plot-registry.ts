/**
 * Rendered plots by id, so a button elsewhere on the page (e.g. ExportButtons) can export one as PNG.
 * Plotly itself is imported only when an export is asked for.
 */
const plots = new Map<string, HTMLElement>();

export function registerPlot(id: string, graphDiv: HTMLElement): void {
  plots.set(id, graphDiv);
}

export function unregisterPlot(id: string, graphDiv?: HTMLElement): void {
  if (!graphDiv || plots.get(id) === graphDiv) plots.delete(id);
}

export function hasPlot(id: string): boolean {
  return plots.has(id);
}

/** Downloads the plot with this id as a PNG; false when no such plot is on the page. */
export async function downloadPlotPng(id: string, filename: string): Promise<boolean> {
  const graphDiv = plots.get(id);
  if (!graphDiv) return false;
  const Plotly = (await import("plotly.js-dist-min")).default;
  await Plotly.downloadImage(graphDiv, { format: "png", filename, width: 1400, height: 900 });
  return true;
}
