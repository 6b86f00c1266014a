/**
 * The text report's pricing section: can noise in the measured betas explain the low book's CAPM
 * alpha? One sentence with the verdict and its numbers, then the decomposition and the test
 * (docs/methods.md §30). The verdict comes from the test at the report's confidence, never from the
 * point estimates alone; without standard errors the section says the question was not tested.
 */

import type { PricingJson } from "../../schema/pricing.js";
import { formatNumber } from "../format.js";
import { type Block, type Section, sectionLines } from "../blocks.js";
import type { Style } from "../layout.js";

type Alpha = PricingJson["alpha"]["low"];

/** "p = 0.692", or "p < 0.0001". */
const pIs = (p: number): string => (p < 0.0001 ? "p < 0.0001" : `p = ${formatNumber(p, 3)}`);
const percentLevel = (confidence: number): string => `${Number((100 * confidence).toPrecision(6))}%`;
const percent = (x: number): string => `${formatNumber(100 * x, 3)}%`;

/** Where the observed alpha lies relative to the range noise can explain, in words. */
function position(a: Alpha): string {
  const range = `${formatNumber(a.explainableMin)} to ${formatNumber(a.explainableMax)}`;
  if (a.unexplained > 0) return `above the ${range} that noise in the betas can explain, by ${formatNumber(a.unexplained)}`;
  if (a.unexplained < 0) return `below the ${range} that noise in the betas can explain, by ${formatNumber(-a.unexplained)}`;
  return `within the ${range} that noise in the betas can explain`;
}

/** The answer in one sentence. */
export function pricingSentence(p: PricingJson): string {
  const a = p.alpha.low;
  const level = percentLevel(p.confidence);
  const year = a.annualised === null ? "" : ` (${percent(a.annualised.observed)} a year)`;
  const alpha = `the low book's CAPM alpha of ${formatNumber(a.observed)} a period${year}`;
  const test = p.test;
  if (test === null) return `Not tested (no standard errors): by the point estimates ${alpha} lies ${position(a)}; no conclusion is drawn.`;
  const alphaLevel = formatNumber(1 - p.confidence, 4);
  switch (test.verdict) {
    case "not explained":
      return `No: ${alpha} lies ${position(a)}, significantly (${pIs(test.pValue)} < ${alphaLevel}); no structure in the identified set explains it.`;
    case "explained":
      return `Yes: ${alpha} lies ${position(a)}, significantly inside (${pIs(test.explainedPValue)} < ${alphaLevel}); noise in the measured betas can account for it.`;
    case "undetermined":
      return (
        `Undetermined at ${level}: ${alpha} lies ${position(a)}, but the data cannot tell whether noise explains it ` +
        `(${pIs(test.pValue)} that it does, ${pIs(test.explainedPValue)} that it does not).`
      );
  }
}

/** The section: heading, sentence, decomposition table, return-implied beta, test and caveats. */
export function pricing(p: PricingJson): Section {
  const level = percentLevel(p.confidence);
  const blocks: Block[] = [{ kind: "paragraph", text: pricingSentence(p) }];
  const annual = p.alpha.low.annualised !== null;
  const interval = (lower: number | null, upper: number | null) =>
    lower === null || upper === null ? "n/a" : `${formatNumber(lower, 3)} to ${formatNumber(upper, 3)}`;
  const rows = (a: Alpha): string[][] => {
    const y = a.annualised;
    const cells = (b: Omit<Alpha, "annualised">) => [
      formatNumber(b.observed),
      interval(b.observedLower, b.observedUpper),
      `${formatNumber(b.explainableMin, 4)} to ${formatNumber(b.explainableMax, 4)}`,
      formatNumber(b.unexplained),
    ];
    const perPeriod = cells(a);
    const perYear = y === null ? null : cells(y);
    const labels = ["  CAPM alpha", `  ${level} interval (HAC)`, "  explainable by noise", "  unexplained"];
    return labels.map((label, i) => [label, perPeriod[i]!, ...(perYear === null ? [] : [perYear[i]!])]);
  };
  blocks.push(
    { kind: "gap" },
    {
      kind: "table",
      header: ["", "per period", ...(annual ? ["a year"] : [])],
      rows: [["low book"], ...rows(p.alpha.low), ["high book"], ...rows(p.alpha.high)],
    },
  );
  const r = p.returnImpliedLowBeta;
  if (r.estimate !== null) {
    const se = r.stdError === null ? "" : `, std. error ${formatNumber(r.stdError, 3)}`;
    const set =
      r.shape === null
        ? ""
        : r.shape === "bounded"
          ? `; Fieller ${level} interval ${formatNumber(r.lower)} to ${formatNumber(r.upper)}`
          : r.shape === "two-rays" && r.outsideOf !== null
            ? `; Fieller ${level} set unbounded: every value outside ${interval(r.outsideOf[0] ?? null, r.outsideOf[1] ?? null)}`
            : `; Fieller ${level} set unbounded: every value (the market mean is not distinguishable from zero)`;
    const boot =
      r.bootstrapLower === null || r.bootstrapUpper === null
        ? ""
        : `; bootstrap ${formatNumber(r.bootstrapLower)} to ${formatNumber(r.bootstrapUpper)}`;
    blocks.push(
      { kind: "gap" },
      {
        kind: "paragraph",
        text: `Return-implied low structural beta (mean low / mean market): ${formatNumber(r.estimate)}${se}${set}${boot}.`,
      },
    );
  }
  if (p.test !== null) {
    blocks.push({
      kind: "paragraph",
      text:
        `Test of "noise explains the alpha": statistic ${formatNumber(p.test.statistic, 3)}, ${pIs(p.test.pValue)}; ` +
        `of "it does not": ${pIs(p.test.explainedPValue)}. Method: ${p.test.method}.`,
    });
  }
  if (!p.excessReturns) {
    blocks.push({
      kind: "paragraph",
      text: "No risk-free rate was given: raw mean returns were used, and the verdict assumes a zero risk-free rate.",
    });
  }
  return { id: "pricing", heading: `Can noise in the betas explain the alpha? (${level} confidence)`, blocks };
}

/** The text of the pricing section; none when there is no set. */
export function pricingSection(p: PricingJson | null, style: Style): string[] {
  return p === null ? [] : sectionLines(pricing(p), style);
}
