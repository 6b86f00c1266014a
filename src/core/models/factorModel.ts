/**
 * The one-factor model on k >= 3 portfolios whose weighted sum is the market proxy (docs/methods.md §31):
 *   r_i = a_i + b_i F + e_i,  sum_i w_i b_i = 1,  noises independent of F and of each other.
 * Fitted by maximum likelihood on the sample covariance (divisor n - 1) of the k series
 * (factorModelFit.ts), on the correlation scale (the fit is scale free) and carried back to the data's
 * units: b_i = lambda_i / (w' lambda), phi = (w' lambda)^2. Standard errors of the b_i: the inverse
 * information of (lambda, Psi), then the delta method through the normalisation. Each adjacent pair
 * (i, i + 1) also gets its two-book identified set (§1.2) with its own market proxy
 * w_i / (w_i + w_(i+1)), beside the factor model's betas in that pair's normalisation.
 */
import { diagnose, type Diagnostic } from "../diagnostics.js";
import { identifiedBounds } from "../identify.js";
import { chiSquareSurvival } from "../numerics/chiSquare.js";
import { type ColumnKernel, columnKernel, copyRows, AREA_ROWS } from "../numerics/seriesKernel.js";
import type { IdentifiedBounds } from "../types.js";
import { fitOneFactor } from "./factorModelFit.js";

export interface FactorPortfolio {
  readonly name: string;
  /** Its weight in the market proxy (the weights given, scaled to sum to 1). */
  readonly weight: number;
  readonly loading: number | null;
  readonly noiseVariance: number | null;
  readonly loadingStdError: number | null;
  readonly capmBeta: number | null;
}

export interface FactorPair {
  readonly low: string;
  readonly high: string;
  /** The low book's weight in the pair's own market proxy. */
  readonly weight: number;
  /** The two-book identified set of the pair; null when the covariance is not positive. */
  readonly bounds: Pick<IdentifiedBounds, "lowBeta" | "highBeta"> | null;
  /** The factor model's betas of the pair in the pair's normalisation. */
  readonly factorLowBeta: number | null;
  readonly factorHighBeta: number | null;
  /** The factor model's low beta lies within the pair's set. */
  readonly insideSet: boolean | null;
}

export interface FactorModel {
  readonly observations: number;
  readonly portfolios: readonly FactorPortfolio[];
  readonly factorVariance: number | null;
  readonly fit: { readonly statistic: number; readonly degreesOfFreedom: number; readonly pValue: number | null } | null;
  /** Names of the portfolios whose noise variance sits at 0 (a Heywood case). */
  readonly heywood: readonly string[];
  readonly adjacentPairs: readonly FactorPair[];
  readonly diagnostics: readonly Diagnostic[];
}

export const minimumPortfolios = 3;

/**
 * Sample covariance matrix (divisor n - 1) of equally long series less `offset` (a number or a series,
 * e.g. the risk-free return: 0 by default), two-pass on data shifted by the first row. Plain loops over
 * typed arrays, each product computed once (x y and y x are the same bits).
 */
export function sampleCovariance(series: readonly ArrayLike<number>[], offset: number | Float64Array = 0, useKernel = true): number[][] {
  const n = series[0]?.length ?? 0;
  const k = series.length;
  // Short samples in the WebAssembly kernel (numerics/seriesKernel.ts: the same bits).
  const kernel = useKernel && n > 0 && (k + 1) * n + k * k <= AREA_ROWS ? columnKernel() : null;
  if (kernel !== null) return covarianceInKernel(kernel, series, offset);
  // Shifted by the first observation first (as core/moments.ts does): a constant series is exactly 0.
  const centred = series.map((x) => centredSeries(typeof offset === "number" ? excess(x, offset) : excessOf(x, offset)));
  const s: number[][] = Array.from({ length: k }, () => new Array<number>(k).fill(0));
  for (let i = 0; i < k; i++)
    for (let j = i; j < k; j++) {
      const value = crossProduct(centred[i]!, centred[j]!, n) / (n - 1);
      s[i]![j] = value;
      s[j]![i] = value;
    }
  return s;
}

function covarianceInKernel(kernel: ColumnKernel, series: readonly ArrayLike<number>[], offset: number | Float64Array): number[][] {
  const n = series[0]!.length;
  const k = series.length;
  series.forEach((x, i) => copyRows(kernel.area.subarray(i * n), x, 0, n));
  if (typeof offset !== "number") kernel.area.set(offset.subarray(0, n), k * n);
  kernel.covariance(k, n, typeof offset !== "number", typeof offset === "number" ? offset : 0);
  const at = (k + 1) * n;
  return Array.from({ length: k }, (_, i) => Array.from(kernel.area.subarray(at + i * k, at + (i + 1) * k)));
}

function excess(x: ArrayLike<number>, offset: number): Float64Array {
  const out = new Float64Array(x.length);
  for (let t = 0; t < out.length; t++) out[t] = x[t]! - offset;
  return out;
}

function excessOf(x: ArrayLike<number>, offset: Float64Array): Float64Array {
  const out = new Float64Array(x.length);
  for (let t = 0; t < out.length; t++) out[t] = x[t]! - offset[t]!;
  return out;
}

/** In place: x - x[0], then minus its mean (the mean of the shifted values, summed in order). */
function centredSeries(out: Float64Array): Float64Array {
  const n = out.length;
  const first = n > 0 ? out[0]! : 0;
  let sum = 0;
  for (let t = 0; t < n; t++) {
    const v = out[t]! - first;
    out[t] = v;
    sum += v;
  }
  const mean = sum / n;
  for (let t = 0; t < n; t++) out[t] = out[t]! - mean;
  return out;
}

function crossProduct(x: Float64Array, y: Float64Array, n: number): number {
  let sum = 0;
  for (let t = 0; t < n; t++) sum += x[t]! * y[t]!;
  return sum;
}

/** Fits the model to the moments `s` of `n` observations of the portfolios `names`, market weights `weights`. */
export function factorModelFromCovariance(
  names: readonly string[],
  weights: readonly number[],
  s: readonly (readonly number[])[],
  n: number,
): FactorModel {
  const k = names.length;
  const total = weights.reduce((a, b) => a + b, 0);
  const w = weights.map((x) => x / total);
  const diagnostics: Diagnostic[] = [];
  const sw = s.map((row) => row.reduce((sum, x, j) => sum + x * w[j]!, 0));
  const marketVariance = sw.reduce((sum, x, i) => sum + x * w[i]!, 0);
  const capm = sw.map((x) => (marketVariance > 0 ? x / marketVariance : null));
  const constant = names.filter((_, i) => !(s[i]![i]! > 0));
  for (const name of constant) diagnostics.push(diagnose({ code: "factor-constant", portfolio: name }));
  // Without a fit the pairs' sets are still reported (none when a portfolio is constant).
  const empty = (extra: Diagnostic[] = []): FactorModel => ({
    observations: n,
    portfolios: names.map((name, i) => ({
      name,
      weight: w[i]!,
      loading: null,
      noiseVariance: null,
      loadingStdError: null,
      capmBeta: capm[i] ?? null,
    })),
    factorVariance: null,
    fit: null,
    heywood: [],
    adjacentPairs: constant.length > 0 ? [] : pairsOf(names, w, s, null),
    diagnostics: [...diagnostics, ...extra],
  });
  if (k < minimumPortfolios) return empty([diagnose({ code: "factor-too-few-portfolios", count: k, minimum: minimumPortfolios })]);
  if (constant.length > 0) return empty();
  if (n <= k) return empty([diagnose({ code: "factor-singular-covariance", observations: n, portfolios: k })]);
  const d = s.map((row, i) => Math.sqrt(row[i]!));
  const r = s.map((row, i) => row.map((x, j) => (i === j ? 1 : x / (d[i]! * d[j]!))));
  const fitted = fitOneFactor(r, n);
  if (fitted === null) return empty([diagnose({ code: "factor-singular-covariance", observations: n, portfolios: k })]);
  const lambdaR = fitted.lambda;
  const lambda = lambdaR.map((x, i) => x * d[i]!);
  let scaleSum = lambda.reduce((sum, x, i) => sum + x * w[i]!, 0);
  const norm = Math.sqrt(lambda.reduce((sum, x) => sum + x * x, 0));
  if (!(Math.abs(scaleSum) > 1e-8 * norm)) return empty([diagnose({ code: "factor-not-normalisable", marketLoading: scaleSum })]);
  const sign = Math.sign(scaleSum);
  scaleSum *= sign;
  const loadings = lambda.map((x) => (sign * x) / scaleSum);
  const psi = fitted.psi.map((p, i) => p * s[i]![i]!);
  if (!fitted.converged) diagnostics.push(diagnose({ code: "factor-not-converged", iterations: fitted.iterations }));
  const heywood = fitted.heywood.map((i) => names[i]!);
  for (const i of fitted.heywood) diagnostics.push(diagnose({ code: "factor-heywood", portfolio: names[i]!, noiseVariance: psi[i]! }));
  const stdErrors =
    fitted.heywood.length > 0 || fitted.covariance === null ? null : loadingErrors(fitted.covariance, lambdaR, d, w, sign * scaleSum);
  const degreesOfFreedom = (k * (k - 3)) / 2;
  const statistic = Math.max(n - 1 - (2 * k + 5) / 6 - 2 / 3, 0) * fitted.discrepancy;
  return {
    observations: n,
    portfolios: names.map((name, i) => ({
      name,
      weight: w[i]!,
      loading: loadings[i]!,
      noiseVariance: psi[i]!,
      loadingStdError: stdErrors?.[i] ?? null,
      capmBeta: capm[i] ?? null,
    })),
    factorVariance: scaleSum * scaleSum,
    fit: Number.isFinite(statistic)
      ? { statistic, degreesOfFreedom, pValue: degreesOfFreedom > 0 ? chiSquareSurvival(statistic, degreesOfFreedom) : null }
      : null,
    heywood,
    adjacentPairs: pairsOf(names, w, s, loadings),
    diagnostics,
  };
}

/**
 * Delta method: b_i = lambda_i / s, s = sum_j w_j lambda_j, lambda_i = d_i lambdaR_i, so
 * db_i / dlambdaR_j = d_j (delta_ij / s - lambda_i w_j / s^2); the psi block does not enter.
 */
function loadingErrors(cov: number[][], lambdaR: number[], d: number[], w: number[], s: number): number[] | null {
  const k = lambdaR.length;
  const lambda = lambdaR.map((x, i) => x * d[i]!);
  const errors: number[] = [];
  for (let i = 0; i < k; i++) {
    const row = Array.from({ length: k }, (_, j) => d[j]! * ((i === j ? 1 / s : 0) - (lambda[i]! * w[j]!) / (s * s)));
    let variance = 0;
    for (let a = 0; a < k; a++) for (let b = 0; b < k; b++) variance += row[a]! * cov[a]![b]! * row[b]!;
    if (!(variance >= 0)) return null;
    errors.push(Math.sqrt(variance));
  }
  return errors;
}

function pairsOf(
  names: readonly string[],
  w: readonly number[],
  s: readonly (readonly number[])[],
  loadings: readonly number[] | null,
): FactorPair[] {
  const pairs: FactorPair[] = [];
  for (let i = 0; i + 1 < names.length; i++) {
    const j = i + 1;
    const weight = w[i]! / (w[i]! + w[j]!);
    const covariance = s[i]![j]!;
    const bounds =
      covariance > 0
        ? identifiedBounds({ weight, lowMean: 0, highMean: 0, lowVariance: s[i]![i]!, highVariance: s[j]![j]!, covariance })
        : null;
    const scale = loadings === null ? null : weight * loadings[i]! + (1 - weight) * loadings[j]!;
    const factorLowBeta = scale === null || loadings === null || scale === 0 ? null : loadings[i]! / scale;
    const factorHighBeta = scale === null || loadings === null || scale === 0 ? null : loadings[j]! / scale;
    pairs.push({
      low: names[i]!,
      high: names[j]!,
      weight,
      bounds: bounds === null ? null : { lowBeta: bounds.lowBeta, highBeta: bounds.highBeta },
      factorLowBeta,
      factorHighBeta,
      insideSet:
        bounds === null || factorLowBeta === null ? null : factorLowBeta >= bounds.lowBeta.min && factorLowBeta <= bounds.lowBeta.max,
    });
  }
  return pairs;
}
