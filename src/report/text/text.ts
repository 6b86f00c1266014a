/**
 * The report for a person at a terminal: what was read, the sample moments, the CAPM regressions,
 * the identified set with its landmarks, the pricing question and the candidate grid, the diagnostics
 * and the assumptions, in that order. Pure: colour only when asked, no clock, no terminal queries.
 */

import { capmSection, inputSection, momentsSection } from "./textData.js";
import { assumptionsSection, closingLines, diagnosticsSection } from "./textNotes.js";
import { pricingSection } from "./textPricing.js";
import { boundsSection, gridSection, landmarksSection, rejectedSection } from "./textSet.js";
import { styleFor } from "../layout.js";
import { reportDiagnostics } from "../diagnosticList.js";
import { modelSections } from "./textModels.js";
import { bootstrapSection, boundsWithUncertaintySection, precisionSection, sharpeSection } from "./textUncertainty.js";
import type { RenderOptions, SolveReport } from "../types.js";

/** The title line. */
export function titleLine(report: SolveReport): string {
  return `${report.tool.name} ${report.tool.version}: structural betas of a low-beta and a high-beta book (one-factor model)`;
}

/**
 * Renders the text report (LF line endings, trailing newline). When the model is rejected (no
 * bounds) the set sections are replaced by a plain statement of why, taken from the error diagnostic.
 */
export function renderText(report: SolveReport, options: RenderOptions): string {
  const style = styleFor(options);
  const s = report.solution;
  const u = report.uncertainty;
  const sections: string[][] = [
    [style.heading(titleLine(report))],
    inputSection(report.input, s.observations, style),
    momentsSection(s, style),
    capmSection(s, style, u),
  ];
  if (s.bounds === null) {
    const reason = s.diagnostics.find((d) => d.severity === "error")?.message ?? null;
    sections.push(rejectedSection(reason, style));
    if (u !== null) sections.push(precisionSection(s, u, style));
  } else {
    sections.push(boundsSection(s.bounds, style));
    if (u !== null) sections.push(boundsWithUncertaintySection(s.bounds, u, style), precisionSection(s, u, style));
    if (s.landmarks !== null) sections.push(landmarksSection(s.landmarks, style));
    sections.push(pricingSection(report.pricing, style), gridSection(s, style));
  }
  sections.push(...modelSections(report, style));
  if (u !== null) sections.push(sharpeSection(u, report.input.frequency?.periodsPerYear ?? null, style), bootstrapSection(u, style));
  sections.push(
    diagnosticsSection(reportDiagnostics(report), style),
    assumptionsSection(s.weight, style),
    closingLines(report.input.riskFree),
  );
  return `${sections
    .filter((lines) => lines.length > 0)
    .map((lines) => lines.join("\n"))
    .join("\n\n")}\n`;
}
