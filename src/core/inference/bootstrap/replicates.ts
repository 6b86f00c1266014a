/**
 * Stationary-bootstrap distribution of everything `solve` estimates (bounds, CAPM betas and alphas,
 * landmark betas, Sharpe ratios), with percentile intervals and bootstrap standard errors.
 *
 * Rows (low, high, risk-free) are resampled jointly (stationaryBootstrap.ts), replicate r from its own
 * stream createRandom(seed, r + 1). Per replicate only five sums are accumulated, over contiguous
 * runs of a doubled copy of the centred excess returns (no wrap test, no allocation), and the
 * statistics follow in closed form (statistics.ts). Centring at the full-sample means keeps
 * the one-pass sums free of cancellation. `bootstrapRange` runs replicates [from, to) and
 * `mergeBootstrapRanges` joins ranges: any split of [0, B) over workers gives the same merged draws
 * bit for bit, hence the same summary. Block length "auto" is 3 sqrt(n) (autoBlockLength); the
 * Politis-White (2004) value (blockLength.ts) remains in the library.
 */

import { largestValues } from "../../cancellation.js";
import { CHUNK } from "../../numerics/seriesLoops.js";
import { inChunks, seriesKernel } from "../../numerics/seriesKernel.js";
import { scaleFor } from "../../scaling.js";
import { bootstrapQuantities, quantityCount, writeStatistics } from "./statistics.js";
import { drawBlocks, replicateRandom, validateBlockLength } from "./stationaryBootstrap.js";

export interface BootstrapData {
  readonly low: ArrayLike<number>;
  readonly high: ArrayLike<number>;
  /** Risk-free return per period: a number or a series aligned with low and high. Default 0. */
  readonly riskFree?: number | ArrayLike<number>;
  /** Weight of the low book in the market proxy, 0 < w < 1. */
  readonly weight: number;
}

export interface BootstrapPlan {
  readonly replicates: number;
  /** Mean block length b >= 1 (p = 1/b), or "auto" (Politis-White). */
  readonly blockLength: number | "auto";
  readonly seed: number;
}

/** Draws of replicates [from, to): draws[q * (to - from) + (r - from)] for quantity q (bootstrapQuantities order). */
export interface BootstrapRange {
  readonly from: number;
  readonly to: number;
  readonly blockLength: number;
  /** Rows of the data resampled (the fixed-b factor of the summary's intervals depends on blockLength / rows). */
  readonly rows: number;
  readonly draws: Float64Array;
}

/** The rows of `data` and its risk-free rate (0 when absent); throws when the lengths differ. */
function checkedLengths(data: BootstrapData): { n: number; rf: number | ArrayLike<number> } {
  const n = data.low.length;
  if (data.high.length !== n) throw new RangeError("bootstrap: low and high differ in length");
  const rf = data.riskFree ?? 0;
  if (typeof rf !== "number" && rf.length !== n) throw new RangeError("bootstrap: riskFree differs in length");
  return { n, rf };
}

/** Excess returns of both books. */
export function excessReturns(
  data: BootstrapData,
  allocate: (n: number) => Float64Array = (n) => new Float64Array(n),
): { low: Float64Array; high: Float64Array } {
  const { n, rf } = checkedLengths(data);
  // Every element is written below.
  const low = allocate(n);
  const high = allocate(n);
  for (let t = 0; t < n; t++) {
    const r = typeof rf === "number" ? rf : rf[t]!;
    low[t] = data.low[t]! - r;
    high[t] = data.high[t]! - r;
  }
  return { low, high };
}

/**
 * Excess returns of both books times the power of two that brings their largest absolute value into
 * [1, 2) (scaling.ts), and that `scale`: products of four returns stay inside double precision.
 */
export function scaledExcessReturns(
  data: BootstrapData,
  allocate: (n: number) => Float64Array = (n) => new Float64Array(n),
): { low: Float64Array; high: Float64Array; scale: number } {
  return excessReturnsScaledBy(data, largestExcessReturn(data), allocate);
}

/**
 * scaledExcessReturns when the largest |excess return| of either book is known (largestValues, from
 * the same differences): one pass, (x - r) * scale.
 */
export function excessReturnsScaledBy(
  data: BootstrapData,
  largest: number,
  allocate: (n: number) => Float64Array,
): { low: Float64Array; high: Float64Array; scale: number } {
  const { n, rf } = checkedLengths(data);
  const scale = scaleFor(largest);
  // Every element is written below.
  const low = allocate(n);
  const high = allocate(n);
  const rates = typeof rf === "number" ? null : rf;
  const rate = typeof rf === "number" ? rf : 0;
  const kernel = seriesKernel();
  if (kernel !== null) {
    // In the WebAssembly kernel chunk by chunk at every length (numerics/seriesKernel.ts: the same bits).
    inChunks(kernel, { x: data.low, y: data.high, rates }, (from, count) => {
      kernel.scaledExcess(count, rates !== null, +rate, scale);
      low.set(kernel.columns[0].subarray(0, count), from);
      high.set(kernel.columns[1].subarray(0, count), from);
    });
    return { low, high, scale };
  }
  // In chunks by a small function V8 optimises whole (numerics/seriesLoops.ts).
  for (let from = 0; from < n; from += CHUNK)
    scaledExcessChunk(data.low, data.high, rates, rate, scale, low, high, from, Math.min(n, from + CHUNK));
  return { low, high, scale };
}

/** Rows [from, to) of excessReturnsScaledBy. */
function scaledExcessChunk(
  lowIn: ArrayLike<number>,
  highIn: ArrayLike<number>,
  rates: ArrayLike<number> | null,
  rate: number,
  scale: number,
  low: Float64Array,
  high: Float64Array,
  from: number,
  to: number,
): void {
  const fixedRate = +rate; // a number to the optimiser: no boxing of rates[t] (seriesLoops.ts)
  for (let t = from; t < to; t++) {
    const r = rates === null ? fixedRate : rates[t]!;
    low[t] = (lowIn[t]! - r) * scale;
    high[t] = (highIn[t]! - r) * scale;
  }
}

/**
 * The `scale` of scaledExcessReturns without building the excess returns: the same power of two, from
 * the same differences (for passes that form the scaled excess returns as they go, e.g. assessPricing).
 */
export function excessReturnScale(data: BootstrapData): number {
  return scaleFor(largestExcessReturn(data));
}

/** The largest |low - r| and |high - r| over the rows (largestValues). */
function largestExcessReturn(data: BootstrapData): number {
  const { rf } = checkedLengths(data);
  const largest = largestValues(data.low, data.high, rf);
  return Math.max(largest.low, largest.high);
}

/**
 * The numeric mean block length: as given, or for "auto" min(3 sqrt(n), n/3), at least 1
 * (autoBlockLength; docs/methods.md §7.2).
 */
export function resolveBlockLength(data: BootstrapData, blockLength: number | "auto"): number {
  if (blockLength !== "auto") {
    validateBlockLength(blockLength);
    return blockLength;
  }
  return autoBlockLength(data.low.length);
}

/**
 * The "auto" mean block length for n rows: 3 sqrt(n), at most n/3, at least 1 (the largest block
 * Politis-White's rule allows). The bounds' statistics hang on squared returns whose volatility
 * clustering the Politis-White rule, applied to the returns (1.4 on a daily GARCH sample) or even to
 * their squares and cross-products (12 to 22), cuts off too early: their bootstrap standard errors
 * fell 30% and 18% short (docs/coverage-study.md). With this block the stationary bootstrap's variance
 * is a lag-window estimate whose weights (1 - 1/b)^k ~ exp(-k/b) match, to first order in b/n, the
 * downward bias of a Bartlett window of bandwidth 2b = 6 sqrt(n), the delta method's; intervals from
 * bootstrap standard errors take the fixed-b critical value of that bandwidth (hac/fixedB.ts).
 */
export function autoBlockLength(n: number): number {
  return Math.max(1, Math.min(3 * Math.sqrt(n), n / 3));
}

/** Runs replicates [from, to) of `plan` (its `replicates` field is not used here). */
export function bootstrapRange(data: BootstrapData, plan: Omit<BootstrapPlan, "replicates">, from: number, to: number): BootstrapRange {
  if (!(Number.isInteger(from) && Number.isInteger(to) && 0 <= from && from <= to)) {
    throw new RangeError(`bootstrapRange: invalid replicate range [${from}, ${to})`);
  }
  const blockLength = resolveBlockLength(data, plan.blockLength);
  // On scaled returns (scaledExcessReturns); the alphas, the only statistics with units, are scaled back.
  const { low, high, scale } = scaledExcessReturns(data);
  const n = low.length;
  if (n < 3) throw new RangeError("bootstrap: needs at least 3 observations");
  let lowMean = 0;
  let highMean = 0;
  for (let t = 0; t < n; t++) {
    lowMean += low[t]!;
    highMean += high[t]!;
  }
  lowMean /= n;
  highMean /= n;
  // Prefix sums of the centred series, doubled so that a block starting anywhere in [0, n) with length
  // <= n is contiguous: the sums over a block are two lookups whatever its length. Each prefix is
  // accumulated with Neumaier compensation and rounded once, so a block sum is exact to about
  // 2 n eps relative to the whole-sample sum of squares.
  const prefix = prefixSums(low, high, lowMean, highMean);
  const count = to - from;
  const draws = new Float64Array(quantityCount * count);
  const starts = new Int32Array(n);
  const lengths = new Int32Array(n);
  const sums = new Float64Array(5);
  for (let r = from; r < to; r++) {
    resampleSums(prefix, n, blockLength, replicateRandom(plan.seed, r), starts, lengths, sums);
    const sx = sums[0]!;
    const sy = sums[1]!;
    const sxx = sums[2]!;
    const syy = sums[3]!;
    const sxy = sums[4]!;
    writeStatistics(
      {
        n,
        weight: data.weight,
        lowMean: lowMean + sx / n,
        highMean: highMean + sy / n,
        lowVariance: (sxx - (sx * sx) / n) / (n - 1),
        highVariance: (syy - (sy * sy) / n) / (n - 1),
        covariance: (sxy - (sx * sy) / n) / (n - 1),
      },
      draws,
      r - from,
      count,
    );
  }
  if (scale !== 1) {
    for (const q of alphaQuantities) for (let i = q * count; i < (q + 1) * count; i++) draws[i] = draws[i]! / scale;
  }
  return { from, to, blockLength, rows: n, draws };
}

/** The positions of the CAPM alphas in `bootstrapQuantities` (the statistics in the returns' units). */
const alphaQuantities = [bootstrapQuantities.indexOf("lowCapmAlpha"), bootstrapQuantities.indexOf("highCapmAlpha")];

/** Running sums (length 2n + 1) of x, y, x^2, y^2 and xy over the centred series taken twice. */
interface PrefixSums {
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly xx: Float64Array;
  readonly yy: Float64Array;
  readonly xy: Float64Array;
}

function prefixSums(low: Float64Array, high: Float64Array, lowMean: number, highMean: number): PrefixSums {
  const n = low.length;
  const arrays = {
    x: new Float64Array(2 * n + 1),
    y: new Float64Array(2 * n + 1),
    xx: new Float64Array(2 * n + 1),
    yy: new Float64Array(2 * n + 1),
    xy: new Float64Array(2 * n + 1),
  };
  const targets = [arrays.x, arrays.y, arrays.xx, arrays.yy, arrays.xy];
  const sum = new Float64Array(5);
  const carry = new Float64Array(5);
  const terms = new Float64Array(5);
  for (let t = 0; t < 2 * n; t++) {
    const dx = low[t % n]! - lowMean;
    const dy = high[t % n]! - highMean;
    terms[0] = dx;
    terms[1] = dy;
    terms[2] = dx * dx;
    terms[3] = dy * dy;
    terms[4] = dx * dy;
    for (let q = 0; q < 5; q++) {
      const a = sum[q]!;
      const b = terms[q]!;
      const next = a + b;
      carry[q] = carry[q]! + (Math.abs(a) >= Math.abs(b) ? a - next + b : b - next + a);
      sum[q] = next;
      targets[q]![t + 1] = next + carry[q]!;
    }
  }
  return arrays;
}

/** Sums of x, y, x^2, y^2 and xy over one resample, from the prefix sums, into `sums`. */
function resampleSums(
  prefix: PrefixSums,
  n: number,
  blockLength: number,
  random: ReturnType<typeof replicateRandom>,
  starts: Int32Array,
  lengths: Int32Array,
  sums: Float64Array,
): void {
  const blocks = drawBlocks(n, blockLength, random, starts, lengths);
  const { x, y, xx, yy, xy } = prefix;
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (let b = 0; b < blocks; b++) {
    const from = starts[b]!;
    const to = from + lengths[b]!;
    sx += x[to]! - x[from]!;
    sy += y[to]! - y[from]!;
    sxx += xx[to]! - xx[from]!;
    syy += yy[to]! - yy[from]!;
    sxy += xy[to]! - xy[from]!;
  }
  sums[0] = sx;
  sums[1] = sy;
  sums[2] = sxx;
  sums[3] = syy;
  sums[4] = sxy;
}

/** Joins ranges that tile [0, replicates) (in any order) into one range of all replicates. */
export function mergeBootstrapRanges(ranges: readonly BootstrapRange[], replicates: number): BootstrapRange {
  const sorted = [...ranges].sort((a, b) => a.from - b.from);
  let next = 0;
  for (const range of sorted) {
    if (range.from !== next) throw new RangeError(`mergeBootstrapRanges: replicates [${next}, ${range.from}) are missing or overlap`);
    if (range.blockLength !== sorted[0]!.blockLength) throw new RangeError("mergeBootstrapRanges: ranges used different block lengths");
    if (range.rows !== sorted[0]!.rows) throw new RangeError("mergeBootstrapRanges: ranges resampled different data");
    next = range.to;
  }
  if (next !== replicates) throw new RangeError(`mergeBootstrapRanges: ranges end at ${next}, expected ${replicates}`);
  const draws = new Float64Array(quantityCount * replicates);
  for (const range of sorted) {
    const count = range.to - range.from;
    for (let q = 0; q < quantityCount; q++) {
      draws.set(range.draws.subarray(q * count, (q + 1) * count), q * replicates + range.from);
    }
  }
  return { from: 0, to: replicates, blockLength: sorted[0]?.blockLength ?? 1, rows: sorted[0]?.rows ?? 0, draws };
}
