/**
 * The comparison table that opens a text report of several pairs or files: one row a pair, with the
 * identified set of the low structural beta and its interval, the low book's CAPM beta and alpha (a
 * year when the frequency is known) with the alpha's interval, the answer to "can noise explain the
 * alpha?" (the pricing test's verdict at the report's confidence, never a point estimate) and the
 * codes of the warnings and errors. The detailed reports follow it in the same order.
 */

import { formatCount, formatNumber } from "../format.js";
import { type Section, sectionLines } from "../blocks.js";
import { printable, type Style } from "../layout.js";
import { reportDiagnostics } from "../diagnosticList.js";
import type { SolveReport } from "../types.js";
import { alphaShown, lowAlphaInterval, percentLevel } from "./textSummary.js";

/** A pair of the run: its report, or the codes of what stopped it. */
export type ComparedPair =
  | { readonly kind: "report"; readonly report: SolveReport }
  | {
      readonly kind: "failure";
      readonly source: string;
      readonly lowColumn: string;
      readonly highColumn: string;
      readonly codes: readonly string[];
    };

/** The longest pair label the table holds; longer ones are numbered and listed above it. */
const longestLabel = 28;

const verdictWords = { "not explained": "no", explained: "yes", undetermined: "undetermined" } as const;

function pairLabel(source: string, low: string, high: string, withSource: boolean): string {
  const pair = `${printable(low)} / ${printable(high)}`;
  return withSource ? `${printable(source)}: ${pair}` : pair;
}

function reportRow(report: SolveReport, withSource: boolean): string[] {
  const { input, solution: s, uncertainty: u, pricing } = report;
  const show = alphaShown(report);
  const alpha = lowAlphaInterval(report);
  const serious = reportDiagnostics(report)
    .filter((d) => d.severity !== "info")
    .map((d) => d.code);
  return [
    pairLabel(input.source, input.lowColumn, input.highColumn, withSource),
    formatCount(s.observations),
    s.bounds === null ? "none" : `${formatNumber(s.bounds.lowBeta.min, 4)} to ${formatNumber(s.bounds.lowBeta.max, 4)}`,
    u?.lowBeta == null ? "n/a" : `${formatNumber(u.lowBeta.interval.lower, 4)} to ${formatNumber(u.lowBeta.interval.upper, 4)}`,
    formatNumber(s.capm.low.beta, 4),
    show(s.capm.low.alpha),
    alpha === null ? "n/a" : `${show(alpha.lower)} to ${show(alpha.upper)}`,
    pricing?.test == null ? "not tested" : verdictWords[pricing.test.verdict],
    serious.length === 0 ? "none" : serious.join(", "),
  ];
}

function failureRow(pair: Extract<ComparedPair, { kind: "failure" }>, withSource: boolean): string[] {
  return [pairLabel(pair.source, pair.lowColumn, pair.highColumn, withSource), "not solved", "", "", "", "", "", "", pair.codes.join(", ")];
}

/** The comparison section of several pairs, or null for fewer than two. */
export function comparison(pairs: readonly ComparedPair[]): Section | null {
  if (pairs.length < 2) return null;
  const reports = pairs.flatMap((p) => (p.kind === "report" ? [p.report] : []));
  const sources = new Set(pairs.map((p) => (p.kind === "report" ? p.report.input.source : p.source)));
  const withSource = sources.size > 1;
  const confidences = new Set(reports.map((r) => r.uncertainty?.confidence ?? r.pricing?.confidence).filter((c) => c !== undefined));
  const level = confidences.size === 1 ? `${percentLevel([...confidences][0]!)} ` : "";
  const annual = reports.length > 0 && reports.every((r) => r.input.frequency !== null);
  const alphaUnit = annual ? "% a year" : "a period";
  const header = [
    withSource ? "file: low / high" : "low / high",
    "n",
    "identified set\nof low beta",
    `${level}interval\nof low beta`,
    "CAPM beta\nof low",
    `CAPM alpha of low\n(${alphaUnit})`,
    `${level}interval\nof alpha`,
    "noise\nexplains?",
    "warnings and\nerrors",
  ];
  const rows = pairs.map((p) => (p.kind === "report" ? reportRow(p.report, withSource) : failureRow(p, withSource)));
  // Long names would push the table past the page: number the pairs and name them in a list above it.
  const keyed = rows.some((row) => row[0]!.length > longestLabel);
  const key = keyed ? [{ kind: "list" as const, items: rows.map((row, i) => `${i + 1}: ${row[0]}`) }] : [];
  if (keyed) {
    header[0] = "pair";
    rows.forEach((row, i) => {
      row[0] = String(i + 1);
    });
  }
  const mixed = reports.some((r) => r.input.frequency !== null) && !annual;
  const notes = [
    "One row a pair; the detailed reports follow in the same order. \"Noise explains?\" is the pricing test's verdict at the stated confidence (see each report's pricing section).",
    ...(mixed ? ["Alphas are shown a year where the frequency is known and a period elsewhere."] : []),
  ];
  return {
    id: "comparison",
    heading: `Comparison of ${formatCount(pairs.length)} pairs`,
    blocks: [...key, { kind: "table", header, rows }, ...notes.map((text) => ({ kind: "paragraph" as const, text }))],
  };
}

export function comparisonLines(pairs: readonly ComparedPair[], style: Style): string[] {
  const section = comparison(pairs);
  return section === null ? [] : sectionLines(section, style);
}
