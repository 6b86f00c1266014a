/**
 * The identified-set chart's words: the caption under the title, the description for screen
 * readers, the legend entries and the interval labels.
 */

import { assumptionsLine, cautionCaption, chartText, dash, labelNumber, palette } from "../common.js";
import type { SolveReport } from "../../types.js";
import type { LegendEntry } from "../legend.js";
import type { Series } from "./curves.js";
import type { BetaInterval, IdentifiedSetUncertainty, YQuantity } from "./options.js";

/** The caption under the title: the data, what the picture shows, the assumptions, the caution. */
export function captionLines(report: SolveReport, y?: YQuantity): string[] {
  const input = report.input;
  const frequency = input.frequency === null ? "" : ` ${chartText(input.frequency.name)}`;
  const data =
    `Data: ${chartText(input.source)}, low book "${chartText(input.lowColumn)}", high book "${chartText(input.highColumn)}"; ` +
    `${chartText(input.firstDate)} to ${chartText(input.lastDate)}, ${report.solution.observations}${frequency} observations.`;
  const reading =
    y === undefined
      ? null
      : "Every b_low in the shaded range fits the sample moments equally well; " +
        (y === "variance"
          ? "the lines show the noise variance of each book that it implies."
          : "the line shows the low book's share of the noise variance that it implies.");
  const missing =
    y !== undefined && report.solution.landmarks !== null && report.solution.landmarks.returnImplied === null
      ? [
          "Not shown: the point implied by mean returns (the mean excess market return is too close to zero, or the ratio gives no positive pair of betas).",
        ]
      : [];
  return [data, ...(reading === null ? [] : [reading]), ...missing, assumptionsLine(report.solution.weight), cautionCaption];
}

/** The chart's description for screen readers: the set and what the y axis shows. */
export function chartDescription(report: SolveReport, y: YQuantity): string {
  const b = report.solution.bounds!.lowBeta;
  const what = y === "variance" ? "the low and high books' noise variances" : "the low book's noise share";
  return (
    `Chart of the identified set of the low structural beta, from ${labelNumber(b.min)} to ${labelNumber(b.max)}, ` +
    `with ${what} at each value and the landmarks marked.`
  );
}

/** "95% " for a confidence of 0.95, "" when none is given. */
export function levelText(u: IdentifiedSetUncertainty): string {
  return u.confidence !== undefined && u.confidence > 0 && u.confidence < 1 ? `${Number((100 * u.confidence).toPrecision(4))}% ` : "";
}

/** An interval bar's description for screen readers. */
export function intervalText(what: string, i: BetaInterval): string {
  return `Interval for the ${what}: ${labelNumber(i.lower)} to ${labelNumber(i.upper)}.`;
}

/** The legend: the set, the curves, the dotted extensions, the landmark symbols and any interval bars. */
export function legendEntries(
  series: readonly Series[],
  min: number,
  max: number,
  uncertainty: IdentifiedSetUncertainty,
  anyOutside: boolean,
): LegendEntry[] {
  const entries: LegendEntry[] = [
    {
      swatch: { kind: "area", fill: palette.setFill, stroke: "#8FB3D9" },
      label: `identified set: b_low from ${labelNumber(min)} to ${labelNumber(max)}`,
    },
    ...series.map(
      (ser): LegendEntry => ({
        swatch: { kind: "line", stroke: ser.colour, dash: ser.dash, width: 2.6, shape: ser.marker },
        label: ser.label,
      }),
    ),
    {
      swatch: { kind: "line", stroke: palette.grey, dash: dash.dotted, width: 1.8 },
      label: "dotted: outside the set (a noise variance < 0)",
    },
    {
      swatch: { kind: "symbol", shape: "circle", fill: palette.vermillion, stroke: palette.ink },
      label: "large symbol: CAPM-consistent point",
    },
  ];
  if (anyOutside) {
    entries.push({
      swatch: { kind: "symbol", shape: "triangle-down", fill: "#FFFFFF", stroke: palette.ink },
      label: "hollow symbol: landmark outside the set",
    });
  }
  if (uncertainty.lowBetaInterval !== undefined || uncertainty.boundIntervals !== undefined) {
    const level = levelText(uncertainty);
    entries.push({
      swatch: { kind: "interval", stroke: palette.ink },
      label: level === "" ? "bar: sampling uncertainty interval" : `bar: ${level}confidence interval`,
    });
  }
  return entries;
}
