"use client";

import Plotly from "plotly.js-dist-min";
import type { PlotParams } from "react-plotly.js";
import createPlotlyComponent from "react-plotly.js/factory";

/** react-plotly bound to the small Plotly bundle. Loaded only through next/dynamic (no SSR). */
const Plot = createPlotlyComponent(Plotly);

export type PlotlyChartProps = PlotParams;

export default function PlotlyChart(props: PlotlyChartProps) {
  // No "Share chart…" button: it would offer to upload a team's data to an outside service.
  const config: PlotParams["config"] = Object.assign({}, props.config, { showSendToCloud: false });
  return <Plot {...props} config={config} />;
}
