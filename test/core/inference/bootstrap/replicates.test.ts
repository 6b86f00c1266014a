/**
 * bootstrapSolve and its range/merge API.
 * - Each replicate's statistics equal what `solve` (src/core/solve.ts, independent code: moments from
 *   compensated sums, OLS fits, landmarks) reports on the resampled rows, to 1e-10 relative.
 * - Replicates depend only on (seed, replicate index): any split into ranges, merged in any order,
 *   gives bit-identical draws (what lets the CLI spread ranges over worker threads).
 * - Percentile intervals use type-7 quantiles: numpy.quantile([1, 2, 3, 4], 0.25) = 1.75 and
 *   numpy.quantile(range(1, 11), 0.975) = 9.775 (numpy's documented default "linear" method).
 */

import { describe, expect, test } from "vitest";
import { bootstrapRange, mergeBootstrapRanges, type BootstrapRange } from "../../../../src/core/inference/bootstrap/replicates.js";
import { bootstrapQuantities, type BootstrapQuantity } from "../../../../src/core/inference/bootstrap/statistics.js";
import { bootstrapSolve, quantileSorted } from "../../../../src/core/inference/bootstrap/summary.js";
import { bartlettFixedBQuantile } from "../../../../src/core/inference/hac/fixedB.js";
import { resampleIndices } from "../../../../src/core/inference/bootstrap/stationaryBootstrap.js";
import { drawSample } from "../../../../src/core/forward/simulate.js";
import { solve } from "../../../../src/core/solve.js";
import { expectClose } from "../../../support/close.js";

const structure = { lowBeta: 0.75, weight: 0.4, factorVol: 0.01, factorMean: 0.0006, lowNoiseVol: 0.004, highNoiseVol: 0.006 };
const sample = drawSample(structure, { periods: 300, seed: 5, noiseAr: 0.3 });
const riskFree = Float64Array.from({ length: 300 }, (_, t) => 0.0001 + 0.00001 * Math.sin(t / 20));
const data = { low: sample.low, high: sample.high, riskFree, weight: 0.4 };
const plan = { blockLength: 6, seed: 99 };

function draw(range: BootstrapRange, name: BootstrapQuantity, r: number): number {
  const count = range.to - range.from;
  return range.draws[bootstrapQuantities.indexOf(name) * count + (r - range.from)]!;
}

describe("a replicate's statistics are solve() on the resampled rows", () => {
  test.each([0, 7, 123])("replicate %s", (r) => {
    const indices = resampleIndices(300, plan.blockLength, plan.seed, r);
    const pick = (a: ArrayLike<number>) => Float64Array.from(indices, (i) => a[i]!);
    const result = solve({ low: pick(data.low), high: pick(data.high), riskFree: pick(riskFree) }, { weight: 0.4 });
    if (!result.ok) expect.fail("solve failed");
    const s = result.value;
    const range = bootstrapRange(data, plan, r, r + 1);
    const expected: Partial<Record<BootstrapQuantity, number | null | undefined>> = {
      lowBetaMin: s.bounds?.lowBeta.min,
      lowBetaMax: s.bounds?.lowBeta.max,
      highBetaMin: s.bounds?.highBeta.min,
      highBetaMax: s.bounds?.highBeta.max,
      lowCapmBeta: s.capm.low.beta,
      highCapmBeta: s.capm.high.beta,
      lowCapmAlpha: s.capm.low.alpha,
      highCapmAlpha: s.capm.high.alpha,
      capmConsistentLowBeta: s.landmarks?.capmConsistent.lowBeta,
      equalNoiseLowBeta: s.landmarks?.equalNoise.lowBeta,
      lowSharpe: s.moments.low.sharpeRatio,
      highSharpe: s.moments.high.sharpeRatio,
      marketSharpe: s.moments.market.sharpeRatio,
    };
    for (const [name, value] of Object.entries(expected) as [BootstrapQuantity, number][]) {
      expectClose(draw(range, name, r), value, { rel: 1e-10 });
    }
    // The replicated return-implied beta is the plain ratio of means (whether or not solve would report
    // the point): mean excess low / mean excess market of the resampled rows.
    const lambda = s.moments.market.mean;
    expectClose(draw(range, "returnImpliedLowBeta", r), s.moments.low.mean / lambda, { rel: 1e-10 });
  });
});

const whole = bootstrapRange(data, plan, 0, 40);

describe("ranges of replicates", () => {
  test("any split of [0, B) into ranges, merged in any order, gives bit-identical draws", () => {
    const parts = [bootstrapRange(data, plan, 25, 40), bootstrapRange(data, plan, 0, 3), bootstrapRange(data, plan, 3, 25)];
    expect(mergeBootstrapRanges(parts, 40).draws).toEqual(whole.draws);
    expect(mergeBootstrapRanges([whole], 40).draws).toEqual(whole.draws);
  });

  test("merging refuses ranges that leave a gap or overlap", () => {
    expect(() => mergeBootstrapRanges([bootstrapRange(data, plan, 0, 10), bootstrapRange(data, plan, 11, 40)], 40)).toThrow(RangeError);
    expect(() => mergeBootstrapRanges([bootstrapRange(data, plan, 0, 10), bootstrapRange(data, plan, 5, 40)], 40)).toThrow(RangeError);
    expect(() => mergeBootstrapRanges([bootstrapRange(data, plan, 0, 10)], 40)).toThrow(RangeError);
  });
});

describe("summaries", () => {
  test("type-7 quantiles: numpy.quantile([1, 2, 3, 4], 0.25) = 1.75; numpy.quantile(1..10, 0.975) = 9.775", () => {
    expectClose(quantileSorted(Float64Array.from([1, 2, 3, 4]), 0.25), 1.75, { rel: 1e-15 });
    expectClose(
      quantileSorted(
        Float64Array.from({ length: 10 }, (_, i) => i + 1),
        0.975,
      ),
      9.775,
      { rel: 1e-15 },
    );
  });

  test("percentile limits, stretched from the median by the fixed-b factor, and standard errors are the quantiles and sd (divisor B - 1) of the replicates", () => {
    const summary = bootstrapSolve(data.low, data.high, riskFree, 0.4, { replicates: 40, ...plan, confidence: 0.9 });
    const values = Float64Array.from({ length: 40 }, (_, r) => draw(whole, "lowBetaMax", r)).sort();
    const mean = values.reduce((s, v) => s + v, 0) / 40;
    const sd = Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / 39);
    // 40 replicates: the 5%, 50% and 95% type-7 positions are 1.95, 19.5 and 37.05 (0-based); the factor is
    // the fixed-b 95% quantile over the normal one at b = 2 x 6 / 300 (test/core/inference/hac/fixedB.test.ts).
    const median = values[19]! + 0.5 * (values[20]! - values[19]!);
    const k = bartlettFixedBQuantile((2 * 6) / 300, 0.95) / 1.6448536269514722;
    expect(k).toBeGreaterThan(1.01);
    expectClose(summary.intervals.lowBetaMax?.lower, median - k * (median - (values[1]! + 0.95 * (values[2]! - values[1]!))), {
      rel: 1e-13,
    });
    expectClose(summary.intervals.lowBetaMax?.upper, median + k * (values[37]! + 0.05 * (values[38]! - values[37]!) - median), {
      rel: 1e-13,
    });
    expectClose(summary.stdErrors.lowBetaMax, sd, { rel: 1e-12 });
    expect(summary.validReplicates.lowBetaMax).toBe(40);
    expect(summary.blockLength).toBe(6);
  });
});
