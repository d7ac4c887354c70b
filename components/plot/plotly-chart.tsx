"use client";

import Plotly from "plotly.js-dist-min";
import { useMemo } from "react";
import type { PlotParams } from "react-plotly.js";
import createPlotlyComponent from "react-plotly.js/factory";
import { plotFonts, plotHoverLabel } from "./palette";

/** react-plotly bound to the small Plotly bundle. Loaded only through next/dynamic (no SSR). */
const Plot = createPlotlyComponent(Plotly);

export type PlotlyChartProps = PlotParams;

export default function PlotlyChart(props: PlotlyChartProps) {
  // Memoised on what the chart passes: the wrapper redraws only when the figure's own objects change,
  // not on every render of the page around it.
  const given = props.config;
  const config = useMemo<PlotParams["config"]>(
    // Never the library's icon bar (our own controls sit beside each plot) and no "Share chart…"
    // button: it would offer to upload a team's data to an outside service.
    () => Object.assign({}, given, { displayModeBar: false, displaylogo: false, showSendToCloud: false }),
    [given],
  );
  const chartLayout = props.layout;
  // Our hover card and type unless a chart sets its own.
  const layout = useMemo(() => {
    const own = (chartLayout ?? {}) as { font?: object };
    return {
      hoverlabel: plotHoverLabel,
      ...own,
      font: { family: plotFonts.sans, ...own.font },
    } as PlotParams["layout"];
  }, [chartLayout]);
  return <Plot {...props} layout={layout} config={config} />;
}
