/**
 * The standard normal pdf, cdf, survival function and quantile against
 * test/fixtures/inference/normal.json (generate_normal.py): mpmath at 60 digits ("exact") and
 * scipy 1.17.1 scipy.stats.norm.
 *
 * Tolerances: 5e-15 relative against mpmath (the largest error measured on a fine grid is 3.4e-15,
 * where 1/2 + (Phi - 1/2) cancels just inside the switch to the continued fraction; see normal.ts),
 * and 1e-13 against scipy, whose own error in the far tails is up to 5.7e-14 (recorded in the fixture).
 */

import { describe, expect, test } from "vitest";
import { normalCdf, normalPdf, normalQuantile, normalSurvival } from "../../../src/core/numerics/normal.js";
import { expectClose } from "../../support/close.js";
import { fixtureText } from "../inference/fixtures.js";

interface Point {
  x: number;
  cdf: number;
  sf: number;
  pdf: number;
  exactCdf: number;
  exactSf: number;
  exactPdf: number;
}
interface QuantilePoint {
  p: number;
  quantile: number;
  exactQuantile: number;
}
const fixture = JSON.parse(fixtureText("normal.json")) as { points: Point[]; quantiles: QuantilePoint[] };

const ulps = 5e-15;

describe("normal distribution function against mpmath (60 digits)", () => {
  test.each(fixture.points)("Phi($x), Q($x) and phi($x) have full relative accuracy", (p) => {
    if (p.exactCdf > 0) expectClose(normalCdf(p.x), p.exactCdf, { rel: ulps });
    if (p.exactSf > 0) expectClose(normalSurvival(p.x), p.exactSf, { rel: ulps });
    expectClose(normalPdf(p.x), p.exactPdf, { rel: ulps });
  });
});

describe("normal distribution function against scipy.stats.norm", () => {
  test.each(fixture.points)("Phi($x) and Q($x) agree with scipy to its accuracy", (p) => {
    if (p.cdf > 0) expectClose(normalCdf(p.x), p.cdf, { rel: 1e-13 });
    if (p.sf > 0) expectClose(normalSurvival(p.x), p.sf, { rel: 1e-13 });
  });
});

describe("normal quantile", () => {
  test.each(fixture.quantiles)("Phi^-1($p) matches mpmath and scipy.stats.norm.ppf", (q) => {
    expectClose(normalQuantile(q.p), q.exactQuantile, { rel: ulps });
    expectClose(normalQuantile(q.p), q.quantile, { rel: 1e-14 });
  });

  test("the quantile is -Infinity at 0, Infinity at 1 and NaN outside [0, 1] (limits of Phi)", () => {
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(1)).toBe(Infinity);
    expect(normalQuantile(-0.1)).toBeNaN();
    expect(normalQuantile(1.1)).toBeNaN();
  });

  test("the two-sided 95% value z_0.975 = 1.9599639845400538 (mpmath; the double 0.975)", () => {
    expectClose(normalQuantile(0.975), 1.9599639845400538, { rel: 2e-15 });
  });
});
