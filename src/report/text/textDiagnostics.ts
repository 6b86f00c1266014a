/** A section's own diagnostics, rendered under it (the extensions' sections share this). */
import type { Diagnostic } from "../../core/diagnostics.js";
import { indent, printable, type Style, wrap } from "../layout.js";

/** A section's own diagnostics, each with its severity, under it (the report's Diagnostics are the two-book model's). */
export function diagnosticLines(diagnostics: readonly Diagnostic[], style: Style): string[] {
  const seen = new Set<string>();
  return diagnostics
    .filter((d) => !seen.has(d.message) && seen.add(d.message))
    .flatMap((d) => {
      const label = d.severity === "error" ? style.error(d.severity) : d.severity === "warning" ? style.warning(d.severity) : d.severity;
      return wrap(printable(d.message), `${indent}${label}: `, `${indent}  `);
    });
}
