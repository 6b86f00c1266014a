/**
 * Rolling and expanding windows: the sample moments, CAPM fits and identified set of every window
 * of a long sample, in O(1) amortised work per window. Pure: numbers in, values out.
 *
 * Conventions are solve's (solve.ts): excess returns r - rf formed row by row exactly as solve forms
 * them, market proxy M = w low + (1 - w) high, divisor n - 1. A window spec is either
 * - `{ kind: "window", size, step }`: rows [s, s + size - 1] for s = 0, step, 2 step, ... while the
 *   window fits in the sample (the first window starts at row 0; trailing rows that do not complete a
 *   window are not reported), or
 * - `{ kind: "expanding", minPeriods, step }`: rows [0, e] for e = minPeriods - 1, minPeriods - 1 + step, ...
 *
 * ## Method (moments)
 * Each window's means and centred sums are kept exactly as `crossProducts` (moments.ts) keeps them:
 * Welford's updates on data shifted by a reference row, every running mean and centred sum a
 * compensated (Neumaier) pair. A sliding window never *removes* a row (Welford's downdate subtracts
 * and accumulates absolute error from every row that ever passed through, which is ruinous after a
 * volatile stretch). Instead it uses the "two stacks" sliding-window aggregation (Hirzel, Schneider
 * & Tangwongsan 2017): the window [s, e] is split at a boundary b into
 * - an older part [s, b - 1], read from a table of suffix aggregates built backwards from b - 1
 *   (suffix[i] = moments of rows [i, b - 1]), and
 * - a newer part [b, e], a running Welford aggregate to which the entering rows are added,
 * and the two are combined with the pairwise merge of Chan, Golub & LeVeque (1983):
 *   mean = mean_A + d n_B / n,   S_xy = S_xy,A + S_xy,B + d_x d_y n_A n_B / n,   d = mean_B - mean_A.
 * When s reaches b the table is rebuilt over the current window (b = e + 1) and the newer part is
 * emptied. Every row is added once to the newer part and once to a suffix table, so the work is
 * O(1) amortised per row (about twice crossProducts' per-row work plus one merge per window), the
 * memory O(size), and each window's moments carry only the rounding of two from-scratch aggregates
 * and one merge: they agree with `crossProducts` on the window's rows to a few units in the last
 * place whatever came before (no drift, no periodic re-anchoring needed). Each part is shifted by
 * its own first row (the newer part) or last row (the suffix table), so price-level data lose no
 * digits; the merge forms d as (shift_B - shift_A) + (offset_B - offset_A).
 *
 * ## Method (CAPM and the set)
 * The regressions of each book on M are functions of the 2x2 moments (S_ll, S_hh, S_lh):
 *   S_MM = w^2 S_ll + 2 w (1 - w) S_lh + (1 - w)^2 S_hh,  S_lM = w S_ll + (1 - w) S_lh,
 *   beta_low = S_lM / S_MM,  alpha = mean_low - beta mean_M,
 *   SSR_low = (1 - w)^2 D / S_MM,  SSR_high = w^2 D / S_MM,  D = S_ll S_hh - S_lh^2,
 *   R^2_low = S_lM^2 / (S_ll S_MM), s^2 = SSR / (n - 2), se(beta) = s / sqrt(S_MM),
 *   se(alpha) = s sqrt(1/n + mean_M^2 / S_MM), residualVariance = SSR / (n - 1).
 * SSR is never formed as S_yy - S_xy^2 / S_xx: D is computed with error-free products (Dekker's
 * TwoProduct), so its only error is what the sums themselves carry, a relative eps / (1 - rho^2) with
 * rho the correlation of low and high (1e-14 at rho = 0.99). R^2 as a ratio stays accurate near 0.
 * S_MM has no cancellation when S_lh >= 0 (the only case with an identified set); with strongly
 * negatively correlated books it loses digits that a third series would keep. The identified set,
 * grid end points and landmarks come from `identifySet(summary, 2, sd_M / sqrt(n))`, as in solve.
 *
 * ## References
 * - Chan, T. F., Golub, G. H. & LeVeque, R. J. (1983), "Algorithms for computing the sample variance:
 *   analysis and recommendations", The American Statistician 37(3), 242-247.
 * - Welford, B. P. (1962), Technometrics 4(3), 419-420; Neumaier, A. (1974), ZAMM 54(1), 39-51.
 * - Hirzel, M., Schneider, S. & Tangwongsan, K. (2017), "Sliding-window aggregation algorithms:
 *   tutorial", DEBS 2017 (the two-stacks algorithm).
 * - Dekker, T. J. (1971), "A floating-point technique for extending the available precision",
 *   Numerische Mathematik 18, 224-242 (TwoProduct via Veltkamp splitting).
 */

import { diagnose, type Diagnostic } from "../diagnostics.js";
import { equalNoiseLowBeta, identifiedBounds, marketMoments, type MomentSummary } from "../identify.js";
import { returnImpliedLowBeta } from "../landmarks.js";
import { identifySet, minimumObservations } from "../solve.js";
import type { IdentifiedBounds, Landmarks, LineFit, Maybe } from "../types.js";

/** Which windows to compute. `step` is the distance between consecutive windows' ends (and starts). */
export type WindowSpec =
  | { readonly kind: "window"; readonly size: number; readonly step: number }
  | { readonly kind: "expanding"; readonly minPeriods: number; readonly step: number };

/** The CAPM fit of one book on the market proxy, with solve's field names (a subset of LineFit). */
export type CapmLine = Pick<LineFit, "alpha" | "beta" | "alphaStdErr" | "betaStdErr" | "rSquared" | "residualVariance">;

export interface CapmPair {
  readonly low: CapmLine;
  readonly high: CapmLine;
}

/** The moments of one window. */
export interface WindowMoments {
  /** Index of the window's first row in the input. */
  readonly start: number;
  /** Index of the window's last row (inclusive). */
  readonly end: number;
  readonly observations: number;
  /** Means, variances and covariance of the excess returns (divisor n - 1), as solve summarises them. */
  readonly summary: MomentSummary;
  /** Mean and variance (divisor n - 1) of the excess market proxy. */
  readonly market: { readonly mean: number; readonly variance: number };
  /** The CAPM fits; null when the market proxy is constant over the window (its beta is undefined). */
  readonly capm: Maybe<CapmPair>;
}

/** Everything rollSolve reports for one window. Field names follow solve's Solution. */
export interface WindowSolution extends WindowMoments {
  /** Null when the window is rejected (a diagnostic with severity "error" says why). */
  readonly bounds: Maybe<IdentifiedBounds>;
  readonly landmarks: Maybe<Landmarks>;
  readonly diagnostics: readonly Diagnostic[];
}

/** The number of windows `spec` gives on `length` rows (0 when the first window does not fit). */
export function windowCount(length: number, spec: WindowSpec): number {
  checkSpec(spec);
  const first = spec.kind === "window" ? spec.size : spec.minPeriods;
  return length < first ? 0 : Math.floor((length - first) / spec.step) + 1;
}

/**
 * The moments and CAPM fits of every window, in order.
 * @param riskFree one rate for every row, or a series aligned with low and high.
 * @throws RangeError on a programming error: series of different lengths, a weight outside (0, 1),
 *   a window smaller than 3 rows, or a step that is not a positive integer.
 */
export function rollingMoments(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
): WindowMoments[] {
  return Array.from(iterateRollingMoments(low, high, riskFree, weight, spec));
}

/** `rollingMoments` one window at a time (memory independent of the number of windows). */
export function* iterateRollingMoments(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
): Generator<WindowMoments, void, undefined> {
  for (const raw of scanWindows(low, high, riskFree, weight, spec)) yield describeWindow(raw, weight);
}

/**
 * The moments, CAPM fits, identified set and landmarks of every window: for each window what
 * `solve` reports on that window's rows (its bounds, CAPM fits and landmarks), without the grid.
 * A window in which a series is constant gets null capm, bounds and landmarks and a zero-variance
 * diagnostic, as solve fails on it.
 * @throws RangeError as rollingMoments.
 */
export function rollSolve(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
): WindowSolution[] {
  return Array.from(iterateRollSolve(low, high, riskFree, weight, spec));
}

/** `rollSolve` one window at a time (memory independent of the number of windows). */
export function* iterateRollSolve(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
): Generator<WindowSolution, void, undefined> {
  for (const raw of scanWindows(low, high, riskFree, weight, spec)) yield solveWindow(describeWindow(raw, weight));
}

/** The identified set of one window from its moments (solve's checks, in solve's order). */
export function solveWindow(window: WindowMoments): WindowSolution {
  const { start, end, observations, summary, market, capm } = window;
  const constant =
    summary.lowVariance === 0 ? "low" : summary.highVariance === 0 ? "high" : market.variance === 0 || capm === null ? "market" : null;
  if (constant !== null) {
    const diagnostics = [diagnose({ code: "zero-variance", series: constant })];
    return { start, end, observations, summary, market, capm: null, bounds: null, landmarks: null, diagnostics };
  }
  const { bounds, landmarks, diagnostics } = identifySet(summary, 2, Math.sqrt(market.variance) / Math.sqrt(observations));
  return { start, end, observations, summary, market, capm, bounds, landmarks, diagnostics };
}

/** Names of the per-window columns of `rollSolveColumns`, in order. */
export const windowColumnNames = [
  "lowMean",
  "highMean",
  "lowVariance",
  "highVariance",
  "covariance",
  "marketMean",
  "marketVariance",
  "lowAlpha",
  "lowBeta",
  "lowAlphaStdErr",
  "lowBetaStdErr",
  "lowRSquared",
  "lowResidualVariance",
  "highAlpha",
  "highBeta",
  "highAlphaStdErr",
  "highBetaStdErr",
  "highRSquared",
  "highResidualVariance",
  "lowBetaMin",
  "lowBetaMax",
  "highBetaMin",
  "highBetaMax",
  "factorVarianceMin",
  "factorVarianceMax",
  "lowNoiseFreeLowBeta",
  "highNoiseFreeLowBeta",
  "equalNoiseLowBeta",
  "capmConsistentLowBeta",
  "returnImpliedLowBeta",
] as const;
export type WindowColumnName = (typeof windowColumnNames)[number];

/** rollSolve's numbers as columns: one Float64Array per quantity, NaN where rollSolve reports null. */
export interface WindowColumns {
  readonly count: number;
  readonly start: Int32Array;
  readonly end: Int32Array;
  readonly observations: Int32Array;
  readonly columns: Readonly<Record<WindowColumnName, Float64Array>>;
}

/**
 * The numbers of `rollSolve` for every window as typed-array columns, with the landmarks reduced to
 * their low structural betas: no objects per window (no Candidate, no diagnostic text), so a
 * million windows cost memory for the columns only and a fraction of rollSolve's time. The values
 * are the ones rollSolve reports (the same moments, the same closed forms of identify.ts and
 * landmarks.ts); a window rollSolve rejects (constant series, C <= 0, non-finite set) has NaN bounds
 * and landmarks, and a window without CAPM fits NaN CAPM columns.
 */
export function rollSolveColumns(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
): WindowColumns {
  const count = windowCount(low.length, spec);
  const start = new Int32Array(count);
  const end = new Int32Array(count);
  const observations = new Int32Array(count);
  const columns = Object.fromEntries(windowColumnNames.map((name) => [name, new Float64Array(count).fill(Number.NaN)])) as Record<
    WindowColumnName,
    Float64Array
  >;
  const c = columns;
  let k = 0;
  for (const raw of scanWindows(low, high, riskFree, weight, spec)) {
    const window = describeWindow(raw, weight);
    const { summary: m, market, capm } = window;
    start[k] = window.start;
    end[k] = window.end;
    observations[k] = window.observations;
    c.lowMean[k] = m.lowMean;
    c.highMean[k] = m.highMean;
    c.lowVariance[k] = m.lowVariance;
    c.highVariance[k] = m.highVariance;
    c.covariance[k] = m.covariance;
    c.marketMean[k] = market.mean;
    c.marketVariance[k] = market.variance;
    if (capm !== null) {
      c.lowAlpha[k] = capm.low.alpha;
      c.lowBeta[k] = capm.low.beta;
      c.lowAlphaStdErr[k] = capm.low.alphaStdErr;
      c.lowBetaStdErr[k] = capm.low.betaStdErr;
      c.lowRSquared[k] = capm.low.rSquared;
      c.lowResidualVariance[k] = capm.low.residualVariance;
      c.highAlpha[k] = capm.high.alpha;
      c.highBeta[k] = capm.high.beta;
      c.highAlphaStdErr[k] = capm.high.alphaStdErr;
      c.highBetaStdErr[k] = capm.high.betaStdErr;
      c.highRSquared[k] = capm.high.rSquared;
      c.highResidualVariance[k] = capm.high.residualVariance;
    }
    const solvable = m.lowVariance !== 0 && m.highVariance !== 0 && market.variance !== 0 && capm !== null && m.covariance > 0;
    if (solvable) writeSetColumns(c, k, m, market, window.observations);
    k++;
  }
  return { count, start, end, observations, columns };
}

/** Bounds and landmark low betas as identifySet and findLandmarks compute them (identify.ts, landmarks.ts). */
function writeSetColumns(
  c: Record<WindowColumnName, Float64Array>,
  k: number,
  m: MomentSummary,
  market: WindowMoments["market"],
  n: number,
): void {
  const bounds = identifiedBounds(m);
  const { min, max } = bounds.lowBeta;
  const w = m.weight;
  const v = 1 - w;
  const clamp = (x: number): number => Math.min(Math.max(x, min), max);
  const capmBeta = marketMoments(m).lowCapmBeta; // as findLandmarks takes it
  const lambda = w * m.lowMean + v * m.highMean;
  const implied = returnImpliedLowBeta(m.lowMean, lambda, Math.sqrt(market.variance) / Math.sqrt(n), w) ?? Number.NaN;
  const values = [
    min,
    max,
    bounds.highBeta.min,
    bounds.highBeta.max,
    bounds.factorVariance.min,
    bounds.factorVariance.max,
    max,
    min,
    clamp(equalNoiseLowBeta(m)),
    clamp(capmBeta),
  ];
  if (!values.every(Number.isFinite)) return; // identifySet's degenerate-moments rejection
  c.lowBetaMin[k] = values[0]!;
  c.lowBetaMax[k] = values[1]!;
  c.highBetaMin[k] = values[2]!;
  c.highBetaMax[k] = values[3]!;
  c.factorVarianceMin[k] = values[4]!;
  c.factorVarianceMax[k] = values[5]!;
  c.lowNoiseFreeLowBeta[k] = values[6]!;
  c.highNoiseFreeLowBeta[k] = values[7]!;
  c.equalNoiseLowBeta[k] = values[8]!;
  c.capmConsistentLowBeta[k] = values[9]!;
  c.returnImpliedLowBeta[k] = implied;
}

/** The raw sums of one window: means (full, unshifted) and centred sums of squares and products. */
export interface WindowSums {
  readonly start: number;
  readonly end: number;
  readonly observations: number;
  readonly lowMean: number;
  readonly highMean: number;
  readonly lowLow: number;
  readonly highHigh: number;
  readonly lowHigh: number;
}

/** The CAPM fits and summary of one window from its sums (the formulas of the module comment). */
export function describeWindow(sums: WindowSums, weight: number): WindowMoments {
  const { observations: n, lowMean, highMean, lowLow, highHigh, lowHigh } = sums;
  const w = weight;
  const v = 1 - w;
  const dof = n - 1;
  const summary: MomentSummary = {
    weight,
    lowMean,
    highMean,
    lowVariance: lowLow / dof,
    highVariance: highHigh / dof,
    covariance: lowHigh / dof,
  };
  const marketMean = w * lowMean + v * highMean;
  const marketSum = w * w * lowLow + 2 * w * v * lowHigh + v * v * highHigh;
  const market = { mean: marketMean, variance: marketSum / dof };
  if (!(marketSum > 0)) return { start: sums.start, end: sums.end, observations: n, summary, market, capm: null };
  const determinant = Math.max(0, productDifference(lowLow, highHigh, lowHigh, lowHigh));
  const line = (ownSum: number, withMarket: number, residualSum: number, mean: number): CapmLine => {
    const beta = withMarket / marketSum;
    const s2 = residualSum / (n - 2);
    const s = Math.sqrt(s2);
    return {
      alpha: mean - beta * marketMean,
      beta,
      alphaStdErr: s * Math.sqrt(1 / n + (marketMean * marketMean) / marketSum),
      betaStdErr: s / Math.sqrt(marketSum),
      rSquared: ownSum > 0 ? (withMarket / ownSum) * (withMarket / marketSum) : 1,
      residualVariance: residualSum / dof,
    };
  };
  const capm: CapmPair = {
    low: line(lowLow, w * lowLow + v * lowHigh, (v * v * determinant) / marketSum, lowMean),
    high: line(highHigh, w * lowHigh + v * highHigh, (w * w * determinant) / marketSum, highMean),
  };
  return { start: sums.start, end: sums.end, observations: n, summary, market, capm };
}

/** a b - c d with error-free products (Dekker 1971): only the final subtraction and sum round. */
function productDifference(a: number, b: number, c: number, d: number): number {
  const p = a * b;
  const q = c * d;
  return p - q + (twoProductError(a, b, p) - twoProductError(c, d, q));
}

const splitter = 134217729; // 2^27 + 1 (Veltkamp)

/** The rounding error of p = fl(a b), exactly: a b = p + error (no overflow for |a|, |b| < 1e150). */
function twoProductError(a: number, b: number, p: number): number {
  const ca = splitter * a;
  const ah = ca - (ca - a);
  const al = a - ah;
  const cb = splitter * b;
  const bh = cb - (cb - b);
  const bl = b - bh;
  return al * bl - (p - ah * bh - al * bh - ah * bl);
}

/**
 * A compensated Welford accumulator of two series, shifted by the first pair added (crossProducts'
 * recurrences for k = 2, kept incrementally).
 */
class PairAccumulator {
  n = 0;
  shiftLow = 0;
  shiftHigh = 0;
  private meanLow = 0;
  private meanLowError = 0;
  private meanHigh = 0;
  private meanHighError = 0;
  private lowLow = 0;
  private lowLowError = 0;
  private highHigh = 0;
  private highHighError = 0;
  private lowHigh = 0;
  private lowHighError = 0;

  reset(): void {
    this.n = 0;
    this.shiftLow = 0;
    this.shiftHigh = 0;
    this.meanLow = 0;
    this.meanLowError = 0;
    this.meanHigh = 0;
    this.meanHighError = 0;
    this.lowLow = 0;
    this.lowLowError = 0;
    this.highHigh = 0;
    this.highHighError = 0;
    this.lowHigh = 0;
    this.lowHighError = 0;
  }

  add(low: number, high: number): void {
    if (this.n === 0) {
      this.shiftLow = low;
      this.shiftHigh = high;
    }
    const inverseCount = 1 / (this.n + 1);
    const x = low - this.shiftLow;
    const y = high - this.shiftHigh;
    // Means: compensated m += (x - m) / n.
    const dx = x - (this.meanLow + this.meanLowError);
    let m = this.meanLow;
    let increment = dx * inverseCount;
    let updated = m + increment;
    this.meanLowError += Math.abs(m) >= Math.abs(increment) ? m - updated + increment : increment - updated + m;
    this.meanLow = updated;
    const ax = x - (updated + this.meanLowError);
    const dy = y - (this.meanHigh + this.meanHighError);
    m = this.meanHigh;
    increment = dy * inverseCount;
    updated = m + increment;
    this.meanHighError += Math.abs(m) >= Math.abs(increment) ? m - updated + increment : increment - updated + m;
    this.meanHigh = updated;
    const ay = y - (updated + this.meanHighError);
    // Centred sums: S_ij += (x_i - old mean_i)(x_j - new mean_j), compensated.
    let sum = this.lowLow;
    let term = dx * ax;
    updated = sum + term;
    this.lowLowError += Math.abs(sum) >= Math.abs(term) ? sum - updated + term : term - updated + sum;
    this.lowLow = updated;
    sum = this.highHigh;
    term = dy * ay;
    updated = sum + term;
    this.highHighError += Math.abs(sum) >= Math.abs(term) ? sum - updated + term : term - updated + sum;
    this.highHigh = updated;
    sum = this.lowHigh;
    term = dx * ay;
    updated = sum + term;
    this.lowHighError += Math.abs(sum) >= Math.abs(term) ? sum - updated + term : term - updated + sum;
    this.lowHigh = updated;
    this.n++;
  }

  /** Mean of the shifted low series (add shiftLow for the mean). */
  lowOffset(): number {
    return this.meanLow + this.meanLowError;
  }
  highOffset(): number {
    return this.meanHigh + this.meanHighError;
  }
  sumLowLow(): number {
    return this.lowLow + this.lowLowError;
  }
  sumHighHigh(): number {
    return this.highHigh + this.highHighError;
  }
  sumLowHigh(): number {
    return this.lowHigh + this.lowHighError;
  }
}

function checkSpec(spec: WindowSpec): void {
  const first = spec.kind === "window" ? spec.size : spec.minPeriods;
  const name = spec.kind === "window" ? "size" : "minPeriods";
  if (!(Number.isInteger(first) && first >= minimumObservations)) {
    throw new RangeError(`rolling: ${name} must be an integer >= ${minimumObservations}, got ${first}`);
  }
  if (!(Number.isInteger(spec.step) && spec.step >= 1)) throw new RangeError(`rolling: step must be an integer >= 1, got ${spec.step}`);
}

/** The sums of every window (the two-stacks scan of the module comment). */
export function* scanWindows(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
): Generator<WindowSums, void, undefined> {
  checkSpec(spec);
  if (!(weight > 0 && weight < 1)) throw new RangeError(`rolling: weight must lie in (0, 1), got ${weight}`);
  const length = low.length;
  if (high.length !== length) throw new RangeError("rolling: low and high differ in length");
  if (typeof riskFree !== "number" && riskFree.length !== length) throw new RangeError("rolling: riskFree differs in length");
  const rf = (t: number): number => (typeof riskFree === "number" ? riskFree : riskFree[t]!);
  const count = windowCount(length, spec);
  const newer = new PairAccumulator();

  if (spec.kind === "expanding") {
    let next = 0;
    for (let k = 0; k < count; k++) {
      const end = spec.minPeriods - 1 + k * spec.step;
      for (; next <= end; next++) {
        const r = rf(next);
        newer.add(low[next]! - r, high[next]! - r);
      }
      yield {
        start: 0,
        end,
        observations: end + 1,
        lowMean: newer.shiftLow + newer.lowOffset(),
        highMean: newer.shiftHigh + newer.highOffset(),
        lowLow: newer.sumLowLow(),
        highHigh: newer.sumHighHigh(),
        lowHigh: newer.sumLowHigh(),
      };
    }
    return;
  }

  const size = spec.size;
  // Suffix table of the older part: entry j holds rows [base + j, boundary - 1], shifted by row boundary - 1.
  const olderLow = new Float64Array(size);
  const olderHigh = new Float64Array(size);
  const olderLowLow = new Float64Array(size);
  const olderHighHigh = new Float64Array(size);
  const olderLowHigh = new Float64Array(size);
  const builder = new PairAccumulator();
  let olderShiftLow = 0;
  let olderShiftHigh = 0;
  let base = 0;
  let boundary = 0; // rows >= boundary are in the newer part
  let lastEnd = -1;
  for (let k = 0; k < count; k++) {
    const start = k * spec.step;
    const end = start + size - 1;
    if (start >= boundary) {
      // Rebuild the suffix table over [start, end]; the newer part starts empty at end + 1.
      builder.reset();
      for (let t = end; t >= start; t--) {
        const r = rf(t);
        builder.add(low[t]! - r, high[t]! - r);
        const j = t - start;
        olderLow[j] = builder.lowOffset();
        olderHigh[j] = builder.highOffset();
        olderLowLow[j] = builder.sumLowLow();
        olderHighHigh[j] = builder.sumHighHigh();
        olderLowHigh[j] = builder.sumLowHigh();
      }
      olderShiftLow = builder.shiftLow;
      olderShiftHigh = builder.shiftHigh;
      base = start;
      boundary = end + 1;
      newer.reset();
    } else {
      for (let t = lastEnd + 1; t <= end; t++) {
        const r = rf(t);
        newer.add(low[t]! - r, high[t]! - r);
      }
    }
    lastEnd = end;
    const j = start - base;
    const aLow = olderLow[j]!;
    const aHigh = olderHigh[j]!;
    const nA = boundary - start;
    const nB = newer.n;
    if (nB === 0) {
      yield {
        start,
        end,
        observations: size,
        lowMean: olderShiftLow + aLow,
        highMean: olderShiftHigh + aHigh,
        lowLow: olderLowLow[j]!,
        highHigh: olderHighHigh[j]!,
        lowHigh: olderLowHigh[j]!,
      };
      continue;
    }
    // Chan et al. merge of [start, boundary - 1] (A) and [boundary, end] (B).
    const dLow = newer.shiftLow - olderShiftLow + (newer.lowOffset() - aLow);
    const dHigh = newer.shiftHigh - olderShiftHigh + (newer.highOffset() - aHigh);
    const fraction = nB / size;
    const weightAB = nA * fraction;
    yield {
      start,
      end,
      observations: size,
      lowMean: olderShiftLow + (aLow + dLow * fraction),
      highMean: olderShiftHigh + (aHigh + dHigh * fraction),
      lowLow: olderLowLow[j]! + newer.sumLowLow() + dLow * dLow * weightAB,
      highHigh: olderHighHigh[j]! + newer.sumHighHigh() + dHigh * dHigh * weightAB,
      lowHigh: olderLowHigh[j]! + newer.sumLowHigh() + dLow * dHigh * weightAB,
    };
  }
}
