/**
 * Computing on data scaled to about 1, reporting in the data's own units.
 *
 * The core's formulas hold products of up to four returns (a variance times a variance in the CAPM
 * residual variances implied by a structure, fourth moments in the HAC sums), which underflow or
 * overflow long before the returns themselves do (returns of 1e-80 have fourth moments of 1e-320).
 * So the core multiplies the data by a power of two p that brings their largest absolute value into
 * [1, 2), computes, and multiplies each result back by its unit: 1/p for a return, a mean, an alpha or
 * a standard deviation, 1/p^2 for a variance or a covariance; betas, correlations, t statistics,
 * p-values, shares and Sharpe ratios are unit-free. Multiplying by a power of two is exact, so
 * the results are those of the unscaled computation bit for bit wherever it neither underflows
 * nor overflows (docs/methods.md §29: every formula is homogeneous in the returns).
 */

import { diagnose, type Diagnostic } from "./diagnostics.js";
import type { MomentSummary } from "./identify.js";
import type { Candidate, IdentifiedBounds, Landmarks, LineFit, Maybe, SampleMoments, SeriesMoments, Solution } from "./types.js";

/** The power of two p with magnitude p in [1, 2); 1 when the magnitude is 0 or not finite. */
export function scaleFor(magnitude: number): number {
  if (!(magnitude > 0 && Number.isFinite(magnitude))) return 1;
  let exponent = Math.floor(Math.log2(magnitude));
  // log2 may round across a power of two; correct it so that the scaled magnitude is in [1, 2).
  if (2 ** exponent > magnitude) exponent--;
  else if (2 ** (exponent + 1) <= magnitude) exponent++;
  return 2 ** -exponent;
}

/** Multiplies results back into the data's units: `first` for returns and means, `second` for variances. */
export interface Units {
  readonly first: number;
  readonly second: number;
}

/** The units of results computed on data multiplied by `scale`. */
export const unitsOf = (scale: number): Units => ({ first: 1 / scale, second: 1 / (scale * scale) });

const none: Units = { first: 1, second: 1 };
export const isIdentity = (units: Units): boolean => units.first === none.first && units.second === none.second;

export function unscaleSummary(m: MomentSummary, u: Units): MomentSummary {
  return {
    weight: m.weight,
    lowMean: m.lowMean * u.first,
    highMean: m.highMean * u.first,
    lowVariance: m.lowVariance * u.second,
    highVariance: m.highVariance * u.second,
    covariance: m.covariance * u.second,
  };
}

function unscaleSeries(s: SeriesMoments, u: Units): SeriesMoments {
  return { mean: s.mean * u.first, variance: s.variance * u.second, stdev: s.stdev * u.first, sharpeRatio: s.sharpeRatio };
}

export function unscaleMoments(m: SampleMoments, u: Units): SampleMoments {
  return {
    low: unscaleSeries(m.low, u),
    high: unscaleSeries(m.high, u),
    market: unscaleSeries(m.market, u),
    covariance: {
      lowHigh: m.covariance.lowHigh * u.second,
      lowMarket: m.covariance.lowMarket * u.second,
      highMarket: m.covariance.highMarket * u.second,
    },
    correlation: m.correlation,
  };
}

export function unscaleLineFit(fit: LineFit, u: Units): LineFit {
  return {
    ...fit,
    alpha: fit.alpha * u.first,
    alphaStdErr: fit.alphaStdErr * u.first,
    residualVariance: fit.residualVariance * u.second,
    residualStdError: fit.residualStdError * u.first,
    residualSumOfSquares: fit.residualSumOfSquares * u.second,
  };
}

export function unscaleCandidate(c: Candidate, u: Units): Candidate {
  return {
    ...c,
    factorVariance: c.factorVariance * u.second,
    lowNoiseVariance: c.lowNoiseVariance * u.second,
    highNoiseVariance: c.highNoiseVariance * u.second,
    impliedCapm: {
      ...c.impliedCapm,
      lowResidualVariance: c.impliedCapm.lowResidualVariance * u.second,
      highResidualVariance: c.impliedCapm.highResidualVariance * u.second,
    },
    expectedLowAlpha: c.expectedLowAlpha * u.first,
    expectedHighAlpha: c.expectedHighAlpha * u.first,
  };
}

export function unscaleBounds(b: Maybe<IdentifiedBounds>, u: Units): Maybe<IdentifiedBounds> {
  if (b === null) return null;
  return { ...b, factorVariance: { min: b.factorVariance.min * u.second, max: b.factorVariance.max * u.second } };
}

export function unscaleLandmarks(l: Maybe<Landmarks>, u: Units): Maybe<Landmarks> {
  if (l === null) return null;
  return {
    lowNoiseFree: unscaleCandidate(l.lowNoiseFree, u),
    highNoiseFree: unscaleCandidate(l.highNoiseFree, u),
    equalNoise: unscaleCandidate(l.equalNoise, u),
    capmConsistent: unscaleCandidate(l.capmConsistent, u),
    returnImplied: l.returnImplied === null ? null : unscaleCandidate(l.returnImplied, u),
  };
}

/** A diagnostic with its numbers (and so its message) in the data's units. */
export function unscaleDiagnostic(d: Diagnostic, u: Units): Diagnostic {
  const detail = d.detail;
  switch (detail.code) {
    case "nonpositive-covariance":
      return diagnose({ ...detail, covariance: detail.covariance * u.second });
    case "market-mean-near-zero":
      return diagnose({ ...detail, marketMean: detail.marketMean * u.first });
    case "cancellation":
      return diagnose({ ...detail, value: detail.value * u.second, roundingError: detail.roundingError * u.second });
    default:
      return d;
  }
}

/** The set, grid, landmarks and diagnostics of `identifySet`, in the data's units. */
export function unscaleIdentified(
  s: Pick<Solution, "bounds" | "grid" | "landmarks" | "diagnostics">,
  u: Units,
): Pick<Solution, "bounds" | "grid" | "landmarks" | "diagnostics"> {
  if (isIdentity(u)) return s;
  return {
    bounds: unscaleBounds(s.bounds, u),
    grid: s.grid.map((c) => unscaleCandidate(c, u)),
    landmarks: unscaleLandmarks(s.landmarks, u),
    diagnostics: s.diagnostics.map((d) => unscaleDiagnostic(d, u)),
  };
}

/** A solution computed on scaled data, in the data's units. */
export function unscaleSolution(s: Solution, u: Units): Solution {
  if (isIdentity(u)) return s;
  return {
    observations: s.observations,
    weight: s.weight,
    moments: unscaleMoments(s.moments, u),
    capm: { low: unscaleLineFit(s.capm.low, u), high: unscaleLineFit(s.capm.high, u) },
    ...unscaleIdentified(s, u),
  };
}
