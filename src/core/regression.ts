/**
 * Ordinary least squares of y on an intercept and one regressor, with classical standard errors.
 *
 * ## Conventions
 * beta = Sxy / Sxx and alpha = ybar - beta xbar from centred cross-products (never raw sums);
 * residuals are formed in a second pass, so the residual sum of squares does not come from the
 * cancellation-prone Syy - Sxy^2/Sxx. s^2 = SSR / (n - 2); se(beta) = s / sqrt(Sxx);
 * se(alpha) = s sqrt(1/n + xbar^2 / Sxx); t = estimate / se; p two-sided from Student's t with
 * n - 2 degrees of freedom; R^2 = 1 - SSR / Syy (centred). `residualVariance` is SSR / (n - 1), the
 * sample variance of the residuals with the same divisor as the moments, so that it equals the
 * residual variance a structure implies (docs/methods.md §1.5). A residual sum of squares within
 * rounding of 0 (an exact line) is 0, and the intercept within rounding of 0 with it.
 *
 * ## References
 * Greene, W. H., Econometric Analysis, ch. 3-4 (standard results); NIST StRD "Norris" for the check.
 */

import { CHUNK } from "./moments.js";
import { inChunks, seriesKernel } from "./numerics/seriesKernel.js";
import { studentTTwoSidedP } from "./numerics/studentT.js";
import type { LineFit } from "./types.js";

/**
 * Rounding's reach in units of the last place: a residual computed from data on an exact line is off
 * by a few (two subtractions and a product, each rounded); 32 leaves room, and a real fit's residuals
 * are larger by many orders of magnitude (R^2 would have to be 1 to about 28 digits).
 */
export const ROUNDING_ULPS = 32;

/** Means and centred sums of squares and cross-products of (x, y). */
export interface LineSums {
  readonly n: number;
  readonly xbar: number;
  readonly ybar: number;
  readonly sxx: number;
  readonly sxy: number;
  readonly syy: number;
}

/**
 * The fit from centred sums and the residual sum of squares computed from the data (second pass), for
 * callers that already hold the sums (solve fits both books from one pass over the data).
 */
export function lineFitFromSums(sums: LineSums, computedSsr: number): LineFit {
  const { n, xbar, ybar, sxx, sxy, syy } = sums;
  const beta = sxy / sxx;
  const fitted = ybar - beta * xbar;
  // An exact line (y = a + b x to the last digits: one book a multiple of the other) leaves residuals
  // of rounding alone; their sum of squares and the intercept's last digits are no evidence of
  // anything, so they are 0 (standard errors 0, no t-statistic or p-value), never a "significant" 1e-18.
  // Rounding scales with the raw values (their squares' sums), not only with their spread.
  const raw = syy + n * ybar * ybar + beta * beta * (sxx + n * xbar * xbar);
  const exact = computedSsr <= (ROUNDING_ULPS * Number.EPSILON) ** 2 * raw;
  const ssr = exact ? 0 : computedSsr;
  // The intercept's rounding scales with the data's size (their root mean square), not with the means.
  const size = Math.sqrt(syy / n) + Math.abs(ybar) + Math.abs(beta) * (Math.sqrt(sxx / n) + Math.abs(xbar));
  const alpha = exact && Math.abs(fitted) <= ROUNDING_ULPS * Number.EPSILON * size ? 0 : fitted;
  const s2 = ssr / (n - 2);
  const residualStdError = Math.sqrt(s2);
  const betaStdErr = residualStdError / Math.sqrt(sxx);
  const alphaStdErr = residualStdError * Math.sqrt(1 / n + (xbar * xbar) / sxx);
  const tStat = (estimate: number, se: number): number | null => (se > 0 ? estimate / se : null);
  const alphaTStat = tStat(alpha, alphaStdErr);
  const betaTStat = tStat(beta, betaStdErr);
  const pValue = (t: number | null): number | null => (t === null ? null : studentTTwoSidedP(t, n - 2));
  return {
    observations: n,
    alpha,
    beta,
    alphaStdErr,
    betaStdErr,
    alphaTStat,
    betaTStat,
    alphaPValue: pValue(alphaTStat),
    betaPValue: pValue(betaTStat),
    rSquared: syy > 0 ? 1 - ssr / syy : 1,
    residualVariance: ssr / (n - 1),
    residualStdError,
    residualSumOfSquares: ssr,
  };
}

/** Sum of squared residuals e = (y - ybar) - beta (x - xbar), Neumaier-compensated. */
export function residualSumOfSquares(x: ArrayLike<number>, y: ArrayLike<number>, xbar: number, ybar: number, beta: number): number {
  let sum = 0;
  let compensation = 0;
  for (let t = 0; t < x.length; t++) {
    const e = y[t]! - ybar - beta * (x[t]! - xbar);
    const term = e * e;
    const next = sum + term;
    compensation += sum >= term ? sum - next + term : term - next + sum;
    sum = next;
  }
  return sum + compensation;
}

/**
 * The residual sums of squares of solve's two CAPM fits in one pass, from the raw series: y = low - r
 * (then high - r) on x = w (low - r) + (1 - w)(high - r), formed on the fly exactly as
 * `excessCrossProducts` forms them, so each equals `residualSumOfSquares` on the built series bit for
 * bit (with the same `scale`). In chunks of rows, for the reason given in moments.ts (`CHUNK`); in the
 * WebAssembly kernel (numerics/seriesKernel.ts, the same bits) unless `useKernel` is false.
 */
export function excessResidualSums(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  riskFree: number | ArrayLike<number>,
  weight: number,
  xbar: number,
  lowLine: { readonly ybar: number; readonly beta: number },
  highLine: { readonly ybar: number; readonly beta: number },
  scale = 1,
  useKernel = true,
): [number, number] {
  const rates = typeof riskFree === "number" ? null : riskFree;
  const rate = typeof riskFree === "number" ? riskFree : 0;
  // Sums and compensations of the low and the high residuals.
  const state = new Float64Array(4);
  const fit = Float64Array.of(weight, xbar, lowLine.ybar, lowLine.beta, highLine.ybar, highLine.beta, scale);
  const n = low.length;
  const kernel = useKernel ? seriesKernel() : null;
  if (kernel !== null) {
    kernel.state.fill(0, 0, 4);
    kernel.parameters.set(fit);
    inChunks(kernel, { x: low, y: high, rates }, (_, count) => kernel.residuals(count, rates !== null, +rate));
    state.set(kernel.state.subarray(0, 4));
  } else for (let from = 0; from < n; from += CHUNK) residualChunk(low, high, rates, rate, fit, from, Math.min(n, from + CHUNK), state);
  return [state[0]! + state[1]!, state[2]! + state[3]!];
}

/** Rows [from, to) of excessResidualSums, continuing from and updating `state`. */
function residualChunk(
  low: ArrayLike<number>,
  high: ArrayLike<number>,
  rates: ArrayLike<number> | null,
  rate: number,
  fit: Float64Array,
  from: number,
  to: number,
  state: Float64Array,
): void {
  const weight = fit[0]!,
    xbar = fit[1]!,
    lowBar = fit[2]!,
    lowBeta = fit[3]!,
    highBar = fit[4]!,
    highBeta = fit[5]!,
    scale = fit[6]!;
  const other = 1 - weight;
  let lowSum = state[0]!,
    lowCompensation = state[1]!,
    highSum = state[2]!,
    highCompensation = state[3]!;
  const fixedRate = +rate; // a number to the optimiser: no boxing of rates[t] (seriesLoops.ts)
  for (let t = from; t < to; t++) {
    const r = rates === null ? fixedRate : rates[t]!;
    const l = (low[t]! - r) * scale;
    const h = (high[t]! - r) * scale;
    const m = weight * l + other * h;
    const el = l - lowBar - lowBeta * (m - xbar);
    let term = el * el;
    let next = lowSum + term;
    lowCompensation += lowSum >= term ? lowSum - next + term : term - next + lowSum;
    lowSum = next;
    const eh = h - highBar - highBeta * (m - xbar);
    term = eh * eh;
    next = highSum + term;
    highCompensation += highSum >= term ? highSum - next + term : term - next + highSum;
    highSum = next;
  }
  state[0] = lowSum;
  state[1] = lowCompensation;
  state[2] = highSum;
  state[3] = highCompensation;
}
