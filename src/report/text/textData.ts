/**
 * Text report sections about the data: Input, Sample moments, CAPM regressions on the market proxy.
 * Each returns its lines, heading first.
 */

import type { CapmHac, Uncertainty } from "../../core/inference/uncertaintyTypes.js";
import type { LineFit, Solution } from "../../core/types.js";
import { formatCount, formatNumber, statisticDigits } from "../format.js";
import { type Block, type Section, sectionLines } from "../blocks.js";
import { fields, printable, type Style } from "../layout.js";
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

/** What the file's numbers were (--input), in words. */
export const numbersText: Record<InputDescription["inputKind"], string> = {
  returns: "returns (simple, per period)",
  prices: "prices: each return is a price over the one before less 1 (the first row gives none)",
  "log-returns": "log returns, converted to simple returns",
};

/** The layout of the table and which table of the file was read. */
export function tableText(input: InputDescription): string {
  const layout = input.layout === "long" ? "long layout (an id and a value column)" : "wide layout (a column per series)";
  return `${layout}, table ${input.block} of the file`;
}

/**
 * The rows read that were not used, by cause (": 2 dropped, 1 first price (no return)"); for one file
 * in the wide layout, used + dropped + first prices = read. A long file has a row per series and date.
 */
export function rowsText(input: InputDescription): string {
  const parts = [
    ...(input.rowsDropped === 0 ? [] : [`${formatCount(input.rowsDropped)} dropped`]),
    ...(input.rowsConsumed === 0
      ? []
      : [`${formatCount(input.rowsConsumed)} first price${input.rowsConsumed === 1 ? "" : "s"} (no return)`]),
  ];
  const long = input.layout === "long" ? " (a row per series and date)" : "";
  return `${long}${parts.length === 0 ? "" : `: ${parts.join(", ")}`}`;
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
      ["Table read", tableText(input)],
      ["Numbers", numbersText[input.inputKind]],
      ["Units in file", units],
      ["Observations", `${formatCount(observations)} used of ${formatCount(input.rowsRead)} rows read${rowsText(input)}`],
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

/** "excess returns", or "returns" when no risk-free rate was given. */
export function returnsWord(riskFree: RiskFreeSource): string {
  return riskFree.kind === "none" ? "returns" : "excess returns";
}

/**
 * The Sample moments section: mean, stdev, variance and Sharpe ratio of each series per period, and
 * the mean (times the periods per year) and volatility (stdev times its square root) in % a year.
 */
export function moments(
  solution: Pick<Solution, "moments">,
  periodsPerYear: number | null = null,
  heading = "Sample moments (excess returns, per period)",
): Section {
  const m = solution.moments;
  const series = [
    ["low", m.low],
    ["high", m.high],
    ["market", m.market],
  ] as const;
  const year = periodsPerYear;
  return {
    id: "moments",
    heading,
    blocks: [
      {
        kind: "table",
        header: ["", "mean", "stdev", "variance", "Sharpe", ...(year === null ? [] : ["mean\n% a year", "volatility\n% a year"])],
        rows: series.map(([name, s]) => [
          name,
          formatNumber(s.mean),
          formatNumber(s.stdev),
          formatNumber(s.variance),
          formatNumber(s.sharpeRatio),
          ...(year === null
            ? []
            : [formatNumber(100 * year * s.mean, 3), formatNumber(s.stdev === null ? null : 100 * Math.sqrt(year) * s.stdev, 3)]),
        ]),
      },
      {
        kind: "fields",
        pairs: [
          ["covariance of low and high", formatNumber(m.covariance.lowHigh)],
          ["correlation of low and high", formatNumber(m.correlation.lowHigh)],
        ],
      },
    ],
  };
}

/** The text of the Sample moments section. */
export function momentsSection(
  solution: Pick<Solution, "moments">,
  style: Style,
  heading = "Sample moments (excess returns, per period)",
  periodsPerYear: number | null = null,
): string[] {
  return sectionLines(moments(solution, periodsPerYear, heading), style);
}

/** Why the two books' CAPM fits mirror each other (docs/methods.md §1: M is their weighted sum). */
export function mirrorNote(weight: number): string {
  const equal = weight === 0.5 ? ": at w = 0.5 the residual variances are equal and the alphas opposite" : "";
  return (
    "The two fits mirror each other because M is the books' weighted sum: w e_low + (1 - w) e_high = 0 at every date, " +
    `so w alpha_low + (1 - w) alpha_high = 0 and var(e_high) = (w / (1 - w))^2 var(e_low)${equal}.`
  );
}

/** The CAPM section: each book regressed on the market proxy, one column per book; HAC rows when computed. */
export function capm(solution: Solution, uncertainty: Uncertainty | null = null, periodsPerYear: number | null = null): Section {
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
  const yearRows: Row[] =
    periodsPerYear === null ? [] : [[`alpha, % a year (x ${periodsPerYear})`, (f) => formatNumber(100 * periodsPerYear * f.alpha, 3)]];
  const rows: Row[] = [
    ["alpha", (f) => formatNumber(f.alpha)],
    ...yearRows,
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
  const hacNote: Block[] =
    hac === undefined
      ? []
      : [
          {
            kind: "paragraph",
            text:
              `HAC: ${hac.kernel === "bartlett" ? `Bartlett kernel, ${hac.lags ?? "?"} lag(s)` : `quadratic spectral kernel, bandwidth ${formatNumber(hac.bandwidth, 3)}`}` +
              `${hac.prewhite ? ", prewhitened" : ""}${hac.adjust ? ", small-sample adjusted" : ""} (robust to autocorrelation and heteroskedasticity).`,
          },
        ];
  return {
    id: "capm",
    heading: "CAPM regressions on the market proxy",
    blocks: [
      {
        kind: "paragraph",
        text:
          `book = alpha + beta M + error, M = w low + (1 - w) high with w = ${solution.weight}; ` +
          `least squares, classical standard errors, two-sided p-values from Student's t with ${low.observations - 2} d.f.`,
      },
      ...hacNote,
      {
        kind: "table",
        header: ["", "low", "high"],
        rows: rows.map(([label, value]) => [
          label,
          value(low, uncertainty?.capm.low.hac ?? null),
          value(high, uncertainty?.capm.high.hac ?? null),
        ]),
      },
      { kind: "gap" },
      { kind: "paragraph", text: mirrorNote(solution.weight) },
    ],
  };
}

/** The text of the CAPM section. */
export function capmSection(
  solution: Solution,
  style: Style,
  uncertainty: Uncertainty | null = null,
  periodsPerYear: number | null = null,
): string[] {
  return sectionLines(capm(solution, uncertainty, periodsPerYear), style);
}
