/**
 * The pricing test's size and power on samples drawn from the model (a short version of
 * scripts/pricing-study.ts; the recorded 2,000-sample run is docs/pricing-study.md). With the truth
 * at the upper end of the set (no low noise) H0 holds at its boundary: the rejection rate at 5% must
 * be near 5% (600 samples: binomial sd 0.9 points; the band is more than 2.5 sd wide on each side);
 * with an extra alpha of 0.005 a month on the low book it must reject nearly always.
 */
import { describe, expect, it } from "vitest";
import { drawSample } from "../../../src/core/forward/simulate.js";
import { assessPricing } from "../../../src/core/pricing/assessPricing.js";

const structure = { weight: 0.5, factorVol: 0.045, factorMean: 0.006, lowBeta: 0.8, lowNoiseVol: 0, highNoiseVol: 0.03 };

function rejectionRate(extraAlpha: number, samples: number): number {
  let rejected = 0;
  for (let rep = 0; rep < samples; rep++) {
    const sample = drawSample(structure, { periods: 687, seed: 500000 + rep });
    const low = sample.low.map((r) => r + extraAlpha);
    const pricing = assessPricing({ low, high: sample.high }, { weight: 0.5, confidence: 0.95, longRun: "hac", hac: {} });
    if (pricing?.test?.verdict === "not explained") rejected++;
  }
  return rejected / samples;
}

describe("the pricing test on samples from the model", () => {
  it("rejects a true H0 at its boundary near 5% of the time", () => {
    const rate = rejectionRate(0, 600);
    expect(rate).toBeGreaterThan(0.025);
    expect(rate).toBeLessThan(0.075);
  });

  it("rejects when the low book carries an alpha of 0.005 a month that no structure explains", () => {
    expect(rejectionRate(0.005, 100)).toBeGreaterThan(0.95);
  });
});
