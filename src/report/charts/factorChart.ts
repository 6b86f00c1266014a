/**
 * The k-portfolio chart (docs/methods.md §31): each portfolio's structural loading in the one-factor
 * model (y) against its CAPM beta on the same market proxy (x), both axes on one scale, with the
 * 45-degree line where the two are equal, a label per portfolio and, where the information matrix
 * gives one, the loading's interval (estimate +/- z standard errors) as a vertical bar. The CAPM beta
 * differs from the loading through each portfolio's own noise, which the proxy contains.
 *
 * Pure: the SVG is a function of the factor model alone (no ids, no clock, no random).
 */

import type { Mark, Spec } from "vega";
import type { FactorModel, FactorPortfolio } from "../../core/models/factorModel.js";
import { normalQuantile } from "../../core/numerics/normal.js";
import { formatNumber } from "../format.js";
import {
  cautionCaption,
  plotFrame,
  chartText,
  dash,
  decorative,
  enterMark,
  labelNumber,
  messageSpec,
  palette,
  renderSvg,
  specTitle,
  wrapToWidth,
} from "./common.js";
import { type LegendEntry, legendHeight, legendMarks } from "./legend.js";
import type { VegaLoader } from "./loadVega.js";

export const factorChartTitle = "Structural loadings against CAPM betas (one-factor model)";

/** The plot is square (both axes on one scale, so the line of equality runs at 45 degrees). */
export const factorPlotSize = 440;
const marginLeft = 80;
const marginRight = 40;
const captionWidth = marginLeft + factorPlotSize + marginRight - 24;
const labelFontSize = 11.5;

export interface FactorChartOptions {
  /** Two-sided level of the loadings' bars (the report's confidence); 0.95 when not given. */
  readonly confidence?: number;
}

/** One plotted portfolio: its CAPM beta (x), loading (y) and the ends of its bar (null without one). */
export interface FactorPoint {
  readonly name: string;
  readonly capmBeta: number;
  readonly loading: number;
  readonly lower: number | null;
  readonly upper: number | null;
  readonly description: string;
}

/** The portfolios with both a loading and a CAPM beta, with their bars at `confidence`. */
export function factorPoints(model: FactorModel, confidence = 0.95): FactorPoint[] {
  const z = normalQuantile(0.5 + confidence / 2);
  return model.portfolios.flatMap((p: FactorPortfolio) => {
    if (p.loading === null || p.capmBeta === null) return [];
    const half = p.loadingStdError === null ? null : z * p.loadingStdError;
    return [
      {
        name: chartText(p.name),
        capmBeta: p.capmBeta,
        loading: p.loading,
        lower: half === null ? null : p.loading - half,
        upper: half === null ? null : p.loading + half,
        description: `${chartText(p.name)}: loading ${labelNumber(p.loading)}, CAPM beta ${labelNumber(p.capmBeta)}`,
      },
    ];
  });
}

/** The common domain of both axes: every beta, loading and bar end, widened by 8% of the range each side. */
export function factorDomain(points: readonly FactorPoint[]): [number, number] {
  const values = points.flatMap((p) => [p.capmBeta, p.loading, ...(p.lower === null ? [] : [p.lower, p.upper!])]);
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  const pad = Math.max(hi - lo, 0.05 * Math.max(Math.abs(hi), 1e-3)) * 0.08;
  return [lo - pad, hi + pad];
}

/** Renders the chart as an SVG document (UTF-8 text, trailing newline). */
export async function renderFactorChart(model: FactorModel, options: FactorChartOptions = {}, loadVega?: VegaLoader): Promise<string> {
  const spec = factorChartSpec(model, options);
  return renderSvg(spec, specTitle(spec), loadVega);
}

/** The Vega spec of the chart; exported for tests. */
export function factorChartSpec(model: FactorModel, options: FactorChartOptions = {}): Spec {
  const confidence = options.confidence ?? 0.95;
  const points = factorPoints(model, confidence);
  if (points.length === 0) {
    const reason = model.diagnostics.find((d) => d.severity !== "info")?.message ?? "the model could not be fitted";
    return messageSpec(
      "No factor model to draw",
      [`No loadings to plot: ${chartText(reason)}.`, cautionCaption],
      "No factor model: no loadings were estimated.",
    );
  }
  const domain = factorDomain(points);
  const labelAt = diagonalLabelAt(points, domain);
  const level = String(Number((100 * confidence).toPrecision(6)));
  const withBars = points.some((p) => p.lower !== null);
  const subtitle = captionLines(model, level).flatMap((line) => wrapToWidth(line, captionWidth, 12));
  const legend: LegendEntry[] = [
    { swatch: { kind: "symbol", shape: "circle", fill: palette.blue, stroke: palette.ink }, label: "portfolio (its name beside it)" },
    ...(withBars ? [{ swatch: { kind: "interval", stroke: palette.blue } as const, label: `loading's ${level}% interval` }] : []),
    { swatch: { kind: "line", stroke: palette.grey, dash: dash.dashed }, label: "loading = CAPM beta (45 degrees)" },
  ];
  const legendTop = factorPlotSize + 50;
  const legendWidth = factorPlotSize + marginRight;
  const marks: Mark[] = [
    enterMark(
      "rule",
      "diagonal",
      {
        x: { scale: "x", value: domain[0] },
        y: { scale: "y", value: domain[0] },
        x2: { scale: "x", value: domain[1] },
        y2: { scale: "y", value: domain[1] },
        stroke: { value: palette.grey },
        strokeWidth: { value: 1.5 },
        strokeDash: { value: dash.dashed },
        description: { value: "The line where the loading equals the CAPM beta" },
      },
      {},
    ),
    enterMark(
      "text",
      "diagonal-label",
      {
        x: { scale: "x", value: labelAt },
        y: { scale: "y", value: labelAt },
        dy: { value: 15 },
        align: { value: "center" },
        angle: { value: -45 },
        text: { value: "loading = CAPM beta" },
        fontSize: { value: labelFontSize },
        fill: { value: palette.grey },
      },
      decorative,
    ),
    enterMark(
      "rule",
      "loading-intervals",
      {
        x: { scale: "x", field: "capmBeta" },
        y: { scale: "y", field: "lower" },
        y2: { scale: "y", field: "upper" },
        stroke: { value: palette.blue },
        strokeWidth: { value: 2 },
        strokeCap: { value: "butt" },
      },
      { ...decorative, from: { data: "intervals" } },
    ),
    enterMark(
      "symbol",
      "portfolios",
      {
        x: { scale: "x", field: "capmBeta" },
        y: { scale: "y", field: "loading" },
        shape: { value: "circle" },
        size: { value: 64 },
        fill: { value: palette.blue },
        stroke: { value: palette.ink },
        strokeWidth: { value: 1 },
        description: { field: "description" },
      },
      { from: { data: "points" } },
    ),
    enterMark(
      "text",
      "portfolio-labels",
      {
        x: { scale: "x", field: "capmBeta" },
        y: { scale: "y", field: "loading" },
        dx: { value: -9 },
        dy: { value: -5 },
        align: { value: "right" },
        baseline: { value: "bottom" },
        text: { field: "name" },
        fontSize: { value: labelFontSize },
        fontWeight: { value: "bold" },
        fill: { value: palette.ink },
      },
      { ...decorative, from: { data: "points" } },
    ),
    ...legendMarks(legend, 0, legendTop, legendWidth),
  ];
  return {
    description: chartDescription(model, points),
    ...plotFrame({
      width: factorPlotSize,
      height: factorPlotSize,
      marginLeft,
      marginRight,
      title: factorChartTitle,
      subtitle,
      titleGap: 16,
      legendHeight: legendHeight(legend, legendWidth),
    }),
    data: [
      { name: "points", values: points.map((p) => ({ ...p })) },
      { name: "intervals", values: points.filter((p) => p.lower !== null).map((p) => ({ ...p })) },
    ],
    scales: [
      { name: "x", type: "linear", domain: [...domain], range: "width", nice: false, zero: false },
      { name: "y", type: "linear", domain: [...domain], range: "height", nice: false, zero: false },
    ],
    axes: [
      { orient: "bottom", scale: "x", title: "CAPM beta on the market proxy", tickCount: 6, grid: true, titlePadding: 6 },
      { orient: "left", scale: "y", title: "structural loading (one-factor model)", tickCount: 6, grid: true, titlePadding: 10 },
    ],
    marks,
  };
}

/** Where along the diagonal its label goes: the middle of the widest gap between the points' CAPM betas. */
export function diagonalLabelAt(points: readonly FactorPoint[], domain: readonly [number, number]): number {
  const xs = [domain[0], ...points.map((p) => p.capmBeta).sort((a, b) => a - b), domain[1]];
  let best = 0;
  for (let i = 1; i + 1 < xs.length; i++) if (xs[i + 1]! - xs[i]! > xs[best + 1]! - xs[best]!) best = i;
  return (xs[best]! + xs[best + 1]!) / 2;
}

function captionLines(model: FactorModel, level: string): string[] {
  const fit = model.fit;
  const fitText =
    fit === null
      ? "No fit statistic."
      : fit.pValue === null
        ? `One factor fits ${model.portfolios.length} portfolios exactly (no degrees of freedom left).`
        : `Fit of one factor: chi-square ${formatNumber(fit.statistic)} on ${fit.degreesOfFreedom} df, p = ${formatNumber(fit.pValue)}.`;
  const heywood =
    model.heywood.length === 0 ? "" : ` Noise variance at 0 (Heywood case, no interval): ${model.heywood.map(chartText).join(", ")}.`;
  return [
    `Each point is a portfolio: its loading in the one-factor model fitted by maximum likelihood to ${model.portfolios.length} ` +
      `portfolios (${model.observations} rows) against its CAPM beta on the market proxy (their weighted sum); both are scaled ` +
      `so that the proxy has beta 1. On the dashed line the two are equal; the CAPM beta departs from it through the portfolio's ` +
      `own noise, which the proxy contains. Bars: the loading's ${level}% interval from its standard error.`,
    fitText + heywood,
    cautionCaption,
  ];
}

function chartDescription(model: FactorModel, points: readonly FactorPoint[]): string {
  return (
    `Chart of the one-factor model's structural loadings against the CAPM betas of ${model.portfolios.length} portfolios, ` +
    `with the line where they are equal: ${points.map((p) => p.description).join("; ")}.`
  );
}
