/**
 * HAC kernels and the lag weights they give.
 *
 * ## Conventions (Andrews 1991, Econometrica 59(3); docs/methods.md §8)
 * - Bartlett: k(x) = 1 - |x| for |x| <= 1, else 0. Newey-West lag L is bandwidth S = L + 1, weights
 *   1 - j/(L + 1), j = 0..L (R sandwich NeweyWest: seq(1, 0, by = -1/(lag + 1))).
 * - Quadratic spectral: k(x) = 25/(12 pi^2 x^2) [sin(6 pi x/5)/(6 pi x/5) - cos(6 pi x/5)], k(0) = 1
 *   (taken as 1 for x < 1e-4, as R's kweights). Weights k(j/S) for j = 0..n-1, cut after the last
 *   one above 1e-7 in absolute value (R's weightsAndrews, tol = 1e-7).
 * At most n weights are used (n the rows of the series the sums run over), as R's meatHAC.
 */

import type { HacKernel } from "../options.js";

/** The kernel function k(x). */
export function kernelValue(kernel: HacKernel, x: number): number {
  const ax = Math.abs(x);
  if (kernel === "bartlett") return ax <= 1 ? 1 - ax : 0;
  if (ax < 1e-4) return 1;
  const y = (6 * Math.PI * ax) / 5;
  return (3 / (y * y)) * (Math.sin(y) / y - Math.cos(y));
}

/** Weights below this (absolute) end a quadratic-spectral weight sequence (R sandwich's tol). */
export const weightTolerance = 1e-7;

/**
 * Lag weights w_0, w_1, ... for `kernel` at bandwidth S over a series of n rows.
 * Bartlett: 1 - j/S for j < S; quadratic spectral: k(j/S) up to the last |w| > 1e-7.
 */
export function lagWeights(kernel: HacKernel, bandwidth: number, n: number): Float64Array {
  if (!(bandwidth > 0)) throw new RangeError(`lagWeights: bandwidth must be positive, got ${bandwidth}`);
  if (kernel === "bartlett") {
    const count = Math.min(n, Math.ceil(bandwidth));
    const weights = new Float64Array(Math.max(count, 1));
    for (let j = 0; j < weights.length; j++) weights[j] = 1 - j / bandwidth;
    return weights;
  }
  let last = 0;
  const all: number[] = [];
  for (let j = 0; j < n; j++) {
    all.push(kernelValue(kernel, j / bandwidth));
    if (Math.abs(all[j]!) > weightTolerance) last = j;
    // From here on |k(x)| <= 3 (1 + 1/y) / y^2 (y = 6 pi x / 5; |sin y / y - cos y| <= 1/y + 1), a bound
    // that falls with y: once it is half the tolerance no later weight, rounding included, is above the
    // tolerance, so the search stops where scanning all n weights would end the same.
    const y = (6 * Math.PI * (j / bandwidth)) / 5;
    if (y > 1 && (3 * (1 + 1 / y)) / (y * y) <= 0.5 * weightTolerance) break;
  }
  return Float64Array.from(all.slice(0, last + 1));
}
