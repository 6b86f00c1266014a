/**
 * A report's diagnostics as its outputs list them: the warnings from reading the file(s) first, then
 * what the core found about the sample.
 */
import type { Diagnostic } from "../core/diagnostics.js";
import type { InputWarningDiagnostic } from "../input/index.js";

export type ReportDiagnostic = Diagnostic | InputWarningDiagnostic;

export function reportDiagnostics(report: {
  readonly inputWarnings: readonly InputWarningDiagnostic[];
  readonly solution: { readonly diagnostics: readonly Diagnostic[] };
}): ReportDiagnostic[] {
  return [...report.inputWarnings, ...report.solution.diagnostics];
}
