/**
 * Text report sections about the data: Input, Sample moments, CAPM regressions on the market proxy.
 * Each returns its lines, heading first.
 */

import type { CapmHac, Uncertainty } from "../../core/inference/uncertaintyTypes.js";
import type { LineFit, Solution } from "../../core/types.js";
import { formatCount, formatNumber, statisticDigits } from "../format.js";
import { fields, indent, printable, table, type Style } from "../layout.js";
import type { InputDescription, RiskFreeSource } from "../types.js";

/** How many dropped dates the Input section lists before "and N more". */
export const droppedDatesShown = 5;

export function riskFreeText(riskFree: RiskFreeSource): string {
  switch (riskFree.kind) {
    case "none":
      return "none given: raw returns are analysed";
    case "constant":
      return `constant, ${riskFree.rate} per period (decimal)`;
    case "column":
      return `column "${printable(riskFree.column)}"`;
  }
}

function droppedText(input: InputDescription): string {
  if (input.rowsDropped === 0) return "none";
  const shown = input.droppedDates.slice(0, droppedDatesShown).map(printable);
  const more = input.rowsDropped - shown.length;
  const list = shown.length > 0 ? `; first: ${shown.join(", ")}${more > 0 ? `, and ${more} more` : ""}` : "";
  return `${input.rowsDropped} with a missing value${list}`;
}

/** The Input section: where the numbers came from. */
export function inputSection(input: InputDescription, observations: number, style: Style): string[] {
  const frequency =
    input.frequency === null
      ? "could not be told from the dates"
      : `${printable(input.frequency.name)} (${input.frequency.periodsPerYear} periods per year)`;
  const units = input.units === "percent" ? "percent (divided by 100: every figure below is decimal)" : "decimal";
  return [
    style.heading("Input"),
    ...fields([
      ["File", printable(input.source)],
      ["Low book", `column "${printable(input.lowColumn)}"`],
      ["High book", `column "${printable(input.highColumn)}"`],
      ["Dates", `column "${printable(input.dateColumn)}", ${printable(input.firstDate)} to ${printable(input.lastDate)}`],
      ["Risk-free", riskFreeText(input.riskFree)],
      ["Units in file", units],
      ["Observations", `${formatCount(observations)} used of ${formatCount(input.rowsRead)} rows read`],
      ["Frequency", frequency],
      ["Dropped rows", droppedText(input)],
      ...joinFields(input),
    ]),
  ];
}

function joinFields(input: InputDescription): [string, string][] {
  if (input.join === null) return [];
  const sides = input.join.sides.map(
    (side) =>
      `${printable(side.source)} ("${printable(side.column)}") ${formatCount(side.dates)} dates, ${formatCount(side.unmatched)} unmatched`,
  );
  return [["Joined on date", `${formatCount(input.join.matched)} dates in both files: ${sides.join("; ")}`]];
}

/** The Sample moments section: mean, stdev, variance and Sharpe ratio of each series. */
export function momentsSection(
  solution: Pick<Solution, "moments">,
  style: Style,
  heading = "Sample moments (excess returns, per period)",
): string[] {
  const m = solution.moments;
  const series = [
    ["low", m.low],
    ["high", m.high],
    ["market", m.market],
  ] as const;
  return [
    style.heading(heading),
    ...table({
      header: ["", "mean", "stdev", "variance", "Sharpe"],
      rows: series.map(([name, s]) => [
        name,
        formatNumber(s.mean),
        formatNumber(s.stdev),
        formatNumber(s.variance),
        formatNumber(s.sharpeRatio),
      ]),
    }),
    ...fields([
      ["covariance of low and high", formatNumber(m.covariance.lowHigh)],
      ["correlation of low and high", formatNumber(m.correlation.lowHigh)],
    ]),
  ];
}

/** The CAPM section: each book regressed on the market proxy, one column per book; HAC rows when computed. */
export function capmSection(solution: Solution, style: Style, uncertainty: Uncertainty | null = null): string[] {
  const { low, high } = solution.capm;
  const stat = (x: number | null): string => formatNumber(x, statisticDigits);
  type Row = [string, (f: LineFit, hac: CapmHac | null) => string];
  const hacRows: Row[] =
    uncertainty === null
      ? []
      : [
          ["alpha HAC std. error", (_, h) => formatNumber(h?.alphaStdErr ?? null)],
          ["alpha HAC t", (f, h) => stat(h === null || h.alphaStdErr === 0 ? null : f.alpha / h.alphaStdErr)],
        ];
  const betaHacRows: Row[] =
    uncertainty === null
      ? []
      : [
          ["beta HAC std. error", (_, h) => formatNumber(h?.betaStdErr ?? null)],
          ["beta HAC t", (f, h) => stat(h === null || h.betaStdErr === 0 ? null : f.beta / h.betaStdErr)],
        ];
  const rows: Row[] = [
    ["alpha", (f) => formatNumber(f.alpha)],
    ["alpha std. error", (f) => formatNumber(f.alphaStdErr)],
    ["alpha t", (f) => stat(f.alphaTStat)],
    ["alpha p-value", (f) => stat(f.alphaPValue)],
    ...hacRows,
    ["beta", (f) => formatNumber(f.beta)],
    ["beta std. error", (f) => formatNumber(f.betaStdErr)],
    ["beta t (beta = 0)", (f) => stat(f.betaTStat)],
    ["beta p-value", (f) => stat(f.betaPValue)],
    ...betaHacRows,
    ["R-squared", (f) => formatNumber(f.rSquared)],
    ["residual variance", (f) => formatNumber(f.residualVariance)],
  ];
  const hac = uncertainty?.capm.hac;
  const hacNote =
    hac === undefined
      ? []
      : [
          `${indent}HAC: ${hac.kernel === "bartlett" ? `Bartlett kernel, ${hac.lags ?? "?"} lag(s)` : `quadratic spectral kernel, bandwidth ${formatNumber(hac.bandwidth, 3)}`}` +
            `${hac.prewhite ? ", prewhitened" : ""}${hac.adjust ? ", small-sample adjusted" : ""} (robust to autocorrelation and heteroskedasticity).`,
        ];
  return [
    style.heading("CAPM regressions on the market proxy"),
    `${indent}book = alpha + beta M + error, M = w low + (1 - w) high with w = ${solution.weight};`,
    `${indent}least squares, classical standard errors, two-sided p-values from Student's t ` + `with ${low.observations - 2} d.f.`,
    ...hacNote,
    ...table({
      header: ["", "low", "high"],
      rows: rows.map(([label, value]) => [
        label,
        value(low, uncertainty?.capm.low.hac ?? null),
        value(high, uncertainty?.capm.high.hac ?? null),
      ]),
    }),
  ];
}
