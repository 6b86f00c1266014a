/**
 * Automatic HAC bandwidths, following R sandwich's bwNeweyWest and bwAndrews exactly (docs/methods.md
 * section 8; reproduced there to the printed digits of sandwich-Ex.Rout.save).
 *
 * Both take the estimating functions h_t (columns) after any prewhitening, `columnWeights` w_a
 * (R: 1 for every column, 0 for an intercept column, all 1 if that leaves none), and the number of
 * rows T of the original series.
 *
 * Newey & West (1994), Review of Economic Studies 61(4), 631-653:
 *   pre-lag m = floor(c (T/100)^rate), c = 4, or 3 with prewhitening, rate 2/9 (Bartlett) or 2/25 (QS),
 *   computed from the ORIGINAL T; f_t = sum_a w_a h_t,a over the n rows used (n = T - 1 if
 *   prewhitened); sigma_j = sum_{t=1}^{n-j} f_t f_{t+j} / n; s0 = sigma_0 + 2 sum sigma_j,
 *   s1 = 2 sum j sigma_j, s2 = 2 sum j^2 sigma_j;
 *   Bartlett 1.1447 ((s1/s0)^2)^{1/3} T^{1/3};  QS 1.3221 ((s2/s0)^2)^{1/5} T^{1/5}.
 * Andrews (1991), Econometrica 59(3), 817-858, AR(1) plug-in: per column a, an AR(1) with intercept
 *   fitted by least squares to the demeaned column (R: ar(x, order.max = 1, aic = FALSE,
 *   method = "ols")), rho_a the slope, sigma_a^2 = RSS/(n - 1);
 *   alpha(1) = sum w 4 rho^2 sigma^4 / ((1-rho)^6 (1+rho)^2) / sum w sigma^4/(1-rho)^4,
 *   alpha(2) = sum w 4 rho^2 sigma^4 / (1-rho)^8 / the same denominator;
 *   Bartlett 1.1447 (alpha(1) n)^{1/3};  QS 1.3221 (alpha(2) n)^{1/5}, n the rows used (T - 1 if
 *   prewhitened).
 */

import type { HacKernel } from "../options.js";

export function neweyWest1994Bandwidth(
  columns: readonly Float64Array[],
  kernel: HacKernel,
  columnWeights: readonly number[],
  originalRows: number,
  prewhitened: boolean,
): number {
  const n = columns[0]!.length;
  const rate = kernel === "bartlett" ? 2 / 9 : 2 / 25;
  const preLag = Math.min(n - 1, Math.floor((prewhitened ? 3 : 4) * (originalRows / 100) ** rate));
  const f = new Float64Array(n);
  columns.forEach((column, a) => {
    const w = columnWeights[a]!;
    if (w !== 0) for (let t = 0; t < n; t++) f[t] = f[t]! + w * column[t]!;
  });
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  for (let j = 0; j <= preLag; j++) {
    let sum = 0;
    for (let t = 0; t + j < n; t++) sum += f[t]! * f[t + j]!;
    const sigma = sum / n;
    s0 += j === 0 ? sigma : 2 * sigma;
    s1 += 2 * j * sigma;
    s2 += 2 * j * j * sigma;
  }
  if (kernel === "bartlett") return 1.1447 * ((s1 / s0) ** 2) ** (1 / 3) * originalRows ** (1 / 3);
  return 1.3221 * ((s2 / s0) ** 2) ** (1 / 5) * originalRows ** (1 / 5);
}

export function andrews1991Bandwidth(columns: readonly Float64Array[], kernel: HacKernel, columnWeights: readonly number[]): number {
  const n = columns[0]!.length;
  let numerator1 = 0;
  let numerator2 = 0;
  let denominator = 0;
  columns.forEach((column, a) => {
    const w = columnWeights[a]!;
    if (w === 0) return;
    const { rho, variance } = autoregression1(column);
    const sigma4 = variance * variance;
    numerator1 += (w * 4 * rho * rho * sigma4) / ((1 - rho) ** 6 * (1 + rho) ** 2);
    numerator2 += (w * 4 * rho * rho * sigma4) / (1 - rho) ** 8;
    denominator += (w * sigma4) / (1 - rho) ** 4;
  });
  if (kernel === "bartlett") return 1.1447 * ((numerator1 / denominator) * n) ** (1 / 3);
  return 1.3221 * ((numerator2 / denominator) * n) ** (1 / 5);
}

/** AR(1) with intercept by least squares on the demeaned series; variance RSS / (n - 1) (R's ar.ols). */
function autoregression1(x: Float64Array): { rho: number; variance: number } {
  const n = x.length;
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t]!;
  mean /= n;
  // Regress y_t = x_t - mean (t = 2..n) on (1, y_{t-1}).
  let meanLag = 0;
  let meanCur = 0;
  for (let t = 1; t < n; t++) {
    meanLag += x[t - 1]! - mean;
    meanCur += x[t]! - mean;
  }
  meanLag /= n - 1;
  meanCur /= n - 1;
  let sxx = 0;
  let sxy = 0;
  for (let t = 1; t < n; t++) {
    const lag = x[t - 1]! - mean - meanLag;
    sxx += lag * lag;
    sxy += lag * (x[t]! - mean - meanCur);
  }
  const rho = sxy / sxx;
  let rss = 0;
  for (let t = 1; t < n; t++) {
    const e = x[t]! - mean - meanCur - rho * (x[t - 1]! - mean - meanLag);
    rss += e * e;
  }
  return { rho, variance: rss / (n - 1) };
}
