/**
 * assessUncertainty: standard errors and confidence intervals for what `solve` reports.
 *
 * - CAPM alphas and betas: HAC covariance of each book's regression on the market proxy (hac.ts).
 * - Bounds of the identified set: delta method with a long-run (HAC) or iid Omega (boundsDelta.ts),
 *   or bootstrap standard errors (`intervalSource: "bootstrap"`); pointwise limits estimate -/+ z k se
 *   with z = Phi^{-1}(1 - alpha/2) and k the fixed-b factor of the bound's bandwidth (with bootstrap
 *   standard errors, of twice the mean block length; 1 for "iid").
 * - The structural betas themselves: Imbens & Manski (2004) interval (default) or Stoye (2009),
 *   covering the true beta (a point of the set) with the stated probability, cut to the admissible
 *   range 0 <= b_low <= 1/w (0 <= b_high <= 1/(1 - w)). The high beta's interval
 *   is the image of the low beta's under b_high = (1 - w b_low)/(1 - w) (both methods are equivariant
 *   under this decreasing affine map: standard errors scale, roles of the ends swap).
 * - Sharpe ratios: Lo (2002) iid and HAC delta-method standard errors (sharpe.ts).
 * - Optional stationary bootstrap of all of it (bootstrap/summary.ts), off unless replicates > 0.
 * Defaults (options.ts): confidence 0.95; HAC = Bartlett kernel, Newey-West (1994) lag, no
 * prewhitening, no T/(T - k) adjustment; Omega by HAC; Imbens-Manski; delta-method standard errors.
 * All series are excess returns (return minus risk-free); M = w low + (1 - w) high.
 */

import { borrowSeries, giveBack, withScratch } from "../numerics/scratch.js";
import { blendInto } from "../numerics/seriesLoops.js";
import { boundsDeltaFromData } from "./boundsDelta.js";
import { bootstrapSolve, type BootstrapSummary } from "./bootstrap/summary.js";
import { interceptHacCovariance } from "./hac/hac.js";
import { stationaryBootstrapFixedBFactor } from "./hac/fixedB.js";
import { admissibleInterval, imbensManskiInterval, type ParameterInterval } from "./imbensManski.js";
import { interceptLeastSquares } from "../numerics/leastSquares.js";
import { normalQuantile } from "../numerics/normal.js";
import {
  defaultConfidence,
  defaultIntervalMethod,
  defaultIntervalSource,
  defaultLongRun,
  type HacOptions,
  type IntervalMethod,
  type IntervalSource,
  type LongRunMethod,
} from "./options.js";
import { type SharpeStdErrors, sharpeStdErrors } from "./sharpe.js";
import type { SharpeMemo } from "./sharpeMemo.js";
import { stoyeInterval } from "./stoye.js";
import { excessReturnsScaledBy } from "./bootstrap/replicates.js";
import { type CrossProducts, welfordCrossProducts } from "../moments.js";
import type { ReturnSample } from "../types.js";
import type { SolvedMoments } from "../solve.js";
import type { Uncertainty, PointwiseBound, BetaInterval, CapmHac } from "./uncertaintyTypes.js";
import { defaultBlockLength, defaultSeed, defaultWeight } from "../parameters.js";
import { diagnose, type Diagnostic } from "../diagnostics.js";
import { failure, type Result, success } from "../result.js";
import { checkedUncertaintyArguments, minimumForUncertainty } from "./uncertaintyArguments.js";

export { minimumForUncertainty };

/** The aligned per-period returns (decimal) that `solve` takes. */
export type UncertaintySample = ReturnSample;

export interface UncertaintyOptions {
  /** Weight w of the low book in the market proxy. Default 0.5. */
  readonly weight?: number;
  readonly confidence?: number;
  readonly longRun?: LongRunMethod;
  readonly hac?: HacOptions;
  readonly interval?: IntervalMethod;
  readonly intervalSource?: IntervalSource;
  /** Stationary bootstrap; off unless replicates > 0. Block length default "auto", seed default 1. */
  readonly bootstrap?: { readonly replicates: number; readonly blockLength?: number | "auto"; readonly seed?: number };
  /**
   * A bootstrap already run elsewhere (e.g. split over worker threads with bootstrapRange and merged);
   * used instead of running `bootstrap` here.
   */
  readonly bootstrapSummary?: BootstrapSummary;
  /**
   * The moments `solveKeepingMoments` formed on this very sample and weight: the variances and the
   * covariance are taken from them (the same bits as another pass: the same scale, and each sum of the
   * pass depends on its own two series alone) instead of passing over the rows again.
   */
  readonly solved?: SolvedMoments;
  /**
   * Books' Sharpe ratios already assessed in this run (sharpeMemo.ts): a book that another pair of
   * the run had, with the same rates, scale and HAC options, takes its numbers (the same bits).
   */
  readonly sharpeMemo?: SharpeMemo;
}

/**
 * Standard errors and intervals for what `solve` reports on `sample`. Fails with diagnostics, as
 * solve does, on arguments that are not finite numbers or break their rules (uncertaintyArguments.ts),
 * fewer than 10 observations, returns out of double precision's reach, or a constant series.
 */
export function assessUncertainty(sample: UncertaintySample, options: UncertaintyOptions = {}): Result<Uncertainty, Diagnostic[]> {
  const checked = checkedUncertaintyArguments(sample, options);
  if (!checked.ok) return checked;
  const extent = checked.value;
  const weight = options.weight ?? defaultWeight;
  const data = sample.riskFree === undefined ? { low: sample.low, high: sample.high, weight } : { ...sample, weight };
  // Computed on the excess returns times a power of two (scaling.ts): the HAC sums hold fourth
  // powers of returns. Every result is unit-free except the CAPM alphas' standard errors.
  return withScratch(() => {
    // The scale from the largest excess returns the check found (scaledExcessReturns' numbers, in one pass).
    const scaled = excessReturnsScaledBy(data, Math.max(extent.low, extent.high), borrowSeries);
    const result = checkedUncertainty(sample, scaled, weight, options);
    giveBack(scaled.low, scaled.high);
    return result;
  });
}

/** assessUncertainty on the scaled excess returns, or the failure of a constant series. */
function checkedUncertainty(
  sample: UncertaintySample,
  scaled: { low: Float64Array; high: Float64Array; scale: number },
  weight: number,
  options: UncertaintyOptions,
): Result<Uncertainty, Diagnostic[]> {
  const solved = options.solved;
  const moments =
    solved !== undefined && solved.sample === sample && solved.weight === weight && solved.scale === scaled.scale
      ? momentsOf(solved.crossProducts, weight)
      : secondMoments(scaled.low, scaled.high, weight);
  const w = weight;
  const marketVariance = w * w * moments.lowVariance + 2 * w * (1 - w) * moments.covariance + (1 - w) * (1 - w) * moments.highVariance;
  const constant = !(moments.lowVariance > 0) ? "low" : !(moments.highVariance > 0) ? "high" : !(marketVariance > 0) ? "market" : null;
  if (constant !== null) return failure([diagnose({ code: "zero-variance", series: constant })]);
  return success(uncertaintyOf(sample, scaled, moments, options));
}

/** assessUncertainty on checked arguments. */
function uncertaintyOf(
  sample: UncertaintySample,
  { low, high, scale }: { low: Float64Array; high: Float64Array; scale: number },
  moments: ReturnType<typeof secondMoments>,
  options: UncertaintyOptions,
): Uncertainty {
  const weight = options.weight ?? defaultWeight;
  const confidence = options.confidence ?? defaultConfidence;
  const longRun = options.longRun ?? defaultLongRun;
  const hac = options.hac ?? {};
  const method = options.interval ?? defaultIntervalMethod;
  const source = options.intervalSource ?? defaultIntervalSource;
  const n = low.length;
  // In chunks by a small function (seriesLoops.ts): a loop here ran unoptimised for the first pairs of a batch.
  const market = blendInto(borrowSeries(n), weight, low, 1 - weight, high);
  const replicates = options.bootstrap?.replicates ?? 0;
  const bootstrap: BootstrapSummary | null =
    options.bootstrapSummary !== undefined
      ? options.bootstrapSummary
      : replicates > 0
        ? bootstrapSolve(sample.low, sample.high, sample.riskFree, weight, {
            replicates,
            blockLength: options.bootstrap?.blockLength ?? defaultBlockLength,
            seed: options.bootstrap?.seed ?? defaultSeed,
            confidence,
          })
        : null;
  if (source === "bootstrap" && bootstrap === null) throw new RangeError('intervalSource "bootstrap" needs bootstrap replicates > 0');
  // Bootstrap standard errors of both ends, when every replicate but one left them undefined (no
  // set), do not exist: the delta method's are used, and `intervalSource` says so.
  const bootstrapErrors =
    bootstrap === null || bootstrap.stdErrors.lowBetaMin === null || bootstrap.stdErrors.lowBetaMax === null
      ? null
      : { lowBetaMin: bootstrap.stdErrors.lowBetaMin, lowBetaMax: bootstrap.stdErrors.lowBetaMax };
  const usedSource: IntervalSource = source === "bootstrap" && bootstrapErrors !== null ? "bootstrap" : "delta";

  const delta = boundsDeltaFromData(low, high, moments, longRun, hac, confidence);
  const z = normalQuantile(1 - (1 - confidence) / 2);
  // Delta-method limits take the fixed-b factor of each bound's bandwidth (boundsLongRun.ts), the
  // bootstrap's standard errors that of the bandwidth equivalent to its mean block length (fixedB.ts).
  const bootstrapFactor = bootstrap === null ? 1 : stationaryBootstrapFixedBFactor(bootstrap.blockLength, n, confidence);
  const factorLower = usedSource === "bootstrap" ? bootstrapFactor : delta.lowBeta.min.criticalFactor;
  const factorUpper = usedSource === "bootstrap" ? bootstrapFactor : delta.lowBeta.max.criticalFactor;
  const pointwise = (estimate: number, stdError: number, factor: number): PointwiseBound => ({
    estimate,
    stdError,
    lower: estimate - z * factor * stdError,
    upper: estimate + z * factor * stdError,
  });
  let bounds: Uncertainty["bounds"] = null;
  let lowBeta: Uncertainty["lowBeta"] = null;
  let highBeta: Uncertainty["highBeta"] = null;
  if (moments.covariance > 0) {
    const seLower = usedSource === "bootstrap" && bootstrapErrors !== null ? bootstrapErrors.lowBetaMin : delta.lowBeta.min.stdError;
    const seUpper = usedSource === "bootstrap" && bootstrapErrors !== null ? bootstrapErrors.lowBetaMax : delta.lowBeta.max.stdError;
    const correlation = usedSource === "bootstrap" ? (bootstrap?.boundsCorrelation ?? 0) : delta.correlation;
    const ratio = weight / (1 - weight);
    const lb = delta.lowBeta.min.estimate;
    const ub = delta.lowBeta.max.estimate;
    bounds = {
      lowBeta: { min: pointwise(lb, seLower, factorLower), max: pointwise(ub, seUpper, factorUpper) },
      highBeta: {
        min: pointwise(delta.highBeta.min.estimate, ratio * seUpper, factorUpper),
        max: pointwise(delta.highBeta.max.estimate, ratio * seLower, factorLower),
      },
      correlation,
    };
    // The beta intervals run on the standard errors times their fixed-b factors; the critical values
    // reported are the multipliers of the standard errors themselves.
    const estimate = { lower: lb, upper: ub, lowerStdError: factorLower * seLower, upperStdError: factorUpper * seUpper };
    // Stoye's programme needs both standard errors positive; with a zero one (an end known exactly,
    // as for perfectly correlated books) the Imbens-Manski interval is reported, and named.
    const usedMethod: IntervalMethod = method === "stoye" && seLower > 0 && seUpper > 0 ? "stoye" : "imbens-manski";
    const scaled: ParameterInterval = admissibleInterval(
      usedMethod === "stoye" ? stoyeInterval({ ...estimate, correlation }, confidence) : imbensManskiInterval(estimate, confidence),
      weight,
    );
    const interval: ParameterInterval = {
      ...scaled,
      criticalValue: { lower: scaled.criticalValue.lower * factorLower, upper: scaled.criticalValue.upper * factorUpper },
    };
    const toHigh = (b: number) => (1 - weight * b) / (1 - weight);
    lowBeta = {
      interval: {
        lower: interval.lower,
        upper: interval.upper,
        method: usedMethod,
        criticalValue: interval.criticalValue,
      } satisfies BetaInterval,
    };
    highBeta = {
      interval: {
        lower: toHigh(interval.upper),
        upper: toHigh(interval.lower),
        method: usedMethod,
        criticalValue: { lower: interval.criticalValue.upper, upper: interval.criticalValue.lower },
      },
    };
  }

  // The regression on an intercept and the market, without a column of ones (the same bits as
  // leastSquares and hacCovariance on [ones, market]). Only the HAC covariance is kept: the residuals
  // (n numbers) are free once it is computed.
  const capmFit = (y: Float64Array) => {
    const { residuals, inverseCrossProduct } = interceptLeastSquares(market, y);
    const covariance = interceptHacCovariance(market, residuals, inverseCrossProduct, hac);
    giveBack(residuals);
    return { hac: covariance };
  };
  const capmLow = capmFit(low);
  const capmHigh = capmFit(high);
  // Diagonals of a positive semi-definite matrix, negative only by rounding; the alpha's back in the data's units.
  const memo = options.sharpeMemo;
  const bookSharpe = (book: ArrayLike<number>, series: Float64Array): SharpeStdErrors =>
    memo === undefined ? sharpeStdErrors(series, hac) : memo.of(book, sample.riskFree, scale, hac, () => sharpeStdErrors(series, hac));
  const sharpe = { low: bookSharpe(sample.low, low), high: bookSharpe(sample.high, high), market: sharpeStdErrors(market, hac) };
  giveBack(market);
  const capmHac = (c: ReturnType<typeof capmFit>): CapmHac => ({
    alphaStdErr: Math.sqrt(Math.max(0, c.hac.covariance[0]![0]!)) / scale,
    betaStdErr: Math.sqrt(Math.max(0, c.hac.covariance[1]![1]!)),
  });

  return {
    confidence,
    method: {
      longRun,
      kernel: delta.longRun.kernel,
      bandwidth: delta.longRun.bandwidth,
      lags: delta.longRun.lags,
      intervalSource: usedSource,
    },
    capm: {
      low: { hac: capmHac(capmLow) },
      high: { hac: capmHac(capmHigh) },
      hac: {
        lags: capmLow.hac.lags,
        kernel: capmLow.hac.kernel,
        bandwidth: capmLow.hac.bandwidth,
        prewhite: capmLow.hac.prewhite,
        adjust: capmLow.hac.adjust,
      },
    },
    bounds,
    lowBeta,
    highBeta,
    sharpe,
    bootstrap,
  };
}

/** Sample variances and covariance (divisor n - 1) from compensated one-pass sums (moments.ts). */
function secondMoments(low: Float64Array, high: Float64Array, weight: number) {
  return momentsOf(welfordCrossProducts([low, high]), weight);
}

/** The low and high series' variances and covariance from their centred sums (the first two of `cp`). */
function momentsOf(cp: CrossProducts, weight: number) {
  const d = cp.n - 1;
  return { weight, lowVariance: cp.sums[0]![0]! / d, highVariance: cp.sums[1]![1]! / d, covariance: cp.sums[0]![1]! / d };
}
