/**
 * Delta-method standard errors of the bounds, the Imbens-Manski interval and the pricing test for one
 * window of rows (used by `roll --uncertainty`). The same computation as assessUncertainty's bounds
 * part (boundsDelta.ts, imbensManski.ts) and solve's pricing step (src/core/pricing), on the window's
 * excess returns only; O(window x lags) per window.
 */

import type { MomentSummary } from "../identify.js";
import { boundsDeltaFromData } from "./boundsDelta.js";
import { admissibleInterval, imbensManskiInterval } from "./imbensManski.js";
import { normalQuantile } from "../numerics/normal.js";
import { scaleFor } from "../scaling.js";
import type { HacOptions, LongRunMethod } from "./options.js";
import type { BetaInterval, PointwiseBound } from "./uncertaintyTypes.js";
import { assessPricing } from "../pricing/assessPricing.js";
import type { PricingVerdict } from "../pricing/momentInequalities.js";

export interface WindowUncertainty {
  readonly confidence: number;
  readonly bounds: {
    readonly lowBeta: { readonly min: PointwiseBound; readonly max: PointwiseBound };
    readonly highBeta: { readonly min: PointwiseBound; readonly max: PointwiseBound };
    readonly correlation: number;
  };
  readonly lowBeta: { readonly interval: BetaInterval };
  /** The window's return-implied beta (Fieller) and the test of "noise explains the alpha" (methods §30). */
  readonly pricing: WindowPricing | null;
}

export interface WindowPricing {
  readonly returnImpliedLowBeta: {
    readonly estimate: number | null;
    readonly stdError: number | null;
    /** Fieller's interval; null when unbounded (`bounded` false). */
    readonly lower: number | null;
    readonly upper: number | null;
    readonly bounded: boolean;
  };
  readonly pValue: number | null;
  readonly explainedPValue: number | null;
  readonly verdict: PricingVerdict | null;
}

/**
 * @param lowExcess,highExcess the whole excess-return series; the window is rows [start, end].
 * Returns null when the window has no identified set (C <= 0) or fewer than 10 rows.
 */
export function windowUncertainty(
  lowExcess: Float64Array,
  highExcess: Float64Array,
  start: number,
  end: number,
  summary: MomentSummary,
  options: { readonly confidence: number; readonly longRun: LongRunMethod; readonly hac?: HacOptions },
): WindowUncertainty | null {
  if (!(summary.covariance > 0) || end - start + 1 < 10) return null;
  // On the window's returns times a power of two (scaling.ts; the HAC sums hold fourth powers), with
  // the moments scaled to match: every result is unit-free.
  let largest = 0;
  for (let t = start; t <= end; t++) largest = Math.max(largest, Math.abs(lowExcess[t]!), Math.abs(highExcess[t]!));
  const scale = scaleFor(largest);
  const x = lowExcess.slice(start, end + 1).map((v) => v * scale);
  const y = highExcess.slice(start, end + 1).map((v) => v * scale);
  const square = scale * scale;
  const moments = {
    ...summary,
    lowVariance: summary.lowVariance * square,
    highVariance: summary.highVariance * square,
    covariance: summary.covariance * square,
  };
  const delta = boundsDeltaFromData(x, y, moments, options.longRun, options.hac ?? {}, options.confidence);
  const z = normalQuantile(1 - (1 - options.confidence) / 2);
  const pointwise = (b: { estimate: number; stdError: number; criticalFactor: number }): PointwiseBound => ({
    estimate: b.estimate,
    stdError: b.stdError,
    lower: b.estimate - z * b.criticalFactor * b.stdError,
    upper: b.estimate + z * b.criticalFactor * b.stdError,
  });
  const { min, max } = delta.lowBeta;
  const scaled = admissibleInterval(
    imbensManskiInterval(
      {
        lower: min.estimate,
        upper: max.estimate,
        lowerStdError: min.criticalFactor * min.stdError,
        upperStdError: max.criticalFactor * max.stdError,
      },
      options.confidence,
    ),
    summary.weight,
  );
  const interval = {
    ...scaled,
    criticalValue: { lower: scaled.criticalValue.lower * min.criticalFactor, upper: scaled.criticalValue.upper * max.criticalFactor },
  };
  return {
    confidence: options.confidence,
    bounds: {
      lowBeta: { min: pointwise(delta.lowBeta.min), max: pointwise(delta.lowBeta.max) },
      highBeta: { min: pointwise(delta.highBeta.min), max: pointwise(delta.highBeta.max) },
      correlation: delta.correlation,
    },
    lowBeta: { interval: { lower: interval.lower, upper: interval.upper, method: "imbens-manski", criticalValue: interval.criticalValue } },
    pricing: windowPricing(x, y, summary.weight, options),
  };
}

function windowPricing(
  x: Float64Array,
  y: Float64Array,
  weight: number,
  options: { readonly confidence: number; readonly longRun: LongRunMethod; readonly hac?: HacOptions },
): WindowPricing | null {
  const p = assessPricing(
    { low: x, high: y },
    { weight, confidence: options.confidence, longRun: options.longRun, hac: options.hac ?? {} },
  );
  if (p === null) return null;
  const { fieller } = p.returnImplied;
  return {
    returnImpliedLowBeta: {
      estimate: p.returnImplied.estimate,
      stdError: p.returnImplied.stdError,
      lower: fieller.shape === "bounded" ? fieller.lower : null,
      upper: fieller.shape === "bounded" ? fieller.upper : null,
      bounded: fieller.shape === "bounded",
    },
    pValue: p.test?.pValue ?? null,
    explainedPValue: p.test?.explainedPValue ?? null,
    verdict: p.test?.verdict ?? null,
  };
}
