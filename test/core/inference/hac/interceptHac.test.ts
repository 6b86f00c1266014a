/**
 * The regression on an intercept and one series without a column of ones (interceptLeastSquares,
 * interceptHacCovariance) against the general code on [ones, x] (leastSquares, hacCovariance, checked
 * against R sandwich and statsmodels in the files beside this one): the same bits, for every kernel,
 * bandwidth rule and option, on autocorrelated data, and in the corner cases (a signed zero
 * intercept, x all ones).
 */

import { describe, expect, test } from "vitest";
import { hacCovariance, interceptHacCovariance } from "../../../../src/core/inference/hac/hac.js";
import type { HacOptions } from "../../../../src/core/inference/options.js";
import { interceptLeastSquares, leastSquares } from "../../../../src/core/numerics/leastSquares.js";
import { normals } from "../../../support/random.js";

/** An AR(1) market and a book on it with AR(1) noise, n rows, from a seed. */
function sample(n: number, seed: number): { x: Float64Array; y: Float64Array } {
  const draw = normals(seed);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  let f = 0;
  let e = 0;
  for (let t = 0; t < n; t++) {
    f = 0.3 * f + 0.01 * draw();
    e = 0.5 * e + 0.004 * draw();
    x[t] = f;
    y[t] = 0.0002 + 0.8 * f + e;
  }
  return { x, y };
}

function general(x: Float64Array, y: Float64Array, options: HacOptions) {
  const design = [new Float64Array(x.length).fill(1), x];
  const fit = leastSquares(design, y);
  return { fit, hac: hacCovariance(design, fit.residuals, options) };
}

function special(x: Float64Array, y: Float64Array, options: HacOptions) {
  const fit = interceptLeastSquares(x, y);
  return { fit, hac: interceptHacCovariance(x, fit.residuals, fit.inverseCrossProduct, options) };
}

const optionSets: HacOptions[] = [
  {},
  { kernel: "quadratic-spectral" },
  { bandwidth: "andrews-1991" },
  { kernel: "quadratic-spectral", bandwidth: "andrews-1991", prewhite: true },
  { prewhite: true },
  { lags: 0 },
  { lags: 7, adjust: true },
  { bandwidth: 3.5 },
];

describe("regression on an intercept without a column of ones", () => {
  test.each(optionSets.map((options, i) => [JSON.stringify(options), options, 11 + i] as const))(
    "the same bits as leastSquares + hacCovariance on [ones, x], options %s",
    (_, options, seed) => {
      for (const n of [12, 250, 3000]) {
        const { x, y } = sample(n, seed * 100 + n);
        const a = general(x, y, options);
        const b = special(x, y, options);
        expect(b.fit.coefficients).toEqual(a.fit.coefficients);
        expect(Object.is(b.fit.coefficients[0], a.fit.coefficients[0])).toBe(true);
        expect(Array.from(b.fit.residuals)).toEqual(Array.from(a.fit.residuals));
        expect(b.fit.inverseCrossProduct).toEqual(a.fit.inverseCrossProduct);
        expect(b.hac).toEqual(a.hac);
      }
    },
  );

  test("a zero intercept and residuals of either sign of zero come out the same", () => {
    // y = 2 x exactly: the intercept and every residual are zeros; their signs must match too.
    const x = Float64Array.from({ length: 40 }, (_, t) => ((t * 7) % 11) - 5);
    const y = x.map((v) => 2 * v);
    const a = general(x, y, {});
    const b = special(x, y, {});
    a.fit.coefficients.forEach((c, i) => expect(Object.is(b.fit.coefficients[i], c)).toBe(true));
    a.fit.residuals.forEach((r, t) => expect(Object.is(b.fit.residuals[t], r)).toBe(true));
    expect(b.hac).toEqual(a.hac);
  });

  test("a nearly constant x gives the same bits as the general code", () => {
    // (x all ones makes [ones, x] singular, which the general code refuses; the weights interceptWeights
    // gives then, [1, 1] for the scores e and e, leave the bandwidth as [0, 1] would: it is a ratio.)
    const { x, y } = sample(300, 7);
    const nearly = x.map((v) => 1 + v * 1e-3);
    expect(special(nearly, y, {}).hac).toEqual(general(nearly, y, {}).hac);
    expect(special(nearly, y, { kernel: "quadratic-spectral", prewhite: true }).hac).toEqual(
      general(nearly, y, { kernel: "quadratic-spectral", prewhite: true }).hac,
    );
  });
});
