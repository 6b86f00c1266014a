/**
 * Stoye (2009) intervals and the bivariate-normal integral behind them.
 * Expected values: docs/methods.md §5.2 (scipy SLSQP), printed to 5-6 decimals (tolerance half a
 * unit of the last printed decimal), and test/fixtures/inference/bivariate.json (scipy quad and
 * Genz's multivariate_normal.cdf, which agree to 4.4e-16; generate_bivariate.py).
 */

import { describe, test } from "vitest";
import { stoyeInterval, stoyeProbability } from "../../../src/core/inference/stoye.js";
import { expectClose } from "../../support/close.js";
import { fixtureText } from "./fixtures.js";

interface Case {
  a: number;
  b: number;
  rho: number;
  quad: number;
  genz: number;
}
const fixture = JSON.parse(fixtureText("bivariate.json")) as { cases: Case[] };

describe("the integral P(a, b, rho) = P(Z1 <= a, Z2 >= -b)", () => {
  test.each(fixture.cases)("P($a, $b, $rho) matches scipy quad and Genz to 1e-14", (c) => {
    const value = stoyeProbability(c.a, c.b, c.rho);
    expectClose(value, c.quad, { abs: 1e-14 });
    expectClose(value, c.genz, { abs: 1e-14 });
  });
});

describe("Stoye interval (docs/methods.md §5.2)", () => {
  test("(0.6, 0.61, se 0.02, 0.08, rho 0.3): c = (2.17978, 1.68153), CI [0.556404, 0.744523]", () => {
    const interval = stoyeInterval({ lower: 0.6, upper: 0.61, lowerStdError: 0.02, upperStdError: 0.08, correlation: 0.3 }, 0.95);
    expectClose(interval.criticalValue.lower, 2.17978, { abs: 5e-6 });
    expectClose(interval.criticalValue.upper, 1.68153, { abs: 5e-6 });
    expectClose(interval.lower, 0.556404, { abs: 5e-7 });
    expectClose(interval.upper, 0.744523, { abs: 5e-7 });
  });

  test("(0.6, 0.6, se 0.02, 0.08, rho 0): c = (2.38655, 1.72958), CI [0.552269, 0.738367]", () => {
    const interval = stoyeInterval({ lower: 0.6, upper: 0.6, lowerStdError: 0.02, upperStdError: 0.08, correlation: 0 }, 0.95);
    expectClose(interval.criticalValue.lower, 2.38655, { abs: 5e-6 });
    expectClose(interval.criticalValue.upper, 1.72958, { abs: 5e-6 });
    expectClose(interval.lower, 0.552269, { abs: 5e-7 });
    expectClose(interval.upper, 0.738367, { abs: 5e-7 });
  });

  test("equal standard errors and a wide set reduce to Imbens-Manski: (0.6, 0.9, 0.05, 0.05, 0.5) -> c = 1.644854", () => {
    const interval = stoyeInterval({ lower: 0.6, upper: 0.9, lowerStdError: 0.05, upperStdError: 0.05, correlation: 0.5 }, 0.95);
    expectClose(interval.criticalValue.lower, 1.644854, { abs: 5e-7 });
    expectClose(interval.criticalValue.upper, 1.644854, { abs: 5e-7 });
  });

  test("Example A, T = 120, rho = 7/18: Stoye's interval equals Imbens-Manski's [0.6685506, 0.9380745] to 7 d.p. (docs/methods.md §1.7)", () => {
    const interval = stoyeInterval(
      { lower: 5 / 7, upper: 8 / 9, lowerStdError: 0.027805, upperStdError: 0.0299027, correlation: 7 / 18 },
      0.95,
    );
    expectClose(interval.lower, 0.6685506, { abs: 5e-8 });
    expectClose(interval.upper, 0.9380745, { abs: 5e-8 });
  });
});
