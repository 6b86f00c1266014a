/**
 * The summary block at the top of the text report (and all of it but the caution with --brief): the
 * sample, the identified set of the low structural beta with its interval, the low book's CAPM beta
 * and annualised alpha with its HAC interval, the answer to "can noise explain the alpha?" and the
 * warnings and errors among the diagnostics. Its facts are computed once here, for the text and the
 * HTML report alike.
 */

import { type ReportDiagnostic, reportDiagnostics } from "../diagnosticList.js";
import { normalQuantile } from "../../core/numerics/normal.js";
import { formatCount, formatNumber } from "../format.js";
import { type Section, sectionLines } from "../blocks.js";
import { printable, type Style } from "../layout.js";
import type { SolveReport } from "../types.js";
import { pricingSentence } from "./textPricing.js";

/** The summary's lines as label and value, shared by the text and HTML reports. */
export type SummaryField = readonly [label: string, value: string];

export const percentLevel = (confidence: number): string => `${Number((100 * confidence).toPrecision(6))}%`;
const percent = (x: number): string => `${formatNumber(100 * x, 3)}%`;

/** The low book's CAPM alpha interval: the pricing section's (the same figures as its table), else from the HAC error. */
export function lowAlphaInterval(report: SolveReport): { confidence: number; lower: number; upper: number } | null {
  const a = report.pricing?.alpha.low;
  if (report.pricing != null && a != null && a.observedLower !== null && a.observedUpper !== null)
    return { confidence: report.pricing.confidence, lower: a.observedLower, upper: a.observedUpper };
  const u = report.uncertainty;
  if (u === null) return null;
  const alpha = report.solution.capm.low.alpha;
  const half = normalQuantile(1 - (1 - u.confidence) / 2) * u.capm.low.hac.alphaStdErr;
  return { confidence: u.confidence, lower: alpha - half, upper: alpha + half };
}

/** An alpha as the report shows it: % a year when the frequency is known, else per period. */
export function alphaShown(report: SolveReport): (x: number) => string {
  const ppy = report.input.frequency?.periodsPerYear ?? null;
  return ppy === null ? (x: number) => formatNumber(x) : (x: number) => percent(ppy * x);
}

/** The low book's CAPM alpha, per year when the frequency is known, with its HAC interval. */
function alphaText(report: SolveReport): string {
  const fit = report.solution.capm.low;
  const ppy = report.input.frequency?.periodsPerYear ?? null;
  const show = alphaShown(report);
  const unit = ppy === null ? "a period" : "a year";
  const found = lowAlphaInterval(report);
  const interval =
    found === null
      ? "; no standard error computed"
      : `; ${percentLevel(found.confidence)} HAC interval ${show(found.lower)} to ${show(found.upper)}`;
  const perPeriod = ppy === null ? "" : ` (${formatNumber(fit.alpha)} a period)`;
  return `${show(fit.alpha)} ${unit}${perPeriod}${interval}`;
}

/** The diagnostics by severity and code: "no warnings or errors", or "1 warning (code)"; notes last. */
export function diagnosticsSummary(diagnostics: readonly ReportDiagnostic[]): string {
  const count = (severity: ReportDiagnostic["severity"], word: string): string[] => {
    const codes = diagnostics.filter((d) => d.severity === severity).map((d) => d.code);
    return codes.length === 0 ? [] : [`${codes.length} ${word}${codes.length === 1 ? "" : "s"} (${codes.join(", ")})`];
  };
  const serious = [...count("error", "error"), ...count("warning", "warning")];
  return [serious.length === 0 ? "no warnings or errors" : serious.join("; "), ...count("info", "note")].join("; ");
}

/** The summary's facts, label and value, in the order printed. */
export function summaryFields(report: SolveReport): SummaryField[] {
  const { input, solution: s, uncertainty: u } = report;
  const frequency = input.frequency === null ? "" : ` ${printable(input.frequency.name)}`;
  const sample = `${formatCount(s.observations)}${frequency} observations, ${printable(input.firstDate)} to ${printable(input.lastDate)}`;
  const interval =
    u?.lowBeta == null
      ? ""
      : `; ${percentLevel(u.confidence)} interval ${formatNumber(u.lowBeta.interval.lower)} to ${formatNumber(u.lowBeta.interval.upper)}`;
  const set =
    s.bounds === null
      ? "none: no one-factor structure fits these data (see Diagnostics)"
      : `identified set ${formatNumber(s.bounds.lowBeta.min)} to ${formatNumber(s.bounds.lowBeta.max)}${interval}`;
  return [
    ["Sample", sample],
    ["Low structural beta", set],
    ["Low book CAPM beta", formatNumber(s.capm.low.beta)],
    ["Low book CAPM alpha", alphaText(report)],
    ...(report.pricing === null ? [] : [["Noise explains it?", pricingSentence(report.pricing)] as const]),
    ["Diagnostics", diagnosticsSummary(reportDiagnostics(report))],
  ];
}

/** The Summary section: each fact on a line of its own, long ones wrapped under their value. */
export function summary(report: SolveReport): Section {
  return { id: "summary", heading: "Summary", blocks: [{ kind: "fields", pairs: summaryFields(report), wrapped: true }] };
}

export function summarySection(report: SolveReport, style: Style): string[] {
  return sectionLines(summary(report), style);
}
