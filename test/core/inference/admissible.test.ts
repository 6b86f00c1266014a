/**
 * The intervals for the structural betas are cut to the admissible range (docs/methods.md §5): every
 * structure of the model has 0 < b_low < 1/w and 0 < b_high < 1/(1 - w) (§1.2, phi = C/(b_low b_high)
 * > 0 with b_high = (1 - w b_low)/(1 - w)). On a sample whose covariance is tiny against the noise the
 * uncut limits run beyond it (the lower end's limit below 0, the upper end's above 1/w = 2).
 */

import { describe, expect, test } from "vitest";
import { admissibleInterval } from "../../../src/core/inference/imbensManski.js";
import { assessUncertainty } from "../../../src/core/inference/uncertainty.js";
import { drawSample } from "../../../src/core/forward/simulate.js";
import { ok } from "../helpers.js";

const weak = drawSample(
  { lowBeta: 0.8, weight: 0.5, factorVol: 0.002, factorMean: 0, lowNoiseVol: 0.01, highNoiseVol: 0.01 },
  { periods: 250, seed: 1 },
);

describe("intervals cut to 0 <= b_low <= 1/w", () => {
  test.each(["imbens-manski", "stoye"] as const)("%s: a tiny covariance gives [0, 1/w] and [0, 1/(1 - w)]", (interval) => {
    const u = ok(assessUncertainty(weak, { interval }));
    const { min, max } = u.bounds!.lowBeta;
    const { criticalValue } = u.lowBeta!.interval;
    // Uncut, the limits would leave the range: the estimate -/+ the reported multiple of its standard error.
    expect(min.estimate - criticalValue.lower * min.stdError).toBeLessThan(0);
    expect(max.estimate + criticalValue.upper * max.stdError).toBeGreaterThan(2);
    expect(u.lowBeta!.interval).toMatchObject({ lower: 0, upper: 2, method: interval });
    expect(u.highBeta!.interval.lower).toBeCloseTo(0, 14);
    expect(u.highBeta!.interval.upper).toBeCloseTo(2, 14);
  });

  test("with w = 0.25 the range is [0, 4] for the low beta and [0, 4/3] for the high beta", () => {
    const u = ok(assessUncertainty(weak, { weight: 0.25 }));
    expect(u.lowBeta!.interval.lower).toBeGreaterThanOrEqual(0);
    expect(u.lowBeta!.interval.upper).toBeLessThanOrEqual(4);
    expect(u.highBeta!.interval.lower).toBeGreaterThanOrEqual(0);
    expect(u.highBeta!.interval.upper).toBeLessThanOrEqual(4 / 3 + 1e-15);
  });

  test("an interval inside the range is left as it is; the critical values are kept", () => {
    const inside = { lower: 0.3, upper: 1.2, criticalValue: { lower: 1.7, upper: 1.8 } };
    expect(admissibleInterval(inside, 0.5)).toEqual(inside);
    expect(admissibleInterval({ ...inside, lower: -0.197, upper: 2.2 }, 0.5)).toEqual({ ...inside, lower: 0, upper: 2 });
  });
});
