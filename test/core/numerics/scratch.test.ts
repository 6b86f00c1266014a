/**
 * The scratch pool (src/core/numerics/scratch.ts): borrowed arrays are reused only inside a scope,
 * and what they held before never reaches a result. The second part runs the uncertainty and the
 * pricing assessment inside a scope whose pool is full of arrays of NaN and of 1e300, and compares
 * every number with the same calls outside any scope (fresh, zeroed arrays): equal bit for bit.
 */
import { describe, expect, it } from "vitest";
import { drawSample } from "../../../src/core/forward/simulate.js";
import { assessUncertainty } from "../../../src/core/inference/uncertainty.js";
import { borrowSeries, giveBack, SCRATCH_MIN, withScratch, withScratchAsync } from "../../../src/core/numerics/scratch.js";
import { assessPricing } from "../../../src/core/pricing/assessPricing.js";

describe("the scratch pool", () => {
  const n = SCRATCH_MIN;

  it("reuses an array given back inside a scope, and forgets it when the scope ends", () => {
    const first = withScratch(() => {
      const a = borrowSeries(n);
      giveBack(a);
      expect(borrowSeries(n)).toBe(a);
      return a;
    });
    // Outside any scope nothing is pooled: a fresh, zeroed array every time.
    giveBack(first);
    const fresh = borrowSeries(n);
    expect(fresh).not.toBe(first);
    expect(fresh.every((x) => x === 0)).toBe(true);
    expect(withScratch(() => borrowSeries(n))).not.toBe(first);
  });

  it("pools only series of at least SCRATCH_MIN rows, of the length last given back", () => {
    withScratch(() => {
      const short = borrowSeries(n - 1);
      giveBack(short);
      expect(borrowSeries(n - 1)).not.toBe(short);
      const a = borrowSeries(n);
      const b = new Float64Array(n + 1);
      giveBack(a);
      giveBack(b); // another length: the pool now holds series of n + 1 rows
      expect(borrowSeries(n)).not.toBe(a);
      expect(borrowSeries(n + 1)).toBe(b);
    });
  });

  it("hands an array out once though it was given back twice", () => {
    withScratch(() => {
      const a = borrowSeries(n);
      giveBack(a, a);
      expect(borrowSeries(n)).toBe(a);
      expect(borrowSeries(n)).not.toBe(a);
    });
  });

  it("keeps an outer scope's pool in a nested one, and an asynchronous scope's until it settles", async () => {
    withScratch(() => {
      const a = borrowSeries(n);
      withScratch(() => giveBack(a));
      expect(borrowSeries(n)).toBe(a);
    });
    const a = new Float64Array(n);
    await withScratchAsync(async () => {
      giveBack(a);
      await Promise.resolve();
      expect(borrowSeries(n)).toBe(a);
    });
  });
});

describe("results inside a scope whose pool holds stale numbers", () => {
  // 5,000 periods from the model (a low-beta and a high-beta book with noise), rows above SCRATCH_MIN.
  const structure = { weight: 0.5, factorVol: 0.045, factorMean: 0.006, lowBeta: 0.8, lowNoiseVol: 0.01, highNoiseVol: 0.03 };
  const sample = drawSample(structure, { periods: 5000, seed: 41, riskFree: 0.001 });
  const data = { low: sample.low, high: sample.high, riskFree: new Float64Array(5000).fill(0.001) };
  const pricingOptions = { weight: 0.5, confidence: 0.95, longRun: "hac", hac: {} } as const;

  const poisoned = <T>(work: () => T): T =>
    withScratch(() => {
      const stale = Array.from({ length: 24 }, (_, i) => new Float64Array(5000).fill(i % 2 === 0 ? Number.NaN : 1e300));
      giveBack(...stale);
      return work();
    });

  it("the uncertainty is the same, bit for bit", () => {
    const fresh = assessUncertainty(data, { weight: 0.5 });
    expect(fresh.ok).toBe(true);
    expect(poisoned(() => assessUncertainty(data, { weight: 0.5 }))).toStrictEqual(fresh);
  });

  it("the pricing assessment is the same, bit for bit", () => {
    const fresh = assessPricing(data, pricingOptions);
    expect(fresh?.test).not.toBeNull();
    expect(poisoned(() => assessPricing(data, pricingOptions))).toStrictEqual(fresh);
  });
});
