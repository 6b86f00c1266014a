/**
 * Student's t two-sided tail probability and log-gamma (docs/methods.md §17) against mpmath at 40 digits
 * (test/fixtures/numerics/student_t.json, written by generate_student_t.py, with scipy beside it as a cross-check).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { logGamma, studentTTwoSidedP } from "../../../src/core/numerics/studentT.js";
import { expectClose } from "../../support/close.js";

interface Fixture {
  readonly studentTTwoSided: readonly { t: number; df: number; p: number }[];
  readonly logGamma: readonly { x: number; logGamma: number }[];
}
const fixture = JSON.parse(readFileSync(new URL("../../fixtures/numerics/student_t.json", import.meta.url), "utf8")) as Fixture;

describe("studentTTwoSidedP against mpmath (scipy.stats.t as a cross-check)", () => {
  it.each(fixture.studentTTwoSided.map((c) => [c.t, c.df, c.p] as const))("t = %d, %d degrees of freedom: p = %d", (t, df, p) => {
    // 1e-12 relative: the continued fraction stops at 1e-16 per step; log-gamma's Lanczos sum carries ~1e-15.
    // From 10,000 degrees of freedom on, 5e-12: the front factor exp(a ln x + ...) multiplies the
    // rounding of ln x by a = nu / 2.
    expectClose(studentTTwoSidedP(t, df), p, { rel: df >= 10_000 ? 5e-12 : 1e-12, abs: 1e-300 });
  });

  it("is 1 at t = 0 and falls as |t| grows", () => {
    expect(studentTTwoSidedP(0, 7)).toBe(1);
    expect(studentTTwoSidedP(3, 7)).toBeLessThan(studentTTwoSidedP(2, 7));
    expect(studentTTwoSidedP(-2, 7)).toBe(studentTTwoSidedP(2, 7));
  });
});

describe("logGamma against mpmath.loggamma", () => {
  it.each(fixture.logGamma.map((c) => [c.x, c.logGamma] as const))("x = %d", (x, expected) => {
    // Near x = 1 and 2 log-gamma is near 0: an absolute bound of 1e-14 there, 1e-13 relative elsewhere.
    expectClose(logGamma(x), expected, { rel: 1e-13, abs: 1e-14 });
  });
});
