/**
 * Whether the data can determine their moments in double precision (docs/methods.md §29).
 *
 * - Magnitudes: each book's largest absolute excess return lies within `magnitudeRange` (its square,
 *   the variance, is then a normal double whatever scale the core computes at) and the two books'
 *   are within `magnitudeRatio` of each other (they are scaled by one factor).
 * - Cancellation: every value is rounded to within u = 2^-52 of its size when it is read and when the
 *   risk-free return is subtracted, so excess return t carries an error of at most u R, with R a
 *   bound on |excess| + |risk-free| over the rows (the series' rounding scale). To first order such
 *   errors change a variance by at most 2 u R sd sqrt(n / (n - 1)) and the covariance by at most
 *   u sqrt(n / (n - 1)) (sd_low R_high + sd_high R_low) (Cauchy-Schwarz on sum_t d_t e_t). A variance
 *   or covariance that this bound could change by more than `cancellationTolerance` of its value is
 *   not determined by the data: a series whose variance is rounding is constant in effect (solve fails
 *   as for a constant series), a covariance that is rounding has no sign (no identified set). Two
 *   columns 0.01 and 0.02 that differ only by 1e-17 are the classic case: their variances (about
 *   1e-35) are at the level of the rounding of numbers of size 0.01 (2.2e-18, squared and summed).
 */

import type { DiagnosticDetail } from "./diagnostics.js";
import type { MomentSummary } from "./identify.js";
import { CHUNK } from "./moments.js";
import { inChunks, seriesKernel } from "./numerics/seriesKernel.js";
import { magnitudeRange, magnitudeRatio } from "./parameters.js";

/** Machine epsilon of doubles, 2^-52: a bound on the relative rounding of a value read or subtracted. */
const unitRoundoff = 2 ** -52;

/** The largest share of a variance or covariance that rounding may change before it is refused. */
export const cancellationTolerance = 1e-5;

/** Each book's rounding scale: a bound on |excess return| + |risk-free return| over the rows. */
export interface RoundingScales {
  readonly low: number;
  readonly high: number;
}

/** The largest |low - rf| and |high - rf| over the rows (each book's magnitude), and the largest |rf|. */
export interface LargestValues {
  readonly low: number;
  readonly high: number;
  readonly riskFree: number;
}

/**
 * The largest magnitudes over the rows; in the WebAssembly kernel (numerics/seriesKernel.ts, the same
 * numbers) unless `useKernel` is false.
 */
export function largestValues(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  useKernel = true,
): LargestValues {
  const rates = typeof riskFree === "number" ? null : riskFree;
  const rate = typeof riskFree === "number" ? riskFree : 0;
  // [low, high, riskFree], carried from chunk to chunk (see largestChunk).
  const state = Float64Array.of(0, 0, rates === null ? Math.abs(rate) : 0);
  const n = low.length;
  const kernel = useKernel ? seriesKernel() : null;
  if (kernel !== null) {
    kernel.state.set(state);
    inChunks(kernel, { x: low, y: high, rates }, (_, count) => kernel.largest(count, rates !== null, +rate));
    state.set(kernel.state.subarray(0, 3));
  } else for (let from = 0; from < n; from += CHUNK) largestChunk(low, high, rates, rate, from, Math.min(n, from + CHUNK), state);
  return { low: state[0]!, high: state[1]!, riskFree: state[2]! };
}

/**
 * Rows [from, to) of largestValues, continuing `state`: a small function V8 optimises whole (one long
 * loop with running maxima runs in on-stack-replaced code on Node 20, boxing them; see moments.ts).
 */
function largestChunk(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  rates: ArrayLike<number> | null,
  rate: number,
  from: number,
  to: number,
  state: Float64Array,
): void {
  let l = state[0]!;
  let h = state[1]!;
  let r = state[2]!;
  const fixedRate = +rate; // a number to the optimiser: no boxing of rates[t] (seriesLoops.ts)
  for (let t = from; t < to; t++) {
    const at = rates === null ? fixedRate : rates[t]!;
    l = Math.max(l, Math.abs(low[t]! - at));
    h = Math.max(h, Math.abs(high[t]! - at));
    r = Math.max(r, Math.abs(at));
  }
  state[0] = l;
  state[1] = h;
  state[2] = r;
}

/** The magnitudes of both books' excess returns, or the first one out of range (or too far from the other). */
export function magnitudeIssue(largestLow: number, largestHigh: number): DiagnosticDetail | null {
  const outside = (x: number): boolean => x > 0 && (x < magnitudeRange.min || x > magnitudeRange.max);
  if (outside(largestLow)) return { code: "magnitude-out-of-range", series: "low", largest: largestLow, other: null };
  if (outside(largestHigh)) return { code: "magnitude-out-of-range", series: "high", largest: largestHigh, other: null };
  if (largestLow > 0 && largestHigh > 0) {
    if (largestHigh > largestLow * magnitudeRatio)
      return { code: "magnitude-out-of-range", series: "low", largest: largestLow, other: largestHigh };
    if (largestLow > largestHigh * magnitudeRatio)
      return { code: "magnitude-out-of-range", series: "high", largest: largestHigh, other: largestLow };
  }
  return null;
}

/** sqrt(n / (n - 1)): the Cauchy-Schwarz factor of the bounds above. */
const factor = (n: number): number => Math.sqrt(n / (n - 1));

/** The bound on the rounding error of a variance with this standard deviation and rounding scale. */
export function varianceRoundingError(n: number, variance: number, scale: number): number {
  return 2 * unitRoundoff * scale * Math.sqrt(variance) * factor(n);
}

/**
 * The first variance (low, high, then the market proxy's) that rounding could change by more than
 * the tolerance: a series constant in effect; null when all three are determined.
 */
export function varianceCancellation(n: number, m: MomentSummary, marketVariance: number, scales: RoundingScales): DiagnosticDetail | null {
  const w = m.weight;
  const marketScale = w * scales.low + (1 - w) * scales.high;
  // Low, high, then the market: the first that fails is reported (written out, as roll asks this of every window).
  return (
    varianceCheck(n, "low", m.lowVariance, scales.low) ??
    varianceCheck(n, "high", m.highVariance, scales.high) ??
    varianceCheck(n, "market", marketVariance, marketScale)
  );
}

function varianceCheck(n: number, quantity: "low" | "high" | "market", variance: number, scale: number): DiagnosticDetail | null {
  const roundingError = varianceRoundingError(n, variance, scale);
  return roundingError > cancellationTolerance * variance ? { code: "cancellation", quantity, value: variance, roundingError } : null;
}

/** The covariance when rounding could change it by more than the tolerance (its sign is then not determined); else null. */
export function covarianceCancellation(n: number, m: MomentSummary, scales: RoundingScales): DiagnosticDetail | null {
  const roundingError = unitRoundoff * factor(n) * (Math.sqrt(m.lowVariance) * scales.high + Math.sqrt(m.highVariance) * scales.low);
  const c = m.covariance;
  return roundingError > cancellationTolerance * Math.abs(c)
    ? { code: "cancellation", quantity: "covariance", value: c, roundingError }
    : null;
}

/**
 * A window's rounding scale from its own moments: |x_t| <= |mean| + sqrt(S), S the centred sum of
 * squares, so |mean| + sqrt(S) + the largest |risk-free return| bounds |excess| + |risk-free|.
 */
export function boundedScale(mean: number, centredSum: number, largestRiskFree: number): number {
  return Math.abs(mean) + Math.sqrt(Math.max(0, centredSum)) + largestRiskFree;
}
