/**
 * Reading warnings as report diagnostics: the same stable code, severity "warning", the message of
 * `describeInputWarning`, and the warning itself as the detail.
 */
import { describeInputWarning, type InputWarning } from "./issues.js";

/** A reading warning in the shape of a diagnostic (as reports list them). */
export interface InputWarningDiagnostic {
  readonly code: InputWarning["code"];
  readonly severity: "warning";
  readonly message: string;
  readonly detail: InputWarning;
}

export function inputWarningDiagnostic(warning: InputWarning): InputWarningDiagnostic {
  return { code: warning.code, severity: "warning", message: describeInputWarning(warning), detail: warning };
}

/** The codes of the reading warnings, in a fixed order. */
export const inputWarningCodes = [
  "skipped-lines",
  "other-blocks",
  "looks-like-percent",
  "looks-like-decimal",
] as const satisfies readonly InputWarning["code"][];
