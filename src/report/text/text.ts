/**
 * The report for a person at a terminal: what was read, the sample moments, the CAPM regressions,
 * the identified set with its landmarks, the pricing question and the candidate grid, the diagnostics
 * and the assumptions, in that order. Pure: colour only when asked, no clock, no terminal queries.
 */

import { styleFor, wrap } from "../layout.js";
import { capmSection, inputSection, momentsSection, returnsWord } from "./textData.js";
import { assumptionsSection, briefCautionLine, closingLines, diagnosticsSection } from "./textNotes.js";
import { pricingSection } from "./textPricing.js";
import { boundsSection, gridSection, landmarksSection, rejectedSection } from "./textSet.js";
import { reportDiagnostics } from "../diagnosticList.js";
import { modelSections } from "./textModels.js";
import { summarySection } from "./textSummary.js";
import { bootstrapSection, boundsWithUncertaintySection, precisionSection, sharpeSection } from "./textUncertainty.js";
import type { RenderOptions, SolveReport } from "../types.js";

/** The title line. */
export function titleLine(report: SolveReport): string {
  return `${report.tool.name} ${report.tool.version}: structural betas of a low-beta and a high-beta book (one-factor model)`;
}

/**
 * Renders the text report (LF line endings, trailing newline). When the model is rejected (no
 * bounds) the set sections are replaced by a plain statement of why, taken from the error diagnostic.
 * With `options.brief`, the title, the summary and the caution alone.
 */
export function renderText(report: SolveReport, options: RenderOptions): string {
  const style = styleFor(options);
  const s = report.solution;
  const u = report.uncertainty;
  const head = [[style.heading(titleLine(report))], summarySection(report, style)];
  if (options.brief === true) return joinSections([...head, wrap(briefCautionLine, "", "")]);
  const perYear = report.input.frequency?.periodsPerYear ?? null;
  const returns = returnsWord(report.input.riskFree);
  const sections: string[][] = [
    ...head,
    inputSection(report.input, s.observations, style),
    momentsSection(s, style, `Sample moments (${returns}, per period)`, perYear),
    capmSection(s, style, u, perYear),
  ];
  if (s.bounds === null) {
    const reason = s.diagnostics.find((d) => d.severity === "error")?.message ?? null;
    sections.push(rejectedSection(reason, style));
    if (u !== null) sections.push(precisionSection(s, u, style));
  } else {
    sections.push(boundsSection(s.bounds, style));
    if (u !== null) sections.push(boundsWithUncertaintySection(s.bounds, u, style), precisionSection(s, u, style));
    if (s.landmarks !== null) sections.push(landmarksSection(s.landmarks, style, perYear));
    sections.push(pricingSection(report.pricing, style), gridSection(s, style, perYear));
  }
  sections.push(...modelSections(report, style));
  if (u !== null) sections.push(sharpeSection(u, perYear, style, report.input.riskFree.kind !== "none"), bootstrapSection(u, style));
  sections.push(
    diagnosticsSection(reportDiagnostics(report), style),
    assumptionsSection(s.weight, style),
    closingLines(report.input.riskFree),
  );
  return joinSections(sections);
}

function joinSections(sections: readonly string[][]): string {
  return `${sections
    .filter((lines) => lines.length > 0)
    .map((lines) => lines.join("\n"))
    .join("\n\n")}\n`;
}
