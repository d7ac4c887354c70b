import config from "@/tailwind.config";

const c = config.theme.extend.colors;

/** Plot colours, taken from the app's palette (tailwind.config.ts) so charts match the screens. */
export const plotColors = {
  text: c.ink[700],
  muted: c.ink[500],
  grid: c.paper[200],
  axis: c.paper[400],
  plotBg: "#ffffff",
  marker: c.copper[500],
  pin: c.copper[600],
  focus: c.copper[300],
  difference: c.signal.fault,
  /** Difference traces in turn, when several traces are compared. */
  differences: [c.signal.fault, c.ink[500], c.signal.warn, c.copper[700]],
  measurement: c.ink[900],
  /** Check limits drawn on histograms. */
  limit: c.signal.fault,
  /** The two readout cursors: copper and deep board green, never the trace colours' first pair. */
  cursorA: c.copper[600],
  cursorB: c.board[800],
  /** Hover labels: graphite card, paper text, a copper edge. */
  hoverBg: c.ink[900],
  hoverText: c.paper[50],
  hoverEdge: c.copper[400],
};

/** Hover labels of every chart: a graphite card with monospaced figures and a copper edge. */
export const plotHoverLabel = {
  bgcolor: c.ink[900],
  bordercolor: c.copper[400],
  font: { family: '"JetBrains Mono", ui-monospace, SFMono-Regular, monospace', size: 12, color: c.paper[50] },
  align: "left" as const,
};

/** Type of the plots: the app's own faces (served locally through @fontsource). */
export const plotFonts = {
  sans: '"Inter Variable", Inter, ui-sans-serif, system-ui, sans-serif',
  mono: '"JetBrains Mono", ui-monospace, SFMono-Regular, monospace',
};

/** Colours for traces in order: board green, copper, graphite, then lighter tints. */
export const traceColors = [
  c.board[600],
  c.copper[500],
  c.ink[700],
  c.board[400],
  c.copper[300],
  c.signal.warn,
  c.ink[400],
  c.board[800],
];

export function traceColor(index: number): string {
  return traceColors[index % traceColors.length]!;
}

/**
 * The frame of a chart against a log frequency axis (noise density, group delay): our margins, type,
 * grid and hover label; the caller names the y axis and adds its own traces and extras.
 */
export function frequencyChartLayout(y: { title: string; log?: boolean; rightMargin?: number }) {
  return {
    margin: { l: 72, r: y.rightMargin ?? 16, t: 32, b: 48 },
    paper_bgcolor: "rgba(0,0,0,0)",
    plot_bgcolor: plotColors.plotBg,
    font: { family: plotFonts.sans, size: 11, color: plotColors.muted },
    hoverlabel: plotHoverLabel,
    xaxis: {
      title: { text: "frequency (Hz)" },
      type: "log" as const,
      gridcolor: plotColors.grid,
      exponentformat: "SI" as const,
    },
    yaxis: {
      title: { text: y.title },
      ...(y.log ? { type: "log" as const } : { zerolinecolor: plotColors.axis }),
      gridcolor: plotColors.grid,
      exponentformat: "SI" as const,
    },
    // Above the plot: below it, the legend ran into the frequency axis title.
    legend: { orientation: "h" as const, x: 0, y: 1, yanchor: "bottom" as const },
  };
}

/** No library icon bar on any chart (PlotlyChart enforces it too); charts follow their container. */
export const PLOT_CONFIG = { displaylogo: false, displayModeBar: false, responsive: true } as const;
