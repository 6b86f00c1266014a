/**
 * The values the core computes. Every figure is per period of the input and in decimal units
 * (0.01 = one percent). Variances and covariances use the divisor n - 1 unless a field says otherwise.
 */

import type { Diagnostic } from "./diagnostics.js";

/** A value that is either computed or absent for a stated reason (never a bare NaN). */
export type Maybe<T> = T | null;

/** Mean, variance and standard deviation of one series (divisor n - 1). */
export interface SeriesMoments {
  /** Arithmetic mean per period. */
  readonly mean: number;
  /** Sample variance, divisor n - 1. */
  readonly variance: number;
  /** Square root of `variance`. */
  readonly stdev: number;
  /** mean / stdev: the per-period Sharpe ratio of the (excess) series; null when stdev is 0. */
  readonly sharpeRatio: Maybe<number>;
}

/**
 * Sample moments of the excess returns of the low book, the high book and the market proxy
 * M = w low + (1 - w) high. "Excess" means over the risk-free rate; with no risk-free rate these
 * are the raw returns.
 */
export interface SampleMoments {
  readonly low: SeriesMoments;
  readonly high: SeriesMoments;
  readonly market: SeriesMoments;
  readonly covariance: {
    readonly lowHigh: number;
    readonly lowMarket: number;
    readonly highMarket: number;
  };
  /** Null where a series is constant (a rolling window can be; solve fails instead). */
  readonly correlation: {
    readonly lowHigh: Maybe<number>;
    readonly lowMarket: Maybe<number>;
    readonly highMarket: Maybe<number>;
  };
}

/** Ordinary least squares fit of y = alpha + beta x + e with classical (homoskedastic) standard errors. */
export interface LineFit {
  readonly observations: number;
  readonly alpha: number;
  readonly beta: number;
  /** s sqrt(1/n + xbar^2 / Sxx), s^2 = SSR / (n - 2). */
  readonly alphaStdErr: number;
  /** s / sqrt(Sxx). */
  readonly betaStdErr: number;
  /** alpha / alphaStdErr; null when the standard error is 0 (exact fit). */
  readonly alphaTStat: Maybe<number>;
  readonly betaTStat: Maybe<number>;
  /** Two-sided p-values from Student's t with n - 2 degrees of freedom; null with the t-statistic. */
  readonly alphaPValue: Maybe<number>;
  readonly betaPValue: Maybe<number>;
  /** 1 - SSR / Syy (centred). */
  readonly rSquared: number;
  /** Sample variance of the residuals, SSR / (n - 1): the same divisor as the moments. */
  readonly residualVariance: number;
  /** s = sqrt(SSR / (n - 2)), the regression standard error used for the standard errors. */
  readonly residualStdError: number;
  /** Sum of squared residuals. */
  readonly residualSumOfSquares: number;
}

/** CAPM regressions of each book's excess return on the market proxy's excess return. */
export interface CapmFits {
  readonly low: LineFit;
  readonly high: LineFit;
}

/** A closed interval [min, max]. */
export interface Interval {
  readonly min: number;
  readonly max: number;
}

/** The identified set: every structural beta pair consistent with the moments and non-negative noise. */
export interface IdentifiedBounds {
  readonly lowBeta: Interval;
  readonly highBeta: Interval;
  /** The range of the latent factor variance over the set. */
  readonly factorVariance: Interval;
}

/** One structure (structural betas, factor and noise variances) consistent with the sample moments. */
export interface Candidate {
  readonly lowBeta: number;
  readonly highBeta: number;
  /** Variance of the latent factor F, phi = C / (b_low b_high). */
  readonly factorVariance: number;
  readonly lowNoiseVariance: number;
  readonly highNoiseVariance: number;
  /** s_low / (s_low + s_high); null when both noise variances are 0 (perfectly correlated books). */
  readonly noiseShare: Maybe<number>;
  /** b^2 phi / V: the share of each book's variance that the factor explains. */
  readonly lowFactorRSquared: number;
  readonly highFactorRSquared: number;
  /** CAPM betas and residual variances this structure implies for the market proxy. */
  readonly impliedCapm: {
    readonly lowBeta: number;
    readonly highBeta: number;
    readonly lowResidualVariance: number;
    readonly highResidualVariance: number;
  };
  /** (b - CAPM beta) lambda, lambda the mean excess market return: the CAPM alpha this structure expects. */
  readonly expectedLowAlpha: number;
  readonly expectedHighAlpha: number;
  /** b lambda / sd: the Sharpe ratio each book would have if only the factor were priced. */
  readonly impliedLowSharpe: Maybe<number>;
  readonly impliedHighSharpe: Maybe<number>;
  /** Whether both noise variances are non-negative (within rounding): the structure is admissible. */
  readonly insideSet: boolean;
}

export const landmarkNames = ["lowNoiseFree", "highNoiseFree", "equalNoise", "capmConsistent", "returnImplied"] as const;
export type LandmarkName = (typeof landmarkNames)[number];

/** Named points of the identified set. `returnImplied` is null when the market's mean excess return is too close to 0. */
export interface Landmarks {
  readonly lowNoiseFree: Candidate;
  readonly highNoiseFree: Candidate;
  readonly equalNoise: Candidate;
  readonly capmConsistent: Candidate;
  readonly returnImplied: Maybe<Candidate>;
}

/** Inputs to the core: aligned per-period return series in decimal units. */
export interface ReturnSample {
  readonly low: ArrayLike<number>;
  readonly high: ArrayLike<number>;
  /** Risk-free return per period: one number for every period, or a series aligned with low and high. */
  readonly riskFree?: number | ArrayLike<number>;
}

export interface SolveOptions {
  /** Weight w of the low book in the market proxy, 0 < w < 1. Default 0.5. */
  readonly weight?: number;
  /** Number of grid candidates, endpoints included, at least 2. Default 11. */
  readonly steps?: number;
  /**
   * Confidence level of Fieller's condition for reporting the return-implied beta (its set must be
   * bounded: |mean market| above the normal critical value times its iid standard error). Default 0.95.
   */
  readonly confidence?: number;
}

/** Everything `solve` computes from one sample. */
export interface Solution {
  readonly observations: number;
  readonly weight: number;
  readonly moments: SampleMoments;
  readonly capm: CapmFits;
  /** Null when the model is rejected (a diagnostic with severity "error" says why). */
  readonly bounds: Maybe<IdentifiedBounds>;
  readonly grid: readonly Candidate[];
  readonly landmarks: Maybe<Landmarks>;
  readonly diagnostics: readonly Diagnostic[];
}
