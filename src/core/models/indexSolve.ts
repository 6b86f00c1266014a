/**
 * The model with an independent index on data (docs/methods.md §3): the point estimates, the sign
 * condition, negative noise variances (Heywood cases, reported as computed), whether the point lies
 * in the two-book identified set, delta-method standard errors with the long-run covariance of the
 * six centred products (as §4 does with three) and, when asked, bootstrap standard errors.
 *
 * Conventions: excess returns (the risk-free return subtracted from all three series); divisor
 * n - 1; the books are computed on the data times one power of two and the index times its own
 * (scaling.ts, §29), so results are in the data's units: b_I in index units per unit of the factor
 * (which is in the books' units), phi and s_low, s_high in the books' units squared, s_I in the
 * index's.
 */

import { covarianceCancellation, varianceRoundingError, cancellationTolerance } from "../cancellation.js";
import { diagnose, type Diagnostic, type IndexCovariance } from "../diagnostics.js";
import { longRunCovarianceInPlace, sampleCovarianceOf } from "../inference/hac/longRun.js";
import type { HacOptions, LongRunMethod } from "../inference/options.js";
import { minimumForUncertainty } from "../inference/uncertaintyArguments.js";
import { welfordCrossProducts } from "../moments.js";
import { bilinear } from "../numerics/linearAlgebra.js";
import { magnitudeRange } from "../parameters.js";
import { scaleFor } from "../scaling.js";
import type { Interval } from "../types.js";
import { indexBootstrapStdErrors, type IndexBootstrapPlan } from "./indexBootstrap.js";
import { type IndexMoments, type IndexParameter, indexJacobian, indexParameterNames, indexPoint, momentPairs } from "./indexModel.js";

export interface IndexSample {
  readonly low: ArrayLike<number>;
  readonly high: ArrayLike<number>;
  readonly index: ArrayLike<number>;
  readonly riskFree?: number | ArrayLike<number>;
}

export interface IndexOptions {
  readonly weight: number;
  /** Delta-method standard errors with this long-run covariance; null: none. */
  readonly uncertainty: { readonly longRun: LongRunMethod; readonly hac: HacOptions } | null;
  /** Bootstrap standard errors; null: none. */
  readonly bootstrap: IndexBootstrapPlan | null;
  /** The two-book set of the low beta (null when there is none). */
  readonly lowBetaBounds: Interval | null;
}

export type IndexValues = Readonly<Record<IndexParameter, number | null>>;

export interface IndexSolution extends IndexValues {
  /** C_LH C_LI C_HI > 0; null when the estimates are not identified. */
  readonly signCondition: boolean | null;
  /** The sign condition holds and no noise variance is negative. */
  readonly admissible: boolean | null;
  /** The low beta lies within the two-book identified set; null without a set or an estimate. */
  readonly insideSet: boolean | null;
  /** Delta-method standard errors; null when not asked for, with fewer than 10 rows, or without estimates. */
  readonly stdErrors: IndexValues | null;
  readonly bootstrapStdErrors: IndexValues | null;
  readonly diagnostics: readonly Diagnostic[];
}

const nothing = Object.fromEntries(indexParameterNames.map((name) => [name, null])) as unknown as IndexValues;

function unidentified(diagnostic: Diagnostic): IndexSolution {
  return {
    ...nothing,
    signCondition: null,
    admissible: null,
    insideSet: null,
    stdErrors: null,
    bootstrapStdErrors: null,
    diagnostics: [diagnostic],
  };
}

/** The model with an index on aligned series (checked by the caller: finite, aligned, at least 3 rows). */
export function solveIndex(sample: IndexSample, options: IndexOptions): IndexSolution {
  const n = sample.low.length;
  const rf = sample.riskFree ?? 0;
  const rate = (t: number): number => (typeof rf === "number" ? rf : rf[t]!);
  const excess = (s: ArrayLike<number>) => Float64Array.from({ length: n }, (_, t) => s[t]! - rate(t));
  const raw = [excess(sample.low), excess(sample.high), excess(sample.index)] as const;
  const largest = raw.map((s) => s.reduce((a, v) => Math.max(a, Math.abs(v)), 0));
  let largestRate = typeof rf === "number" ? Math.abs(rf) : 0;
  for (let t = 0; t < n; t++) largestRate = Math.max(largestRate, Math.abs(rate(t)));
  const indexLargest = largest[2]!;
  if (indexLargest > 0 && (indexLargest < magnitudeRange.min || indexLargest > magnitudeRange.max)) {
    return unidentified(diagnose({ code: "index-out-of-range", largest: indexLargest }));
  }
  // The books times p (as solve scales them), the index times its own q; each result back in its units.
  const p = scaleFor(Math.max(largest[0]!, largest[1]!));
  const q = scaleFor(indexLargest);
  const factors = [p, p, q];
  const series = raw.map((s, i) => s.map((v) => v * factors[i]!)) as unknown as [Float64Array, Float64Array, Float64Array];
  const roundingScale = largest.map((l, i) => (l + largestRate) * factors[i]!);
  const cp = welfordCrossProducts(series);
  const cov = (i: number, j: number): number => cp.sums[i]![j]! / (n - 1);
  const w = options.weight;
  const m: IndexMoments = {
    weight: w,
    lowVariance: cov(0, 0),
    highVariance: cov(1, 1),
    indexVariance: cov(2, 2),
    lowHigh: cov(0, 1),
    lowIndex: cov(0, 2),
    highIndex: cov(1, 2),
  };
  const vi = m.indexVariance;
  if (vi === 0 || varianceRoundingError(n, vi, roundingScale[2]!) > cancellationTolerance * vi) {
    return unidentified(diagnose({ code: "index-constant", variance: vi / (q * q) }));
  }
  // Every covariance the estimates divide by must have a sign the data determine.
  const marketVariance = w * w * m.lowVariance + 2 * w * (1 - w) * m.lowHigh + (1 - w) * (1 - w) * m.highVariance;
  const marketScale = w * roundingScale[0]! + (1 - w) * roundingScale[1]!;
  const checks: [IndexCovariance, number, number, number, number, number, number][] = [
    ["lowHigh", m.lowHigh, m.lowVariance, m.highVariance, roundingScale[0]!, roundingScale[1]!, p * p],
    ["lowIndex", m.lowIndex, m.lowVariance, vi, roundingScale[0]!, roundingScale[2]!, p * q],
    ["highIndex", m.highIndex, m.highVariance, vi, roundingScale[1]!, roundingScale[2]!, p * q],
    ["marketIndex", w * m.lowIndex + (1 - w) * m.highIndex, marketVariance, vi, marketScale, roundingScale[2]!, p * q],
  ];
  for (const [quantity, c, va, vb, ra, rb, unit] of checks) {
    const summary = { weight: w, lowMean: 0, highMean: 0, lowVariance: va, highVariance: vb, covariance: c };
    if (c === 0 || covarianceCancellation(n, summary, { low: ra, high: rb }) !== null) {
      return unidentified(diagnose({ code: "index-not-identified", quantity, value: c / unit }));
    }
  }
  // Units of each parameter: b_I in index units per factor unit, variances in their series' units squared.
  const units: Record<IndexParameter, number> = {
    lowBeta: 1,
    highBeta: 1,
    indexLoading: p / q,
    factorVariance: 1 / (p * p),
    lowNoiseVariance: 1 / (p * p),
    highNoiseVariance: 1 / (p * p),
    indexNoiseVariance: 1 / (q * q),
  };
  const inUnits = (values: Readonly<Record<IndexParameter, number | null>>): IndexValues =>
    Object.fromEntries(
      indexParameterNames.map((name) => [name, values[name] === null ? null : values[name]! * units[name]]),
    ) as unknown as IndexValues;
  const point = indexPoint(m);
  const estimates = inUnits(point);
  const diagnostics: Diagnostic[] = [];
  const signCondition = Math.sign(m.lowHigh) * Math.sign(m.lowIndex) * Math.sign(m.highIndex) > 0;
  if (!signCondition) {
    diagnostics.push(
      diagnose({
        code: "index-sign-condition",
        lowHigh: m.lowHigh / (p * p),
        lowIndex: m.lowIndex / (p * q),
        highIndex: m.highIndex / (p * q),
      }),
    );
  }
  const noises = [
    ["low", estimates.lowNoiseVariance],
    ["high", estimates.highNoiseVariance],
    ["index", estimates.indexNoiseVariance],
  ] as const;
  for (const [which, value] of noises)
    if (value! < 0) diagnostics.push(diagnose({ code: "index-heywood", series: which, noiseVariance: value! }));
  const bounds = options.lowBetaBounds;
  const lowBeta = estimates.lowBeta!;
  return {
    ...estimates,
    signCondition,
    admissible: signCondition && noises.every(([, value]) => value! >= 0),
    insideSet: bounds === null ? null : lowBeta >= bounds.min && lowBeta <= bounds.max,
    stdErrors: options.uncertainty === null || n < minimumForUncertainty ? null : inUnits(deltaStdErrors(series, m, options.uncertainty)),
    bootstrapStdErrors: options.bootstrap === null ? null : inUnits(indexBootstrapStdErrors(series, w, options.bootstrap)),
    diagnostics,
  };
}

/**
 * Delta-method standard errors: sqrt(diag(J Omega J') / n), J the analytic Jacobian at the sample
 * moments, Omega the long-run (or iid) covariance of z_t = the six centred products of the three series.
 */
function deltaStdErrors(
  series: readonly [Float64Array, Float64Array, Float64Array],
  m: IndexMoments,
  settings: { readonly longRun: LongRunMethod; readonly hac: HacOptions },
): Record<IndexParameter, number> {
  const n = series[0].length;
  const centred = series.map((s) => {
    const mean = s.reduce((a, b) => a + b, 0) / n;
    return s.map((v) => v - mean);
  });
  const z = momentPairs.map(([a, b]) => centred[a]!.map((v, t) => v * centred[b]![t]!));
  const omega = settings.longRun === "iid" ? sampleCovarianceOf(z) : longRunCovarianceInPlace(z, settings.hac).covariance;
  const jacobian = indexJacobian(m);
  // A quadratic form of a positive semi-definite Omega: negative only by rounding, a standard error of 0.
  return Object.fromEntries(
    indexParameterNames.map((name, k) => [name, Math.sqrt(Math.max(0, bilinear(jacobian[k]!, omega, jacobian[k]!)) / n)]),
  ) as Record<IndexParameter, number>;
}
