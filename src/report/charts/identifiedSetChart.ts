/**
 * The identified-set chart: the low structural beta b_low on the x axis against what each value of it
 * implies, either both noise variances (y "variance") or the low book's noise share
 * s_low / (s_low + s_high) (y "share"). The admissible range [min, max] is shaded; beyond it the
 * curves go on dotted, into the region where a noise variance would be negative. The landmarks sit in
 * a lane above the plot, each with a symbol, a guide line down through the curves and a label in
 * plain words; the CAPM-consistent point is drawn larger and its label in bold. Optional interval
 * bars show sampling uncertainty of b_low and of the two bounds; with assumed noise correlations a strip
 * under the x axis shows the set under each.
 *
 * Pure: the SVG is a function of the report and the options alone (no ids, no clock, no random).
 *
 * This file assembles the Vega spec; the pieces are in ./identifiedSet/: the option types
 * (options.ts), the pixel sizes (dimensions.ts), the curves and domains (curves.ts), the landmark
 * lane (lane.ts, laneLabels.ts), the marks (plotMarks.ts, laneMarks.ts) and the words (captions.ts).
 */

import type { Mark, Spec } from "vega";
import type { SolveReport } from "../types.js";
import { chartConfig, chartText, messageSpec, renderSvg, specTitle, wrapToWidth } from "./common.js";
import { captionLines, chartDescription, legendEntries } from "./identifiedSet/captions.js";
import { chartCurves, curveLabels, curvePieces, gridMarkerValues, shareSeries, varianceSeries, xDomain } from "./identifiedSet/curves.js";
import { captionWidth, marginLeft, marginRight, plotHeight, plotWidth, titleBlockHeight } from "./identifiedSet/dimensions.js";
import { laneLayout } from "./identifiedSet/lane.js";
import { guideMark, intervalMarks, labelBackdropMark, landmarkLabelMark, landmarkSymbolMark } from "./identifiedSet/laneMarks.js";
import type { IdentifiedSetChartOptions } from "./identifiedSet/options.js";
import {
  sensitivityData,
  sensitivityExtent,
  sensitivityHeight,
  sensitivityMarks,
  sensitivityRows,
} from "./identifiedSet/sensitivityStrip.js";
import {
  curveLabelMark,
  curveMark,
  gridMarkersMark,
  negativeRegionMarks,
  setLabelMark,
  setRangeMark,
  zeroRuleMark,
} from "./identifiedSet/plotMarks.js";
import { legendHeight, legendMarks } from "./legend.js";
import type { VegaLoader } from "./loadVega.js";

export { insidePoints } from "./identifiedSet/curves.js";
export { plotHeight, plotWidth } from "./identifiedSet/dimensions.js";
export { landmarkLabels, outsideLabel } from "./identifiedSet/lane.js";
export type { BetaInterval, IdentifiedSetChartOptions, IdentifiedSetUncertainty } from "./identifiedSet/options.js";

export const chartTitle = "Which structural betas fit the data? The identified set of the low book's beta";

/** Renders the chart as an SVG document (UTF-8 text, trailing newline). */
export async function renderIdentifiedSetChart(
  report: SolveReport,
  options: IdentifiedSetChartOptions,
  loadVega?: VegaLoader,
): Promise<string> {
  const spec = identifiedSetSpec(report, options);
  return renderSvg(spec, specTitle(spec), loadVega);
}

/** The Vega spec of the chart; exported for tests and for embedding elsewhere. */
export function identifiedSetSpec(report: SolveReport, options: IdentifiedSetChartOptions): Spec {
  const s = report.solution;
  if (s.bounds === null || s.landmarks === null) {
    const reason = s.diagnostics.find((d) => d.severity === "error")?.message ?? "the model is rejected";
    return messageSpec(
      "No identified set to draw",
      [`No one-factor structure fits these data: ${chartText(reason)}.`, ...captionLines(report)],
      "No identified set: the one-factor model is rejected for these data.",
    );
  }
  const { min, max } = s.bounds.lowBeta;
  const landmarks = s.landmarks;
  const uncertainty = options.uncertainty ?? {};
  const series = options.y === "variance" ? varianceSeries : shareSeries;

  // The sets under correlated noise (--noise-correlation), in a strip under the x axis.
  const stripTop = plotHeight + 54;
  const domain = xDomain(min, max, s.weight, landmarks, uncertainty, sensitivityExtent(report.sensitivity));
  const px = (b: number): number => ((b - domain[0]) / (domain[1] - domain[0])) * plotWidth;
  const rows = sensitivityRows(report.sensitivity, stripTop, px, plotWidth + marginRight - 4);
  const { curves, yDomain } = chartCurves(s, s.bounds, landmarks, domain, series, options.y);
  const setMiddle = (px(min) + px(max)) / 2;
  const negativeShown = yDomain[0] < 0 && options.y === "variance";

  const lane = laneLayout(landmarks, uncertainty, px);
  const legend = legendEntries(series, min, max, uncertainty, lane.anyOutside);
  const legendTop = stripTop + sensitivityHeight(rows);
  const legendWidth = plotWidth + marginRight - 8;
  const subtitle = captionLines(report, options.y).flatMap((line) => wrapToWidth(line, captionWidth, 12));
  const padding = {
    left: marginLeft,
    right: marginRight,
    top: 12 + titleBlockHeight(subtitle.length) + lane.height,
    bottom: 54 + sensitivityHeight(rows) + legendHeight(legend, legendWidth) + 14,
  };

  const marks: Mark[] = [
    setRangeMark(px(min), px(max), min, max),
    ...(negativeShown ? negativeRegionMarks(setMiddle) : []),
    ...(yDomain[0] < 0 ? [zeroRuleMark(options.y)] : []),
    guideMark(negativeShown),
    ...curves.flatMap(curvePieces).map(curveMark),
    gridMarkersMark(series, s.grid),
    curveLabelMark(),
    setLabelMark(setMiddle),
    ...intervalMarks(lane),
    labelBackdropMark(),
    landmarkSymbolMark(),
    landmarkLabelMark(),
    ...sensitivityMarks(rows, stripTop),
    ...legendMarks(legend, 0, legendTop, legendWidth),
  ];

  return {
    description: chartDescription(report, options.y),
    width: plotWidth,
    height: plotHeight,
    padding,
    // Sizes are computed here rather than by Vega, whose text widths (without a canvas) are rough.
    autosize: { type: "none" },
    config: chartConfig(),
    title: { text: chartTitle, subtitle, frame: "group", dx: 12 - marginLeft },
    data: [
      { name: "landmarks", values: copies(lane.landmarks) },
      { name: "intervals", values: copies(lane.intervals) },
      { name: "interval-labels", values: copies(lane.intervalLabels) },
      ...curves.flatMap(curvePieces).map((piece) => ({ name: `data-${piece.key}`, values: copies(piece.points) })),
      { name: "curve-labels", values: curveLabels(curves) },
      { name: "grid-markers", values: gridMarkerValues(series, s.grid) },
      ...sensitivityData(rows),
    ],
    scales: [
      { name: "x", type: "linear", domain: [...domain], range: "width", nice: false, zero: false },
      {
        name: "y",
        type: "linear",
        domain: yDomain,
        range: "height",
        nice: options.y === "variance",
        zero: options.y === "variance",
      },
    ],
    axes: [
      {
        orient: "bottom",
        scale: "x",
        title: "low structural beta (b_low)",
        tickCount: 8,
        grid: false,
        labelFlush: false,
        titlePadding: 6,
      },
      {
        orient: "left",
        scale: "y",
        title: options.y === "variance" ? "noise variance per period (decimal units)" : "noise share s_low / (s_low + s_high)",
        tickCount: 6,
        grid: true,
        titlePadding: 10,
      },
    ],
    marks,
  };
}

/** Shallow copies of the items for Vega's data values (Vega tags the objects it ingests). */
function copies(items: readonly object[]): object[] {
  return items.map((item) => ({ ...item }));
}
