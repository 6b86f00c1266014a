/**
 * Fixed-b critical values for the Bartlett kernel (docs/methods.md §8), against the critical-value
 * functions published by Kiefer & Vogelsang (2005, Econometric Theory 21(6), 1130-1164), Bartlett
 * kernel, b = S/T:
 *   two-sided 5% (97.5% quantile): 1.9600 + 2.9694 b + 0.4160 b^2 - 0.5324 b^3
 *   one-sided 5% (95% quantile):   1.6449 + 2.1859 b + 0.3142 b^2 - 0.3427 b^3
 * and Student t quantiles from scipy (scipy.stats.t.ppf).
 */

import { describe, expect, test } from "vitest";
import {
  bartlettFixedBFactor,
  bartlettFixedBMean,
  bartlettFixedBQuantile,
  studentTQuantile,
} from "../../../../src/core/inference/hac/fixedB.js";
import { expectClose } from "../../../support/close.js";

const twoSided = (b: number) => 1.96 + 2.9694 * b + 0.416 * b * b - 0.5324 * b ** 3;
const oneSided = (b: number) => 1.6449 + 2.1859 * b + 0.3142 * b * b - 0.3427 * b ** 3;

describe("Student t quantiles (scipy.stats.t.ppf)", () => {
  test.each([
    [0.975, 10, 2.228138851986274],
    [0.95, 3, 2.3533634348018233],
    [0.99995, 4.5, 12.909431314322443],
  ])("t.ppf(%s, %s) = %s", (p, nu, expected) => {
    expectClose(studentTQuantile(p, nu), expected, { rel: 1e-9 });
  });
  test("infinite degrees of freedom give the normal quantile 1.959963984540054", () => {
    expectClose(studentTQuantile(0.975, Number.POSITIVE_INFINITY), 1.959963984540054, { rel: 1e-14 });
  });
});

describe("Bartlett fixed-b quantiles", () => {
  const bs = [0.005, 0.02, 0.05, 0.1, 0.2, 0.3, 0.5, 0.75, 1];
  test.each(bs)("b = %s: the 97.5%% quantile is Kiefer-Vogelsang's two-sided 5%% value (the scaled t is matched to it)", (b) => {
    expectClose(bartlettFixedBQuantile(b, 0.975), twoSided(b), { rel: 1e-9 });
  });
  test.each(bs)("b = %s: the 95%% quantile is within 0.6%% (b <= 0.1), 1.2%% (b <= 0.2) or 3%% of their one-sided 5%% value", (b) => {
    const tolerance = b <= 0.1 ? 0.006 : b <= 0.2 ? 0.012 : 0.03;
    expectClose(bartlettFixedBQuantile(b, 0.95), oneSided(b), { rel: tolerance });
  });
  test("b = 0 is the normal case; b beyond 1 is taken as 1", () => {
    expectClose(bartlettFixedBQuantile(0, 0.975), 1.959963984540054, { rel: 1e-14 });
    expect(bartlettFixedBQuantile(3, 0.975)).toBe(bartlettFixedBQuantile(1, 0.975));
  });
  test("E Q(b) = 1 - b + b^2/3 (Kiefer-Vogelsang 2005, Bartlett kernel)", () => {
    expectClose(bartlettFixedBMean(0.3), 1 - 0.3 + 0.03, { rel: 1e-15 });
  });
  test("the factor is the fixed-b quantile over the normal one, grows with b, and is 1 at b = 0", () => {
    expectClose(bartlettFixedBFactor(0.1, 0.95), twoSided(0.1) / 1.959963984540054, { rel: 1e-9 });
    expectClose(bartlettFixedBFactor(0, 0.9), 1, { rel: 1e-14 });
    expect(bartlettFixedBFactor(0.2, 0.9)).toBeGreaterThan(bartlettFixedBFactor(0.1, 0.9));
    expect(bartlettFixedBFactor(0.1, 0.99)).toBeGreaterThan(bartlettFixedBFactor(0.1, 0.9));
  });
});
