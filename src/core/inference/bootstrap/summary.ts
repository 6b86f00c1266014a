/**
 * Summaries of bootstrap draws: percentile intervals and standard errors per quantity.
 *
 * - Percentile interval (Efron & Tibshirani 1993, An Introduction to the Bootstrap, ch. 13): the
 *   alpha/2 and 1 - alpha/2 quantiles of the replicates, with linear interpolation between order
 *   statistics (Hyndman & Fan 1996 type 7, numpy's and R's default), each stretched away from the
 *   replicates' median by the fixed-b factor k of the block length (stationaryBootstrapFixedBFactor,
 *   docs/methods.md §7.2 and §21): long blocks leave the bootstrap's spread short by the share a
 *   Bartlett window of twice their length would, which k restores (1.0012 for blocks of 1 on 2,520
 *   rows, 1.18 for the default 3 sqrt(n)).
 * - Bootstrap standard error: the standard deviation of the replicates, divisor B - 1.
 * Replicates on which a quantity is undefined (NaN, or not finite) are left out of its summary; `validReplicates`
 * says how many remained. With fewer than 2 the interval and standard error are null.
 */

import {
  bootstrapRange,
  mergeBootstrapRanges,
  resolveBlockLength,
  type BootstrapData,
  type BootstrapPlan,
  type BootstrapRange,
} from "./replicates.js";
import { bootstrapQuantities, type BootstrapQuantity } from "./statistics.js";
import { assertParameter, defaultConfidence } from "../../parameters.js";
import { stationaryBootstrapFixedBFactor } from "../hac/fixedB.js";

export interface PercentileInterval {
  readonly lower: number;
  readonly upper: number;
}

export interface BootstrapSummary {
  readonly replicates: number;
  readonly blockLength: number;
  readonly seed: number;
  readonly confidence: number;
  readonly intervals: Readonly<Record<BootstrapQuantity, PercentileInterval | null>>;
  readonly stdErrors: Readonly<Record<BootstrapQuantity, number | null>>;
  readonly validReplicates: Readonly<Record<BootstrapQuantity, number>>;
  /** Correlation of the replicated lower and upper bounds of the low beta (for Stoye's interval). */
  readonly boundsCorrelation: number | null;
}

/** Type-7 quantile of sorted values. */
export function quantileSorted(sorted: Float64Array, probability: number): number {
  const h = (sorted.length - 1) * probability;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

function column(range: BootstrapRange, q: number): Float64Array {
  const count = range.to - range.from;
  return range.draws.subarray(q * count, (q + 1) * count);
}

export function summariseBootstrap(range: BootstrapRange, seed: number, confidence: number): BootstrapSummary {
  assertParameter("summariseBootstrap", "confidence", confidence);
  const alpha = 1 - confidence;
  const intervals = {} as Record<BootstrapQuantity, PercentileInterval | null>;
  const stdErrors = {} as Record<BootstrapQuantity, number | null>;
  const validReplicates = {} as Record<BootstrapQuantity, number>;
  const stretch = stationaryBootstrapFixedBFactor(range.blockLength, range.rows, confidence);
  bootstrapQuantities.forEach((name, q) => {
    const valid = column(range, q).filter(Number.isFinite);
    validReplicates[name] = valid.length;
    if (valid.length < 2) {
      intervals[name] = null;
      stdErrors[name] = null;
      return;
    }
    valid.sort();
    const median = quantileSorted(valid, 0.5);
    intervals[name] = {
      lower: median - stretch * (median - quantileSorted(valid, alpha / 2)),
      upper: median + stretch * (quantileSorted(valid, 1 - alpha / 2) - median),
    };
    stdErrors[name] = standardDeviation(valid);
  });
  return {
    replicates: range.to - range.from,
    blockLength: range.blockLength,
    seed,
    confidence,
    intervals,
    stdErrors,
    validReplicates,
    boundsCorrelation: correlation(column(range, 0), column(range, 1)),
  };
}

function standardDeviation(x: Float64Array): number {
  let mean = 0;
  for (const v of x) mean += v;
  mean /= x.length;
  let ss = 0;
  for (const v of x) ss += (v - mean) ** 2;
  return Math.sqrt(ss / (x.length - 1));
}

/** Pearson correlation over the replicates where both are defined; null if fewer than 2 or no spread. */
function correlation(a: Float64Array, b: Float64Array): number | null {
  let n = 0;
  let ma = 0;
  let mb = 0;
  for (let i = 0; i < a.length; i++) {
    if (!(Number.isFinite(a[i]!) && Number.isFinite(b[i]!))) continue;
    n++;
    ma += a[i]!;
    mb += b[i]!;
  }
  if (n < 2) return null;
  ma /= n;
  mb /= n;
  let saa = 0;
  let sbb = 0;
  let sab = 0;
  for (let i = 0; i < a.length; i++) {
    if (!(Number.isFinite(a[i]!) && Number.isFinite(b[i]!))) continue;
    saa += (a[i]! - ma) ** 2;
    sbb += (b[i]! - mb) ** 2;
    sab += (a[i]! - ma) * (b[i]! - mb);
  }
  return saa > 0 && sbb > 0 ? sab / Math.sqrt(saa * sbb) : null;
}

export interface BootstrapSolveOptions extends BootstrapPlan {
  /** Default 0.95. */
  readonly confidence?: number;
}

/** All replicates in one thread, summarised. The CLI may instead split [0, B) with bootstrapRange. */
export function bootstrapSolve(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number> | undefined,
  weight: number,
  options: BootstrapSolveOptions,
): BootstrapSummary {
  if (!(Number.isInteger(options.replicates) && options.replicates >= 2)) {
    throw new RangeError(`bootstrap: replicates must be an integer >= 2, got ${options.replicates}`);
  }
  const data: BootstrapData = riskFree === undefined ? { low, high, weight } : { low, high, riskFree, weight };
  const blockLength = resolveBlockLength(data, options.blockLength);
  const range = bootstrapRange(data, { blockLength, seed: options.seed }, 0, options.replicates);
  return summariseBootstrap(mergeBootstrapRanges([range], options.replicates), options.seed, options.confidence ?? defaultConfidence);
}
