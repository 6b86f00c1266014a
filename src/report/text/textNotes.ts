/**
 * Text report sections that qualify the numbers: Diagnostics, Assumptions, the caution and the
 * conventions footer. Each returns its lines.
 */

import type { ReportDiagnostic } from "../diagnosticList.js";
import { excessReturnBasis, modelAssumptions } from "../conventions.js";
import { indent, printable, wrap, type Style } from "../layout.js";
import type { RiskFreeSource } from "../types.js";

/** The closing caution of a report that lists the assumptions above it, printed verbatim. */
export const cautionLine = "Caution: these are statistical estimates under the assumptions above, not investment advice.";

/** The closing caution of the brief report, which leaves the assumptions out: it says where they are. */
export const briefCautionLine =
  "Caution: these are statistical estimates under the model's assumptions (listed in the full report, without --brief), not investment advice.";

/** The Diagnostics section: each diagnostic with its severity, or "none". */
export function diagnosticsSection(diagnostics: readonly ReportDiagnostic[], style: Style): string[] {
  if (diagnostics.length === 0) return [style.heading("Diagnostics"), `${indent}none`];
  const width = Math.max(...diagnostics.map((d) => d.severity.length));
  const lines = diagnostics.flatMap((d) => {
    const label = d.severity.padEnd(width);
    const coloured = d.severity === "error" ? style.error(label) : d.severity === "warning" ? style.warning(label) : label;
    const [first = "", ...rest] = wrap(printable(d.message), `${indent}${label}  `, " ".repeat(indent.length + width + 2));
    return [`${indent}${coloured}${first.slice(indent.length + label.length)}`, ...rest];
  });
  return [style.heading("Diagnostics"), ...lines];
}

/** The Assumptions section: the model's maintained assumptions as a list. */
export function assumptionsSection(weight: number, style: Style): string[] {
  const items = modelAssumptions.map((a) => a.replace("M = w low + (1 - w) high", `M = w low + (1 - w) high (w = ${weight})`));
  return [style.heading("Assumptions"), ...items.flatMap((a) => wrap(a, `${indent}- `, `${indent}  `))];
}

/** The closing caution and the conventions footer. */
export function closingLines(riskFree: RiskFreeSource): string[] {
  const basis =
    riskFree.kind === "none" ? "returns are raw (no risk-free rate was given)" : `returns are in excess of ${excessReturnBasis(riskFree)}`;
  const footer = `Conventions: decimal units per period (0.01 is one percent); variances and covariances use the divisor n - 1; ${basis}.`;
  return [...wrap(cautionLine, "", ""), "", ...wrap(footer, "", "")];
}
