/**
 * The numbers of every window as typed-array columns (what `roll --format csv` writes): no object per
 * window, so a million windows cost memory for the columns only.
 */

import { covarianceCancellation } from "../cancellation.js";
import {
  equalNoiseLowBeta,
  identifiedBounds,
  isPerfectCorrelation,
  marketMoments,
  type MomentSummary,
  noiseFreePoint,
} from "../identify.js";
import { isIdentity, type Units, unitsOf } from "../scaling.js";
import { fiellerCriticalValue, returnImpliedLowBeta } from "../landmarks.js";
import { scanWindows } from "./scan.js";
import { type WindowSpec, windowCount } from "./windowPlan.js";
import { describeWindow, rollingScale, type WindowMoments, windowRejection, windowScales } from "./windows.js";

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

/**
 * rollSolve's numbers as columns: one Float64Array per quantity, NaN where rollSolve reports null;
 * the first `count` entries are the windows' (a block's arrays may be longer).
 */
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
  criticalValue: number = fiellerCriticalValue(),
): WindowColumns {
  const count = windowCount(low.length, spec);
  let whole: WindowColumns | null = null;
  for (const block of rollSolveColumnBlocks(low, high, riskFree, weight, spec, count, criticalValue)) whole = block;
  return whole as WindowColumns; // there is always one block, if empty
}

/**
 * `rollSolveColumns` `blockSize` windows at a time, in order: each block is yielded when its windows
 * are final, in the same arrays every time (a block's `count` windows at its start), so a long run
 * costs the memory of one block and no fresh pages. A block must be used before the next is asked
 * for. The numbers are rollSolveColumns'. A run without windows yields one empty block.
 */
export function* rollSolveColumnBlocks(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  spec: WindowSpec,
  blockSize: number,
  criticalValue: number = fiellerCriticalValue(),
): Generator<WindowColumns, void, undefined> {
  const total = windowCount(low.length, spec);
  const size = total === 0 ? 0 : Math.max(1, Math.min(blockSize, total));
  const start = new Int32Array(size);
  const end = new Int32Array(size);
  const observations = new Int32Array(size);
  const columns = Object.fromEntries(windowColumnNames.map((name) => [name, new Float64Array(size).fill(Number.NaN)])) as Record<
    WindowColumnName,
    Float64Array
  >;
  const c = columns;
  const block = (count: number): WindowColumns => ({ count, start, end, observations, columns });
  let k = 0; // the window's place in its block
  // Computed on scaled data as rollSolve computes them, then every column back in the data's units.
  const { scale, largestRiskFree } = rollingScale(low, high, riskFree);
  const units = unitsOf(scale);
  for (const raw of scanWindows(low, high, riskFree, weight, spec, scale)) {
    if (k === size) {
      unscaleColumns(c, units, k);
      yield block(k);
      for (const name of windowColumnNames) c[name].fill(Number.NaN);
      k = 0;
    }
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
    const solvable = windowRejection(window, largestRiskFree) === null && m.covariance > 0;
    if (solvable && covarianceCancellation(window.observations, m, windowScales(window, largestRiskFree)) === null)
      writeSetColumns(c, k, m, market, window.observations, criticalValue);
    k++;
  }
  unscaleColumns(c, units, k);
  yield block(k);
}

/** The columns in the returns' units (first) and in their squares' (second); the rest are unit-free. */
const firstUnitColumns: readonly WindowColumnName[] = [
  "lowMean",
  "highMean",
  "marketMean",
  "lowAlpha",
  "lowAlphaStdErr",
  "highAlpha",
  "highAlphaStdErr",
];
const secondUnitColumns: readonly WindowColumnName[] = [
  "lowVariance",
  "highVariance",
  "covariance",
  "marketVariance",
  "lowResidualVariance",
  "highResidualVariance",
  "factorVarianceMin",
  "factorVarianceMax",
];

/** The first `count` windows of the columns in the data's units. */
function unscaleColumns(c: Record<WindowColumnName, Float64Array>, u: Units, count: number): void {
  if (isIdentity(u)) return;
  const times = (column: Float64Array, factor: number): void => {
    for (let k = 0; k < count; k++) column[k] = column[k]! * factor;
  };
  for (const name of firstUnitColumns) times(c[name], u.first);
  for (const name of secondUnitColumns) times(c[name], u.second);
}

/** Bounds and landmark low betas as identifySet and findLandmarks compute them (identify.ts, landmarks.ts). */
function writeSetColumns(
  c: Record<WindowColumnName, Float64Array>,
  k: number,
  m: MomentSummary,
  market: WindowMoments["market"],
  n: number,
  criticalValue: number,
): void {
  // Perfectly correlated books: one point, as identifySet reports it.
  const correlation = m.covariance / (Math.sqrt(m.lowVariance) * Math.sqrt(m.highVariance));
  const bounds = isPerfectCorrelation(correlation) ? noiseFreePoint(m).bounds : identifiedBounds(m);
  const { min, max } = bounds.lowBeta;
  const w = m.weight;
  const v = 1 - w;
  const clamp = (x: number): number => Math.min(Math.max(x, min), max);
  const capmBeta = marketMoments(m).lowCapmBeta; // as findLandmarks takes it
  const lambda = w * m.lowMean + v * m.highMean;
  const implied = returnImpliedLowBeta(m.lowMean, lambda, Math.sqrt(market.variance) / Math.sqrt(n), w, criticalValue) ?? Number.NaN;
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
