/**
 * The statistics recomputed on every bootstrap replicate, from the five sums of one resample.
 *
 * From the excess returns x (low) and y (high), resampled means and second moments (divisor n - 1)
 * give, exactly as `solve` does from a sample (docs/methods.md sections 1.2-1.6, 10, 12):
 * the bounds of both structural betas; both CAPM betas and alphas on M = w x + (1 - w) y; the
 * landmark low betas capmConsistent (the CAPM beta, kept inside the set), equalNoise (the Deming
 * slope with ratio 1) and returnImplied (the ratio mean x / mean M whenever mean M is not 0: the
 * percentile interval of the ratio, docs/methods.md §30, must not drop the replicates where the ratio
 * is poorly determined, which would narrow it); and the three Sharpe ratios. Quantities that are
 * undefined on a replicate (no set when C <= 0, a zero mean market return) are NaN there.
 */

import { equalNoiseLowBeta, type MomentSummary } from "../../identify.js";

export const bootstrapQuantities = [
  "lowBetaMin",
  "lowBetaMax",
  "highBetaMin",
  "highBetaMax",
  "lowCapmBeta",
  "highCapmBeta",
  "lowCapmAlpha",
  "highCapmAlpha",
  "capmConsistentLowBeta",
  "equalNoiseLowBeta",
  "returnImpliedLowBeta",
  "lowSharpe",
  "highSharpe",
  "marketSharpe",
] as const;
export type BootstrapQuantity = (typeof bootstrapQuantities)[number];
export const quantityCount = bootstrapQuantities.length;

/** Moments of one (re)sample: means and second moments with divisor n - 1. */
export interface ResampleMoments extends MomentSummary {
  readonly n: number;
}

/**
 * Writes the statistics of one resample into out[offset + q * stride] for q = 0..quantityCount-1,
 * in the order of `bootstrapQuantities`.
 */
export function writeStatistics(m: ResampleMoments, out: Float64Array, offset: number, stride: number): void {
  const w = m.weight;
  const v = 1 - w;
  const { lowVariance: vl, highVariance: vh, covariance: c } = m;
  const marketVariance = w * w * vl + 2 * w * v * c + v * v * vh;
  const marketMean = w * m.lowMean + v * m.highMean;
  // A resample can repeat one row (or rows with one value) throughout: a variance that is 0 (or,
  // by rounding, negative) leaves what divides by it undefined (NaN), never infinite.
  const marketVaries = marketVariance > 0;
  const lowBeta = marketVaries ? (w * vl + v * c) / marketVariance : Number.NaN;
  const highBeta = marketVaries ? (w * c + v * vh) / marketVariance : Number.NaN;
  let lower = Number.NaN;
  let upper = Number.NaN;
  let capmConsistent = Number.NaN;
  let equalNoise = Number.NaN;
  let returnImplied = Number.NaN;
  if (c > 0 && vl > 0 && vh > 0 && marketVaries) {
    lower = c / (v * vh + w * c);
    upper = Math.max(lower, vl / (w * vl + v * c));
    capmConsistent = Math.min(Math.max(lowBeta, lower), upper);
    equalNoise = Math.min(Math.max(equalNoiseLowBeta(m), lower), upper);
    returnImplied = marketMean === 0 ? Number.NaN : m.lowMean / marketMean;
  }
  let q = offset;
  out[q] = lower;
  out[(q += stride)] = upper;
  out[(q += stride)] = (1 - w * upper) / v;
  out[(q += stride)] = (1 - w * lower) / v;
  out[(q += stride)] = lowBeta;
  out[(q += stride)] = highBeta;
  out[(q += stride)] = m.lowMean - lowBeta * marketMean;
  out[(q += stride)] = m.highMean - highBeta * marketMean;
  out[(q += stride)] = capmConsistent;
  out[(q += stride)] = equalNoise;
  out[(q += stride)] = returnImplied;
  out[(q += stride)] = vl > 0 ? m.lowMean / Math.sqrt(vl) : Number.NaN;
  out[(q += stride)] = vh > 0 ? m.highMean / Math.sqrt(vh) : Number.NaN;
  out[(q += stride)] = marketVaries ? marketMean / Math.sqrt(marketVariance) : Number.NaN;
}
