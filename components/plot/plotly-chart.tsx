"use client";

import Plotly from "plotly.js-dist-min";
import type { PlotParams } from "react-plotly.js";
import createPlotlyComponent from "react-plotly.js/factory";
import { plotFonts, plotHoverLabel } from "./palette";

/** react-plotly bound to the small Plotly bundle. Loaded only through next/dynamic (no SSR). */
const Plot = createPlotlyComponent(Plotly);

export type PlotlyChartProps = PlotParams;

export default function PlotlyChart(props: PlotlyChartProps) {
  // New config and layout objects on every render, on purpose: react-plotly re-binds its event handlers
  // (onClick…) only when it redraws, and it redraws only when these change by identity. Memoising them
  // left a stale click handler (a cursor click landed as a comment pin). Keep the figure stable upstream.
  // Never the library's icon bar (our own controls sit beside each plot) and no "Share chart…"
  // button: it would offer to upload a team's data to an outside service.
  const config: PlotParams["config"] = Object.assign({}, props.config, {
    displayModeBar: false,
    displaylogo: false,
    showSendToCloud: false,
  });
  // Our hover card and type unless a chart sets its own.
  const given: { font?: object } = (props.layout ?? {}) as { font?: object };
  const layout = {
    hoverlabel: plotHoverLabel,
    ...given,
    font: { family: plotFonts.sans, ...given.font },
  } as PlotParams["layout"];
  return <Plot {...props} layout={layout} config={config} />;
}
