/**
 * assessPricing: can noise in the measured betas explain the low book's CAPM alpha? (docs/methods.md §30)
 *
 * In the model the expected CAPM alpha of the structure at b is (b - beta) lambda (beta the CAPM beta,
 * lambda the mean excess market return), so the alphas noise can explain form the interval between
 * (Lb - beta) lambda and (U - beta) lambda over the identified set [Lb, U]; the observed alpha
 * x_bar - beta lambda lies in it exactly when the return-implied beta x_bar / lambda lies in [Lb, U].
 * This module reports, from one joint delta-method (HAC or iid) covariance of the influence series:
 * - the return-implied low beta with its delta-method standard error and Fieller's set (fieller.ts);
 * - the alpha decomposition: observed, explainable range with the standard errors of its ends, and
 *   the unexplained part (zero inside), for both books (the high book's is -w/(1-w) times the low's);
 * - the moment-inequality test of "noise explains the alpha" and its verdict (momentInequalities.ts).
 * Numbers are per period in the data's units; computed on the data scaled by a power of two.
 */

import { ROUNDING_ULPS } from "../regression.js";
import { excessReturnScale } from "../inference/bootstrap/replicates.js";
import { boundGradients } from "../inference/boundsDelta.js";
import type { ColumnPairs } from "../inference/hac/bartlettWindows.js";
import { longRunCovarianceInPlace, sampleCovarianceOf } from "../inference/hac/longRun.js";
import type { HacOptions, LongRunMethod } from "../inference/options.js";
import { excessCrossProducts } from "../moments.js";
import { normalQuantile } from "../numerics/normal.js";
import { CHUNK } from "../numerics/seriesLoops.js";
import { type InfluenceKernel, inChunks, influenceKernel, PRICING_ROWS } from "../numerics/seriesKernel.js";
import { borrowSeries, giveBack, withScratch } from "../numerics/scratch.js";
import type { SolvedMoments } from "../solve.js";
import type { ReturnSample } from "../types.js";
import { type FiellerSet, fiellerSet, ratioStdError } from "./fieller.js";
import { type MomentInequalityTest, momentInequalityTest } from "./momentInequalities.js";

export interface AlphaDecomposition {
  readonly observed: number;
  /** The observed alpha's interval: estimate -/+ z times its HAC standard error (null without one). */
  readonly observedLower: number | null;
  readonly observedUpper: number | null;
  readonly explainableMin: number;
  readonly explainableMax: number;
  readonly explainableMinStdError: number;
  readonly explainableMaxStdError: number;
  /** The observed alpha less the nearest explainable one: 0 inside the range. */
  readonly unexplained: number;
}

export interface ReturnImpliedInference {
  /** mean x / lambda; null when lambda is exactly 0. */
  readonly estimate: number | null;
  readonly stdError: number | null;
  readonly fieller: FiellerSet;
  /** lambda over its (HAC or iid) standard error. */
  readonly marketMeanTStat: number;
}

export interface Pricing {
  readonly confidence: number;
  readonly returnImplied: ReturnImpliedInference;
  /** Null when the statistics have no sampling variance (an exact fit): nothing to test. */
  readonly test: MomentInequalityTest | null;
  readonly alpha: { readonly low: AlphaDecomposition; readonly high: AlphaDecomposition };
}

export interface PricingOptions {
  readonly weight: number;
  readonly confidence: number;
  readonly longRun: LongRunMethod;
  readonly hac: HacOptions;
  /** HAC standard errors of the two CAPM alphas (per period, the data's units), for their intervals. */
  readonly alphaStdErrors?: { readonly low: number; readonly high: number };
  /**
   * The point figures alone (the decomposition and the return-implied ratio), without the influence
   * series and their covariance: every standard error is then 0 and the test null. For reports that
   * show no standard errors (solve --no-uncertainty).
   */
  readonly pointOnly?: boolean;
  /** The moments solveKeepingMoments formed for this sample and weight: used instead of a pass over the rows. */
  readonly solved?: SolvedMoments;
}

/** The pricing assessment of a solved sample whose books have a positive covariance; null otherwise. */
export function assessPricing(sample: ReturnSample, options: PricingOptions): Pricing | null {
  return withScratch(() => pricingOf(sample, options));
}

function pricingOf(sample: ReturnSample, options: PricingOptions): Pricing | null {
  const { weight: w, confidence } = options;
  const v = 1 - w;
  // The scaled excess returns x and y are formed as each pass goes, never stored: the same numbers
  // as scaledExcessReturns's, so the same results bit for bit.
  const rf = sample.riskFree ?? 0;
  const n = sample.low.length;
  // solve's scale is this one (a power of two from the same largest excess return) and its cross
  // products these: means and centred sums in one compensated pass (moments.ts).
  const solved = options.solved !== undefined && options.solved.sample === sample && options.solved.weight === w ? options.solved : null;
  const scale = solved?.scale ?? excessReturnScale({ ...sample, weight: w });
  const cp = solved?.crossProducts ?? excessCrossProducts(sample.low, sample.high, rf, w, scale);
  const mx = cp.means[0]!;
  const my = cp.means[1]!;
  const lambda = w * mx + v * my;
  const sxx = cp.sums[0]![0]!;
  const syy = cp.sums[1]![1]!;
  const sxy = cp.sums[0]![1]!;
  const moments = { weight: w, lowVariance: sxx / (n - 1), highVariance: syy / (n - 1), covariance: sxy / (n - 1) };
  if (!(moments.covariance > 0)) return null;
  const { lowVariance: vx, highVariance: vy, covariance: c } = moments;
  const lower = c / (v * vy + w * c);
  const upper = vx / (w * vx + v * c);
  const covXM = w * vx + v * c;
  const varM = w * w * vx + 2 * w * v * c + v * v * vy;
  const beta = covXM / varM;
  const { lower: gl, upper: gu } = boundGradients(moments);
  const eLow = (lower - beta) * lambda;
  const eHigh = (upper - beta) * lambda;

  const omega = options.pointOnly === true ? zeroMatrix(6) : influenceCovariance();
  const variance = (i: number, j: number): number => omega[i]![j]! / n;
  const se = (i: number): number => Math.sqrt(Math.max(0, variance(i, i)));
  const z = normalQuantile(1 - (1 - confidence) / 2);

  /** The covariance of the influence series of mu_x, lambda, d1 = mu_x - Lb lambda, d2 = U lambda - mu_x and the two ends. */
  function influenceCovariance(): number[][] {
    // Every element of the six series is written below before any is read.
    const series = Array.from({ length: 6 }, () => borrowSeries(n));
    fillInfluenceSeries(series as Six, sample.low, sample.high, rf, {
      scale,
      w,
      v,
      mx,
      my,
      vx,
      vy,
      c,
      lower,
      upper,
      lambda,
      beta,
      varM,
      gl,
      gu,
    });
    // Only the entries within (mu_x, lambda), (d1, d2) and the two ends are read below.
    const covariance =
      options.longRun === "iid"
        ? sampleCovarianceOf(series)
        : longRunCovarianceInPlace(series, options.hac, { within: readPairs }).covariance;
    giveBack(...series);
    return covariance;
  }

  const ratio = {
    numerator: mx,
    denominator: lambda,
    numeratorVariance: variance(0, 0),
    denominatorVariance: variance(1, 1),
    covariance: variance(0, 1),
  };
  const returnImplied: ReturnImpliedInference = {
    estimate: lambda === 0 ? null : mx / lambda,
    stdError: ratioStdError(ratio),
    fieller: fiellerSet(ratio, z),
    marketMeanTStat: se(1) > 0 ? lambda / se(1) : 0,
  };

  const d: [number, number] = [mx - lower * lambda, upper * lambda - mx];
  const seD: [number, number] = [se(2), se(3)];
  // Standard errors of rounding alone (one book an exact multiple of the other: d1 and d2 are 0 up to
  // the last digits) are an exact fit too: no test, as with an exact 0 (regression.ts, the same margin).
  const rounding =
    ROUNDING_ULPS * Number.EPSILON * (Math.abs(mx) + Math.abs(lower * lambda) + Math.abs(upper * lambda) + Math.sqrt(Math.abs(vx)));
  const test =
    seD[0] > rounding && seD[1] > rounding ? momentInequalityTest(d, seD, variance(2, 3) / (seD[0] * seD[1]), n, confidence) : null;

  const observed = mx - beta * lambda;
  const decomposition = (factor: number, alphaSe: number | undefined): AlphaDecomposition => {
    // factor 1 for the low book; -w/(1-w) for the high book (its alphas are that multiple of the low's).
    const ends = [factor * eLow, factor * eHigh];
    const ses = [Math.abs(factor) * se(4), Math.abs(factor) * se(5)];
    const minAt = ends[0]! <= ends[1]! ? 0 : 1;
    const a = factor * observed;
    const min = ends[minAt]!;
    const max = ends[1 - minAt]!;
    const unexplained = a < min ? a - min : a > max ? a - max : 0;
    return {
      observed: a / scale,
      observedLower: alphaSe === undefined ? null : a / scale - z * alphaSe,
      observedUpper: alphaSe === undefined ? null : a / scale + z * alphaSe,
      explainableMin: min / scale,
      explainableMax: max / scale,
      explainableMinStdError: ses[minAt]! / scale,
      explainableMaxStdError: ses[1 - minAt]! / scale,
      unexplained: unexplained / scale,
    };
  };
  return {
    confidence,
    returnImplied,
    test,
    alpha: { low: decomposition(1, options.alphaStdErrors?.low), high: decomposition(-w / v, options.alphaStdErrors?.high) },
  };
}

export type Six = [Float64Array, Float64Array, Float64Array, Float64Array, Float64Array, Float64Array];

/** What the influence series are made of: the point estimates and the bounds' gradients. */
export interface InfluenceTerms {
  readonly scale: number;
  readonly w: number;
  readonly v: number;
  readonly mx: number;
  readonly my: number;
  readonly vx: number;
  readonly vy: number;
  readonly c: number;
  readonly lower: number;
  readonly upper: number;
  readonly lambda: number;
  readonly beta: number;
  readonly varM: number;
  readonly gl: readonly number[];
  readonly gu: readonly number[];
}

/**
 * The six influence series of mu_x, lambda, d1, d2 and the two ends, row by row, in chunks by a
 * small function with the terms in locals, which V8 optimises as a whole (numerics/seriesLoops.ts);
 * in the WebAssembly kernel instead (numerics/seriesKernel.ts, the same bits), chunk by chunk at every
 * length, unless `useKernel` is false. Exported for the kernel's tests.
 */
export function fillInfluenceSeries(
  series: Six,
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  terms: InfluenceTerms,
  useKernel = true,
): void {
  const n = low.length;
  const kernel = useKernel ? influenceKernel() : null;
  if (kernel !== null) influenceInKernel(kernel, series, low, high, riskFree, terms);
  else for (let from = 0; from < n; from += CHUNK) influenceChunk(series, low, high, riskFree, terms, from, Math.min(n, from + CHUNK));
}

/** fillInfluenceSeries in the WebAssembly kernel, PRICING_ROWS rows at a time (the same bits). */
function influenceInKernel(
  kernel: InfluenceKernel,
  series: Six,
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  terms: InfluenceTerms,
): void {
  const { scale, w, v, mx, my, vx, vy, c, lower, upper, lambda, beta, varM, gl, gu } = terms;
  kernel.parameters.set([scale, w, v, mx, my, vx, vy, c, lower, upper, lambda, beta, varM, gl[1]!, gl[2]!, gu[0]!, gu[2]!]);
  const rates = typeof riskFree === "number" ? null : riskFree;
  const pass = (from: number, count: number): void => {
    kernel.pricingInfluence(count, rates !== null, rates === null ? +riskFree : 0);
    series.forEach((f, k) => f.set(kernel.pricingSeries(k, count), from));
  };
  inChunks(kernel, { x: low, y: high, rates }, pass, PRICING_ROWS);
}

function influenceChunk(
  [fa, fb, fd1, fd2, fe1, fe2]: Six,
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  terms: InfluenceTerms,
  from: number,
  to: number,
): void {
  const { scale, w, v, mx, my, vx, vy, c, lower, upper, lambda, beta, varM } = terms;
  // gl[0] and gu[1] are 0 (the lower bound does not move with V_low, nor the upper with V_high): unused, as before.
  const gl1 = terms.gl[1]!;
  const gl2 = terms.gl[2]!;
  const gu0 = terms.gu[0]!;
  const gu2 = terms.gu[2]!;
  const rates = typeof riskFree === "number" ? null : riskFree;
  const rate = typeof riskFree === "number" ? riskFree : 0;
  const fixedRate = +rate; // a number to the optimiser: no boxing of rates[t] (seriesLoops.ts)
  for (let t = from; t < to; t++) {
    const r = rates === null ? fixedRate : rates[t]!;
    const dx = (low[t]! - r) * scale - mx;
    const dy = (high[t]! - r) * scale - my;
    const zx = dx * dx - vx;
    const zy = dy * dy - vy;
    const zc = dx * dy - c;
    const ia = dx;
    const ib = w * dx + v * dy;
    const iL = gl1 * zy + gl2 * zc;
    const iU = gu0 * zx + gu2 * zc;
    const iBeta = (w * zx + v * zc - beta * (w * w * zx + 2 * w * v * zc + v * v * zy)) / varM;
    fa[t] = ia;
    fb[t] = ib;
    fd1[t] = ia - lower * ib - lambda * iL;
    fd2[t] = upper * ib + lambda * iU - ia;
    fe1[t] = lambda * (iL - iBeta) + (lower - beta) * ib;
    fe2[t] = lambda * (iU - iBeta) + (upper - beta) * ib;
  }
}

/** The pairs of influence series whose covariances the assessment reads: (0, 1), (2, 3), (4, 5). */
const readPairs: ColumnPairs = [
  [0, 1],
  [2, 3],
  [4, 5],
];

function zeroMatrix(k: number): number[][] {
  return Array.from({ length: k }, () => new Array<number>(k).fill(0));
}
