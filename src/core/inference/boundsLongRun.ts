/**
 * Long-run variances of the two bound estimates, each from its own influence series, with the
 * bandwidth chosen on that series (docs/methods.md §4, "one bandwidth per bound").
 *
 * A bound theta = g(V_low, V_high, C) has, to first order, theta_hat - theta = mean_t f_t with the
 * scalar influence series f_t = grad g' (z_t - zbar) (z_t the moment contributions of boundsDelta.ts).
 * Its long-run variance is the kernel sum of f_t over T (kernelSum.ts), which is g' Omega g when Omega
 * and the sum share one bandwidth; here each bound's bandwidth is chosen on its own f_t, so that a
 * persistent component (the factor's squared returns under volatility clustering) sets the bandwidth
 * of the bound it drives instead of being averaged with the others.
 *
 * Bandwidth rules (HacOptions): a fixed `lags` L (bandwidth L + 1) or number for both; "auto"
 * (default) with the Bartlett kernel: S = 6 sqrt(T) (at most T) for both, with fixed-b critical values
 * (fixedB.ts); "newey-west-1994" or "andrews-1991" (or "auto" with the quadratic-spectral kernel, which
 * is Newey-West 1994 there): the rule applied to each f_t. The correlation of the two estimates comes
 * from the 2 x 2 kernel sum of (f_low, f_up) at the larger of the two bandwidths (a positive
 * semi-definite sum, so |correlation| <= 1). With the Bartlett kernel every sum is linear in T
 * (bartlettWindows.ts); no lag-by-lag pass is added.
 */

import { borrowSeries } from "../numerics/scratch.js";
import { inChunks, influenceKernel } from "../numerics/seriesKernel.js";
import { kernelSum } from "./hac/kernelSum.js";
import { bartlettFixedBFactor } from "./hac/fixedB.js";
import { defaultHac, type HacKernel, type HacOptions } from "./options.js";
import { CHUNK } from "../numerics/seriesLoops.js";

/** The multiple of sqrt(T) that the "auto" rule takes as each bound's Bartlett bandwidth. */
export const autoBandwidthPerRootT = 6;

export interface BoundLongRun {
  /** Long-run variance of the bound's influence series (the kernel sum over T). */
  readonly variance: number;
  /** The bandwidth used (0 when the series is identically 0). */
  readonly bandwidth: number;
  /** Highest lag with a positive weight (Bartlett), null for quadratic spectral. */
  readonly lags: number | null;
  /**
   * Fixed-b factor at the confidence level asked for: the fixed-b quantile over the normal one at
   * b = bandwidth/T (Bartlett kernel); 1 for the quadratic-spectral kernel.
   */
  readonly criticalFactor: number;
}

export interface BoundsLongRun {
  readonly kernel: HacKernel;
  readonly lower: BoundLongRun;
  readonly upper: BoundLongRun;
  /** Long-run covariance of the two influence series. */
  readonly covariance: number;
}

/** The scalar series grad' (z_t - zbar). */
export function influenceSeries(z: readonly Float64Array[], gradient: readonly number[]): Float64Array {
  const n = z[0]!.length;
  const means = z.map((column) => {
    let sum = 0;
    for (let t = 0; t < n; t++) sum += column[t]!;
    return sum / n;
  });
  const f = new Float64Array(n);
  z.forEach((column, a) => {
    const g = gradient[a]!;
    const m = means[a]!;
    if (g !== 0) for (let t = 0; t < n; t++) f[t] = f[t]! + g * (column[t]! - m);
  });
  return f;
}

/**
 * Long-run variances of the bounds' influence series and their covariance.
 * @param confidence the two-sided level of the intervals the fixed-b factor is for
 */
export function boundsLongRun(
  z: readonly Float64Array[],
  gradients: { readonly lower: readonly number[]; readonly upper: readonly number[] },
  hac: HacOptions,
  confidence: number,
): BoundsLongRun {
  return boundsLongRunOfSeries(influenceSeries(z, gradients.lower), influenceSeries(z, gradients.upper), hac, confidence);
}

/**
 * The two bounds' influence series straight from the excess returns x (low) and y (high), without the
 * three moment series z_t: the same numbers as `influenceSeries(momentSeries(x, y), gradient)` (the
 * same sums in the same order), in two arrays of n instead of five. They go through the WebAssembly
 * kernel (numerics/seriesKernel.ts, the same bits) chunk by chunk at every length unless `useKernel` is
 * false: a JavaScript loop runs unoptimised for its first tens of thousands of rows.
 */
export function boundInfluenceSeries(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  gradients: { readonly lower: readonly number[]; readonly upper: readonly number[] },
  useKernel = true,
): { lower: Float64Array; upper: Float64Array } {
  const n = x.length;
  const kernel = useKernel ? influenceKernel() : null;
  if (kernel !== null) {
    const rows = { x, y, rates: null };
    const { state } = kernel;
    state.fill(0, 0, 5);
    inChunks(kernel, rows, (_from, count) => kernel.plainSumsOfTwo(count));
    const mx = state[0]! / n;
    const my = state[1]! / n;
    inChunks(kernel, rows, (_from, count) => kernel.centredSumsOfTwo(count, mx, my));
    const [m0, m1, m2] = [state[2]! / n, state[3]! / n, state[4]! / n];
    kernel.parameters.set(gradients.lower.slice(0, 3));
    kernel.parameters.set(gradients.upper.slice(0, 3), 3);
    const lower = borrowSeries(n);
    const upper = borrowSeries(n);
    inChunks(kernel, rows, (from, count) => {
      kernel.influenceOfTwo(count, mx, my, m0, m1, m2);
      lower.set(kernel.columns[2].subarray(0, count), from);
      upper.set(kernel.columns[3].subarray(0, count), from);
    });
    return { lower, upper };
  }
  const [mx, my] = plainMeans(x, y);
  // In chunks by a small function V8 optimises whole (seriesLoops.ts).
  const sums = new Float64Array(3);
  for (let from = 0; from < n; from += CHUNK) centredChunk(x, y, mx, my, from, Math.min(n, from + CHUNK), sums);
  const [sxx, syy, sxy] = sums as unknown as [number, number, number];
  const means: Three = [sxx / n, syy / n, sxy / n];
  const fill = (g: readonly number[]) => fillInfluence(borrowSeries(n), x, y, mx, my, g as Three, means);
  return { lower: fill(gradients.lower), upper: fill(gradients.upper) };
}

type Three = readonly [number, number, number];

/**
 * One bound's influence series from the centred rows and the gradient g, column by column, skipping
 * zero gradients, as influenceSeries adds them (in chunks by a small function, numerics/seriesLoops.ts).
 */
function fillInfluence(
  f: Float64Array,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  mx: number,
  my: number,
  [g0, g1, g2]: Three,
  [m0, m1, m2]: Three,
): Float64Array {
  const n = f.length;
  for (let from = 0; from < n; from += CHUNK) influenceChunk(f, x, y, mx, my, g0, g1, g2, m0, m1, m2, from, Math.min(n, from + CHUNK));
  return f;
}

function influenceChunk(
  f: Float64Array,
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  mx: number,
  my: number,
  g0: number,
  g1: number,
  g2: number,
  m0: number,
  m1: number,
  m2: number,
  from: number,
  to: number,
): void {
  for (let t = from; t < to; t++) {
    const dx = x[t]! - mx;
    const dy = y[t]! - my;
    let v = 0;
    if (g0 !== 0) v = v + g0 * (dx * dx - m0);
    if (g1 !== 0) v = v + g1 * (dy * dy - m1);
    if (g2 !== 0) v = v + g2 * (dx * dy - m2);
    f[t] = v;
  }
}

/** The means of x and y by plain sums, in order (the moment series' convention, kept bit for bit). */
export function plainMeans(x: ArrayLike<number>, y: ArrayLike<number>): [number, number] {
  const n = x.length;
  const sums = new Float64Array(2);
  for (let from = 0; from < n; from += CHUNK) plainSumsChunk(x, y, from, Math.min(n, from + CHUNK), sums);
  return [sums[0]! / n, sums[1]! / n];
}

function plainSumsChunk(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, sums: Float64Array): void {
  let sx = sums[0]!;
  let sy = sums[1]!;
  for (let t = from; t < to; t++) {
    sx += x[t]!;
    sy += y[t]!;
  }
  sums[0] = sx;
  sums[1] = sy;
}

/** sums += (x - mx)^2, (y - my)^2, (x - mx)(y - my) over rows [from, to). */
function centredChunk(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  mx: number,
  my: number,
  from: number,
  to: number,
  sums: Float64Array,
): void {
  let sxx = sums[0]!;
  let syy = sums[1]!;
  let sxy = sums[2]!;
  for (let t = from; t < to; t++) {
    const dx = x[t]! - mx;
    const dy = y[t]! - my;
    sxx += dx * dx;
    syy += dy * dy;
    sxy += dx * dy;
  }
  sums[0] = sxx;
  sums[1] = syy;
  sums[2] = sxy;
}

/** `boundsLongRun` on the two influence series themselves (see boundInfluenceSeries). */
export function boundsLongRunOfSeries(lower: Float64Array, upper: Float64Array, hac: HacOptions, confidence: number): BoundsLongRun {
  const n = lower.length;
  const kernel = hac.kernel ?? defaultHac.kernel;
  const rule = hac.bandwidth ?? defaultHac.bandwidth;
  const common: HacOptions | null =
    hac.lags !== undefined
      ? hac
      : typeof rule === "number"
        ? hac
        : rule === "auto" && kernel === "bartlett"
          ? { ...hac, bandwidth: Math.min(autoBandwidthPerRootT * Math.sqrt(n), n) }
          : null;
  const factor = (bandwidth: number) => (kernel === "bartlett" ? bartlettFixedBFactor(bandwidth / n, confidence) : 1);
  // Newey-West 1994 with the Bartlett kernel rounds S down to the lag floor(S): weights 1 - j/(floor(S) + 1).
  const roundsToLag = (options: HacOptions) =>
    options.lags === undefined && kernel === "bartlett" && options.bandwidth === "newey-west-1994";
  const effective = (estimate: ReturnType<typeof kernelSum>, options: HacOptions) =>
    estimate.bandwidth > 0 && roundsToLag(options) && estimate.lags !== null ? estimate.lags + 1 : estimate.bandwidth;
  const one = (estimate: ReturnType<typeof kernelSum>, options: HacOptions, variance: number): BoundLongRun => ({
    variance,
    bandwidth: estimate.bandwidth,
    lags: estimate.lags,
    criticalFactor: factor(effective(estimate, options)),
  });
  if (common !== null) {
    // One bandwidth for both: a single 2 x 2 sum gives the variances and the covariance.
    const joint = kernelSum([lower, upper], common, [1, 1]);
    return {
      kernel,
      lower: one(joint, common, joint.sum[0]![0]! / n),
      upper: one(joint, common, joint.sum[1]![1]! / n),
      covariance: joint.sum[0]![1]! / n,
    };
  }
  const perStatistic: HacOptions = { ...hac, bandwidth: rule === "auto" ? "newey-west-1994" : rule };
  const lowerSum = kernelSum([lower], perStatistic, [1]);
  const upperSum = kernelSum([upper], perStatistic, [1]);
  const wider = Math.max(effective(lowerSum, perStatistic), effective(upperSum, perStatistic));
  const joint =
    // Both series identically 0 (the rules are then undefined): lag 0 alone, the same sum for every kernel.
    wider > 0
      ? kernelSum([lower, upper], { ...hac, bandwidth: wider }, [1, 1])
      : kernelSum([lower, upper], { ...hac, kernel: "bartlett", lags: 0 }, [1, 1]);
  const v11 = joint.sum[0]![0]!;
  const v22 = joint.sum[1]![1]!;
  const correlation = v11 > 0 && v22 > 0 ? joint.sum[0]![1]! / Math.sqrt(v11 * v22) : 0;
  const lowerVariance = lowerSum.sum[0]![0]! / n;
  const upperVariance = upperSum.sum[0]![0]! / n;
  return {
    kernel,
    lower: one(lowerSum, perStatistic, lowerVariance),
    upper: one(upperSum, perStatistic, upperVariance),
    covariance: correlation * Math.sqrt(Math.max(0, lowerVariance) * Math.max(0, upperVariance)),
  };
}
