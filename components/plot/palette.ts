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
