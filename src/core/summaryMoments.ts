/**
 * The SampleMoments block (as `solve` reports it) from the sufficient statistics alone: the market
 * proxy's moments follow from those of the two books (docs/methods.md §1.5). Used where no series
 * pass is made: population moments (`implied`) and rolling windows.
 */

import { marketMoments, type MomentSummary } from "./identify.js";
import type { SampleMoments, SeriesMoments } from "./types.js";

function series(mean: number, variance: number): SeriesMoments {
  const stdev = Math.sqrt(variance);
  return { mean, variance, stdev, sharpeRatio: stdev > 0 ? mean / stdev : null };
}

/** Null when either variance is 0 (a constant series), where the correlation is undefined. */
const correlation = (covariance: number, a: number, b: number): number | null =>
  a > 0 && b > 0 ? covariance / (Math.sqrt(a) * Math.sqrt(b)) : null;

export function momentsFromSummary(summary: MomentSummary): SampleMoments {
  const market = marketMoments(summary);
  return {
    low: series(summary.lowMean, summary.lowVariance),
    high: series(summary.highMean, summary.highVariance),
    market: series(market.mean, market.variance),
    covariance: { lowHigh: summary.covariance, lowMarket: market.lowCovariance, highMarket: market.highCovariance },
    correlation: {
      lowHigh: correlation(summary.covariance, summary.lowVariance, summary.highVariance),
      lowMarket: correlation(market.lowCovariance, summary.lowVariance, market.variance),
      highMarket: correlation(market.highCovariance, summary.highVariance, market.variance),
    },
  };
}
