/**
 * Delta-method standard errors of the bounds (docs/methods.md §4) on the exact examples of §1.7, where
 * Omega is the Gaussian-iid (Isserlis) covariance of the second moments:
 *   Var: V_l -> 2 V_l^2, V_h -> 2 V_h^2, C -> V_l V_h + C^2;
 *   Cov: (V_l, V_h) -> 2 C^2, (V_l, C) -> 2 V_l C, (V_h, C) -> 2 V_h C.
 * Exact rationals are checked to 1e-13 relative (a handful of roundings); values printed to 7
 * significant digits to half a unit of the last digit.
 */

import { describe, expect, test } from "vitest";
import { boundGradients, boundsDelta, momentSeries } from "../../../src/core/inference/boundsDelta.js";
import { expectClose } from "../../support/close.js";

function isserlis(vl: number, vh: number, c: number): number[][] {
  return [
    [2 * vl * vl, 2 * c * c, 2 * vl * c],
    [2 * c * c, 2 * vh * vh, 2 * vh * c],
    [2 * vl * c, 2 * vh * c, vl * vh + c * c],
  ];
}

const rel = 1e-13;
const exampleA = { weight: 0.5, lowVariance: 4, highVariance: 9, covariance: 5 };
const exampleB = { weight: 0.5, lowVariance: 4, highVariance: 9, covariance: 3 };

describe("docs/methods.md §1.7 Example A (V_l = 4, V_h = 9, C = 5, w = 1/2)", () => {
  test("gradients: Lb (0, -5/98, 9/98), U (10/81, 0, -8/81)", () => {
    const g = boundGradients(exampleA);
    [0, -5 / 98, 9 / 98].forEach((v, i) => expectClose(g.lower[i], v, { rel }));
    [10 / 81, 0, -8 / 81].forEach((v, i) => expectClose(g.upper[i], v, { rel }));
  });

  test("Gaussian T Var(Lb) = 891/9604, T Var(U) = 704/6561, corr(Lb, U) = 7/18", () => {
    const d = boundsDelta(exampleA, isserlis(4, 9, 5), 1);
    expectClose(d.lowBeta.min.estimate, 5 / 7, { rel });
    expectClose(d.lowBeta.max.estimate, 8 / 9, { rel });
    expectClose(d.lowBeta.min.stdError ** 2, 891 / 9604, { rel });
    expectClose(d.lowBeta.max.stdError ** 2, 704 / 6561, { rel });
    expectClose(d.correlation, 7 / 18, { rel });
    expectClose(d.correlation * d.lowBeta.min.stdError * d.lowBeta.max.stdError, 22 / 567, { rel });
  });

  test("T = 120: se(Lb) = 0.0278050, se(U) = 0.0299027", () => {
    const d = boundsDelta(exampleA, isserlis(4, 9, 5), 120);
    expectClose(d.lowBeta.min.stdError, 0.027805, { abs: 5e-8 });
    expectClose(d.lowBeta.max.stdError, 0.0299027, { abs: 5e-8 });
  });
});

describe("docs/methods.md §1.7 Example B (ordering flip, C = 3)", () => {
  test("gradients Lb (0, -1/24, 1/8), U (6/49, 0, -8/49); Gaussian T Var 27/64 and 1728/2401, corr -1/2", () => {
    const g = boundGradients(exampleB);
    [0, -1 / 24, 1 / 8].forEach((v, i) => expectClose(g.lower[i], v, { rel }));
    [6 / 49, 0, -8 / 49].forEach((v, i) => expectClose(g.upper[i], v, { rel }));
    const d = boundsDelta(exampleB, isserlis(4, 9, 3), 1);
    expectClose(d.lowBeta.min.stdError ** 2, 27 / 64, { rel });
    expectClose(d.lowBeta.max.stdError ** 2, 1728 / 2401, { rel });
    expectClose(d.correlation, -1 / 2, { rel });
  });
});

describe("docs/methods.md §4 Monte Carlo design (b_l = 0.7, b_h = 1.3, phi = 2e-4, s = (5e-5, 8e-5), T = 500)", () => {
  test("the delta-method standard errors are (0.01761, 0.02061)", () => {
    const phi = 2e-4;
    const vl = 0.49 * phi + 5e-5;
    const vh = 1.69 * phi + 8e-5;
    const c = 0.91 * phi;
    const d = boundsDelta({ weight: 0.5, lowVariance: vl, highVariance: vh, covariance: c }, isserlis(vl, vh, c), 500);
    expectClose(d.lowBeta.min.estimate, 0.60667, { abs: 5e-6 });
    expectClose(d.lowBeta.max.estimate, 0.89697, { abs: 5e-6 });
    expectClose(d.lowBeta.min.stdError, 0.01761, { abs: 5e-6 });
    expectClose(d.lowBeta.max.stdError, 0.02061, { abs: 5e-6 });
  });
});

describe("the high beta's bounds (b_high = (1 - w b_low)/(1 - w), docs/methods.md §1)", () => {
  test("with w = 0.3 the minimum comes from U and the maximum from Lb, standard errors times w/(1 - w)", () => {
    const m = { weight: 0.3, lowVariance: 4, highVariance: 9, covariance: 5 };
    const d = boundsDelta(m, isserlis(4, 9, 5), 120);
    const h = (b: number) => (1 - 0.3 * b) / 0.7;
    expectClose(d.highBeta.min.estimate, h(d.lowBeta.max.estimate), { rel });
    expectClose(d.highBeta.max.estimate, h(d.lowBeta.min.estimate), { rel });
    expectClose(d.highBeta.min.stdError, (0.3 / 0.7) * d.lowBeta.max.stdError, { rel });
    expectClose(d.highBeta.max.stdError, (0.3 / 0.7) * d.lowBeta.min.stdError, { rel });
  });
});

describe("the moment series z_t", () => {
  test("averages of z_t are the second moments with divisor T (docs/methods.md §4 definition)", () => {
    const x = [1, 4, 2, 7];
    const y = [2, 3, 9, 6];
    const z = momentSeries(x, y);
    const mean = (a: Float64Array) => a.reduce((s, v) => s + v, 0) / a.length;
    // xbar = 3.5, ybar = 5: deviations (-2.5, 0.5, -1.5, 3.5) and (-3, -2, 4, 1): sums 21, 30 and 4.
    expect([mean(z[0]!), mean(z[1]!), mean(z[2]!)]).toEqual([21 / 4, 30 / 4, 4 / 4]);
  });
});
