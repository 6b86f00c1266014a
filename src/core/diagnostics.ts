/**
 * The closed set of things the core can say about a sample. Each diagnostic is a value with a stable
 * code; its wording lives only in `describeDiagnostic`, so reports and the CLI never invent text.
 *
 * Severity: "error" means the requested result could not be computed (the CLI exits non-zero);
 * "warning" means the result stands but needs the analyst's attention; "info" is a fact worth knowing.
 */

export type Severity = "error" | "warning" | "info";

export type DiagnosticDetail =
  | { readonly code: "too-few-observations"; readonly observations: number; readonly minimum: number }
  | { readonly code: "zero-variance"; readonly series: "low" | "high" | "market" }
  | { readonly code: "nonpositive-covariance"; readonly covariance: number; readonly correlation: number }
  | { readonly code: "perfect-correlation"; readonly correlation: number }
  | { readonly code: "low-beta-above-one"; readonly upperBound: number }
  | { readonly code: "market-mean-near-zero"; readonly marketMean: number; readonly tStat: number }
  | { readonly code: "return-implied-outside-set"; readonly lowBeta: number; readonly min: number; readonly max: number }
  | { readonly code: "degenerate-moments"; readonly quantity: string }
  | { readonly code: "uncertainty-unavailable"; readonly observations: number; readonly minimum: number };

export type DiagnosticCode = DiagnosticDetail["code"];

export interface Diagnostic {
  readonly code: DiagnosticCode;
  readonly severity: Severity;
  readonly message: string;
  readonly detail: DiagnosticDetail;
}

const severityOf: Record<DiagnosticCode, Severity> = {
  "too-few-observations": "error",
  "zero-variance": "error",
  "nonpositive-covariance": "error",
  "perfect-correlation": "info",
  "low-beta-above-one": "warning",
  "market-mean-near-zero": "info",
  "return-implied-outside-set": "warning",
  "degenerate-moments": "error",
  "uncertainty-unavailable": "info",
};

const fmt = (x: number): string => (Number.isFinite(x) ? Number(x.toPrecision(6)).toString() : String(x));

/** The one place where diagnostic wording lives. */
export function describeDiagnostic(detail: DiagnosticDetail): string {
  switch (detail.code) {
    case "too-few-observations":
      return `only ${detail.observations} aligned observation(s); at least ${detail.minimum} are needed for the moments and the CAPM fits`;
    case "zero-variance":
      return `the ${detail.series} series has zero variance (it is constant), so betas and correlations are undefined; check that the right column was chosen`;
    case "nonpositive-covariance":
      return (
        `the covariance of low and high is ${fmt(detail.covariance)} (correlation ${fmt(detail.correlation)}); ` +
        "a one-factor model with positive structural betas needs it to be positive, so no structure fits and there is no identified set"
      );
    case "perfect-correlation":
      return `low and high are perfectly correlated (correlation ${fmt(detail.correlation)}): the identified set is a single point with no noise`;
    case "low-beta-above-one":
      return (
        `the upper bound of the low structural beta is ${fmt(detail.upperBound)} > 1: part of the set has the "low" book ` +
        "carrying the higher structural beta, so the labels low and high are not implied by the data"
      );
    case "market-mean-near-zero":
      return (
        `the mean excess market return ${fmt(detail.marketMean)} is within one standard error of zero (t = ${fmt(detail.tStat)}); ` +
        "the return-implied structural beta (a ratio of means) is not reported"
      );
    case "return-implied-outside-set":
      return (
        `the return-implied low structural beta ${fmt(detail.lowBeta)} lies outside the identified set ` +
        `[${fmt(detail.min)}, ${fmt(detail.max)}]: mean returns are not consistent with one priced factor and uncorrelated noise`
      );
    case "uncertainty-unavailable":
      return `standard errors and intervals need at least ${detail.minimum} observations (there are ${detail.observations}); none are reported`;
    case "degenerate-moments":
      return (
        `the ${detail.quantity} cannot be represented in double precision (the variances and the covariance differ by ` +
        "hundreds of orders of magnitude), so no identified set is reported; check the units and the columns"
      );
  }
}

/** Builds a diagnostic value from its detail. */
export function diagnose(detail: DiagnosticDetail): Diagnostic {
  return { code: detail.code, severity: severityOf[detail.code], message: describeDiagnostic(detail), detail };
}

export function hasError(diagnostics: readonly Diagnostic[]): boolean {
  return diagnostics.some((d) => d.severity === "error");
}
