/**
 * The closed set of things the core can say about a sample. Each diagnostic is a value with a stable
 * code; its wording lives only in `describeDiagnostic`, so reports and the CLI never invent text.
 *
 * Severity: "error" means the requested result could not be computed (the CLI exits non-zero);
 * "warning" means the result stands but needs the analyst's attention; "info" is a fact worth knowing.
 */

import { magnitudeRange, magnitudeRatio } from "./parameters.js";

export type Severity = "error" | "warning" | "info";

export type DiagnosticDetail =
  | { readonly code: "too-few-observations"; readonly observations: number; readonly minimum: number }
  | { readonly code: "zero-variance"; readonly series: "low" | "high" | "market" | "x" }
  | { readonly code: "nonpositive-covariance"; readonly covariance: number; readonly correlation: number }
  | { readonly code: "perfect-correlation"; readonly correlation: number }
  | { readonly code: "low-beta-above-one"; readonly upperBound: number }
  | { readonly code: "books-swapped"; readonly lowerBound: number; readonly upperBound: number }
  | { readonly code: "market-mean-near-zero"; readonly marketMean: number; readonly tStat: number; readonly criticalValue: number }
  | {
      readonly code: "return-implied-outside-set";
      readonly lowBeta: number;
      readonly min: number;
      readonly max: number;
      readonly pValue: number;
      readonly confidence: number;
    }
  | {
      readonly code: "return-implied-outside-not-significant";
      readonly lowBeta: number;
      readonly min: number;
      readonly max: number;
      /** Null when no test was run (standard errors off). */
      readonly pValue: number | null;
      readonly confidence: number | null;
    }
  | { readonly code: "degenerate-moments"; readonly quantity: string }
  | { readonly code: "uncertainty-unavailable"; readonly observations: number; readonly minimum: number }
  | {
      readonly code: "cancellation";
      readonly quantity: "low" | "high" | "market" | "covariance";
      readonly value: number;
      readonly roundingError: number;
    }
  | {
      readonly code: "magnitude-out-of-range";
      readonly series: "low" | "high";
      readonly largest: number;
      /** The other book's largest absolute value when the two are too far apart; null when this one is out of range. */
      readonly other: number | null;
    }
  | { readonly code: "invalid-number"; readonly argument: string; readonly index: number; readonly value: string }
  | { readonly code: "length-mismatch"; readonly argument: string; readonly length: number; readonly expected: number }
  | { readonly code: "invalid-argument"; readonly argument: string; readonly value: string; readonly expected: string }
  // The independent index (docs/methods.md §3) and the correlated-noise sensitivity (§2).
  | { readonly code: "index-constant"; readonly variance: number }
  | { readonly code: "index-out-of-range"; readonly largest: number }
  | { readonly code: "index-not-identified"; readonly quantity: IndexCovariance; readonly value: number }
  | { readonly code: "index-sign-condition"; readonly lowHigh: number; readonly lowIndex: number; readonly highIndex: number }
  | { readonly code: "index-heywood"; readonly series: "low" | "high" | "index"; readonly noiseVariance: number }
  | { readonly code: "noise-correlation-not-an-interval"; readonly noiseCorrelation: number; readonly correlation: number }
  | { readonly code: "noise-correlation-no-set"; readonly noiseCorrelation: number }
  // The k-portfolio factor model (docs/methods.md §31).
  | { readonly code: "factor-too-few-portfolios"; readonly count: number; readonly minimum: number }
  | { readonly code: "factor-constant"; readonly portfolio: string }
  | { readonly code: "factor-singular-covariance"; readonly observations: number; readonly portfolios: number }
  | { readonly code: "factor-not-normalisable"; readonly marketLoading: number }
  | { readonly code: "factor-not-converged"; readonly iterations: number }
  | { readonly code: "factor-heywood"; readonly portfolio: string; readonly noiseVariance: number };

/** The covariances the index model divides by: of the books, of each book with the index, of the market proxy with it. */
export type IndexCovariance = "lowHigh" | "lowIndex" | "highIndex" | "marketIndex";

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
  "books-swapped": "warning",
  "market-mean-near-zero": "info",
  "return-implied-outside-set": "warning",
  "return-implied-outside-not-significant": "info",
  "degenerate-moments": "error",
  "uncertainty-unavailable": "info",
  cancellation: "error",
  "magnitude-out-of-range": "error",
  "invalid-number": "error",
  "length-mismatch": "error",
  "invalid-argument": "error",
  "index-constant": "warning",
  "index-out-of-range": "warning",
  "index-not-identified": "warning",
  "index-sign-condition": "warning",
  "index-heywood": "warning",
  "noise-correlation-not-an-interval": "warning",
  "noise-correlation-no-set": "warning",
  "factor-too-few-portfolios": "warning",
  "factor-constant": "warning",
  "factor-singular-covariance": "warning",
  "factor-not-normalisable": "warning",
  "factor-not-converged": "warning",
  "factor-heywood": "warning",
};

const covarianceNames: Record<IndexCovariance, string> = {
  lowHigh: "low and high",
  lowIndex: "low and the index",
  highIndex: "high and the index",
  marketIndex: "the market proxy and the index",
};

const fmt = (x: number): string => (Number.isFinite(x) ? Number(x.toPrecision(6)).toString() : String(x));
/** "p = 0.0123", or "p < 0.0001". */
const fmtP = (p: number): string => (p < 0.0001 ? "p < 0.0001" : `p = ${p.toFixed(4)}`);

/** The one place where diagnostic wording lives. */
export function describeDiagnostic(detail: DiagnosticDetail): string {
  switch (detail.code) {
    case "too-few-observations":
      return `only ${detail.observations} observation(s); at least ${detail.minimum} are needed`;
    case "zero-variance":
      if (detail.series === "x") return "x is constant, so the slope of a line through the points is undefined";
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
    case "books-swapped":
      return (
        `the low structural beta is above 1 over the whole identified set (${fmt(detail.lowerBound)} to ${fmt(detail.upperBound)}): ` +
        'the "low" book carries the higher beta everywhere, so the books look swapped; exchange --low and --high'
      );
    case "market-mean-near-zero":
      return (
        `the mean excess market return ${fmt(detail.marketMean)} is not distinguishable from zero (t = ${fmt(detail.tStat)}, ` +
        `within ${fmt(detail.criticalValue)} standard errors): the return-implied structural beta, a ratio of means, has no ` +
        "bounded confidence interval (Fieller) and is not reported"
      );
    case "return-implied-outside-set":
      return (
        `the return-implied low structural beta ${fmt(detail.lowBeta)} lies outside the identified set ` +
        `[${fmt(detail.min)}, ${fmt(detail.max)}], significantly (${fmtP(detail.pValue)}, below ${fmt(1 - detail.confidence)}): ` +
        "noise in the betas does not explain the mean returns under one priced factor and uncorrelated noise"
      );
    case "return-implied-outside-not-significant":
      return (
        `the return-implied low structural beta ${fmt(detail.lowBeta)} lies outside the identified set ` +
        `[${fmt(detail.min)}, ${fmt(detail.max)}] by the point estimates, ` +
        (detail.pValue === null || detail.confidence === null
          ? "untested (standard errors are off): no conclusion is drawn"
          : `but not significantly (${fmtP(detail.pValue)}, not below ${fmt(1 - detail.confidence)}): noise can still explain the alpha`)
      );
    case "uncertainty-unavailable":
      return `standard errors and intervals need at least ${detail.minimum} observations (there are ${detail.observations}); none are reported`;
    case "degenerate-moments":
      return (
        `the ${detail.quantity} cannot be represented in double precision (the variances and the covariance differ by ` +
        "hundreds of orders of magnitude), so no identified set is reported; check the units and the columns"
      );
    case "cancellation":
      return detail.quantity === "covariance"
        ? `the covariance of low and high, ${fmt(detail.value)}, is at the level of the rounding of the numbers themselves, ` +
            `which could change it by ${fmt(detail.roundingError)}: the data do not determine it, so no identified set is reported`
        : `the ${detail.quantity} series varies only in the last digits of its numbers: their rounding could change its variance ` +
            `${fmt(detail.value)} by ${fmt(detail.roundingError)}, so it is treated as constant; check that the right column was chosen`;
    case "magnitude-out-of-range":
      return detail.other === null
        ? `the ${detail.series} series' values reach ${fmt(detail.largest)} in absolute value, outside ${magnitudeRange.min} to ` +
            `${magnitudeRange.max}, where their squares (the variances) leave double precision; rescale the data (for example to decimal returns)`
        : `the ${detail.series} series' values (up to ${fmt(detail.largest)} in absolute value) and the other book's (up to ` +
            `${fmt(detail.other)}) are more than ${fmt(magnitudeRatio)} apart, so one book's variance is lost in the other's rounding; ` +
            "check the units of both columns";
    case "invalid-number":
      return `${detail.argument}[${detail.index}] is ${detail.value}: every value must be a finite number`;
    case "length-mismatch":
      return `${detail.argument} has ${detail.length} values where ${detail.expected} are expected: the series must be aligned`;
    case "invalid-argument":
      return `${detail.argument} is ${detail.value}: it must be ${detail.expected}`;
    case "index-constant":
      return (
        `the index series is constant (or varies only in the last digits of its numbers; variance ${fmt(detail.variance)}), ` +
        "so it carries no information on the factor and the model with an index is not estimated; check that the right column was chosen"
      );
    case "index-out-of-range":
      return (
        `the index series' values reach ${fmt(detail.largest)} in absolute value, outside ${magnitudeRange.min} to ${magnitudeRange.max}, ` +
        "where its variance leaves double precision; the model with an index is not estimated (rescale the column)"
      );
    case "index-not-identified":
      return (
        `the covariance of ${covarianceNames[detail.quantity]} is ${fmt(detail.value)}, zero or at the level of the numbers' rounding: ` +
        "the model with an index divides by it, so its betas are not identified and none are reported"
      );
    case "index-sign-condition":
      return (
        `the covariances of the books and the index (low-high ${fmt(detail.lowHigh)}, low-index ${fmt(detail.lowIndex)}, ` +
        `high-index ${fmt(detail.highIndex)}) have a negative product: no one-factor structure fits them (the implied factor ` +
        "variance is negative); the estimates are shown but are not admissible"
      );
    case "index-heywood":
      return (
        `the model with an index implies a negative ${detail.series} noise variance (${fmt(detail.noiseVariance)}), a Heywood case: ` +
        "no admissible structure reproduces the three series' moments; the value is reported as computed, not set to zero"
      );
    case "noise-correlation-not-an-interval":
      return (
        `an assumed noise correlation of ${fmt(detail.noiseCorrelation)} is at or above the books' observed correlation ` +
        `${fmt(detail.correlation)}: the structures that fit no longer form an interval of betas, so no bounds are reported for it`
      );
    case "noise-correlation-no-set":
      return (
        `no bounds for a noise correlation of ${fmt(detail.noiseCorrelation)}: the books' covariance is not positive ` +
        "(or not determined by the data), and the sensitivity analysis starts from the identified set, which does not exist here"
      );
    case "factor-too-few-portfolios":
      return (
        `the factor model needs at least ${detail.minimum} portfolios in --portfolios, got ${detail.count}: ` +
        "with fewer the loadings are not identified (use the two-book identified set instead)"
      );
    case "factor-constant":
      return `portfolio ${detail.portfolio} has zero variance: the factor model is not fitted; drop the column from --portfolios`;
    case "factor-singular-covariance":
      return (
        `the ${detail.portfolios} portfolios' sample covariance matrix is singular (${detail.observations} observations; ` +
        "perfectly correlated columns, or no more rows than portfolios): the factor model is not fitted; drop a redundant column"
      );
    case "factor-not-normalisable":
      return (
        `the fitted loadings' market-weighted sum is about zero (${fmt(detail.marketLoading)}): they cannot be scaled so that the ` +
        "market proxy's beta is 1; check --market-weights"
      );
    case "factor-not-converged":
      return `the factor model's maximum-likelihood iteration stopped after ${detail.iterations} steps without converging; its estimates are approximate`;
    case "factor-heywood":
      return (
        `the factor model puts the noise variance of ${detail.portfolio} at 0 (${fmt(detail.noiseVariance)}), a Heywood case: ` +
        "the one-factor structure fits only at the boundary; its standard errors are not reported"
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
