/**
 * Fieller's set: a hand-worked example (a = 2, b = 1, var a = 0.04, var b = 0.01, z = 2 gives
 * (2 -/+ 0.56) / 0.96 = [1.5, 2.6667], where |a - theta b| / se is exactly 2 at both ends), and the
 * set's definition checked point by point on random inputs of every shape.
 */
import { describe, expect, it } from "vitest";
import { fiellerSet, type RatioMoments, ratioStdError } from "../../../src/core/pricing/fieller.js";
import { createRandom } from "../../../src/core/numerics/rng.js";

const inside = (m: RatioMoments, z: number, theta: number) =>
  (m.numerator - theta * m.denominator) ** 2 <=
  z * z * (m.numeratorVariance - 2 * theta * m.covariance + theta * theta * m.denominatorVariance);

describe("fiellerSet", () => {
  it("the hand-worked example", () => {
    const set = fiellerSet({ numerator: 2, denominator: 1, numeratorVariance: 0.04, denominatorVariance: 0.01, covariance: 0 }, 2);
    expect(set.shape).toBe("bounded");
    if (set.shape !== "bounded") return;
    expect(set.lower).toBeCloseTo(1.5, 14);
    expect(set.upper).toBeCloseTo(8 / 3, 14);
  });

  it("is two rays when the denominator is not distinguishable from zero, or the whole line", () => {
    expect(fiellerSet({ numerator: 2, denominator: 0.1, numeratorVariance: 0.04, denominatorVariance: 0.01, covariance: 0 }, 2).shape).toBe(
      "two-rays",
    );
    expect(
      fiellerSet({ numerator: 0.1, denominator: 0.1, numeratorVariance: 0.04, denominatorVariance: 0.04, covariance: 0 }, 2).shape,
    ).toBe("whole-line");
  });

  it("holds exactly the values within z standard errors (random inputs of every shape)", () => {
    const random = createRandom(7);
    const shapes = new Set<string>();
    for (let trial = 0; trial < 300; trial++) {
      const va = 0.01 + random.uniform();
      const vb = 0.01 + random.uniform();
      const m: RatioMoments = {
        numerator: 4 * random.uniform() - 2,
        denominator: 2 * random.uniform() - 1,
        numeratorVariance: va,
        denominatorVariance: vb,
        covariance: (2 * random.uniform() - 1) * 0.9 * Math.sqrt(va * vb),
      };
      const z = 1 + random.uniform() * 2;
      const set = fiellerSet(m, z);
      shapes.add(set.shape);
      for (let theta = -20; theta <= 20; theta += 0.0371) {
        const expected = inside(m, z, theta);
        const reported =
          set.shape === "whole-line"
            ? true
            : set.shape === "bounded"
              ? theta >= set.lower && theta <= set.upper
              : theta <= set.lower || theta >= set.upper;
        // Points within rounding of an end may go either way.
        const nearEnd = set.shape !== "whole-line" && Math.min(Math.abs(theta - set.lower), Math.abs(theta - set.upper)) < 1e-9;
        if (!nearEnd) expect(reported, `theta ${theta} in ${JSON.stringify(set)}`).toBe(expected);
      }
    }
    expect(shapes).toEqual(new Set(["bounded", "two-rays", "whole-line"]));
  });

  it("has the delta-method standard error sqrt(v_aa - 2 r v_ab + r^2 v_bb) / |b|", () => {
    expect(ratioStdError({ numerator: 2, denominator: 1, numeratorVariance: 0.04, denominatorVariance: 0.01, covariance: 0 })).toBeCloseTo(
      Math.sqrt(0.04 + 4 * 0.01),
      15,
    );
    expect(ratioStdError({ numerator: 2, denominator: 0, numeratorVariance: 0.04, denominatorVariance: 0.01, covariance: 0 })).toBeNull();
  });
});
