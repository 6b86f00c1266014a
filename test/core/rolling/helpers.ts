/** Data sets and from-scratch references shared by the test/core/rolling suites (not a test file itself). */

import { welfordCrossProducts } from "../../../src/core/moments.js";
import { drawSample } from "../../../src/core/forward/simulate.js";
import type { Structure } from "../../../src/core/forward/populationMoments.js";
import type { WindowSpec } from "../../../src/core/rolling/index.js";

export const dailyStructure: Structure = {
  lowBeta: 0.7,
  weight: 0.5,
  factorVol: 0.01,
  factorMean: 0.0004,
  lowNoiseVol: 0.004,
  highNoiseVol: 0.006,
};

export interface DataSet {
  readonly name: string;
  readonly low: Float64Array;
  readonly high: Float64Array;
  readonly riskFree: number | Float64Array;
  /** A level near every value (0 for returns): subtracting it is exact (Sterbenz), see solve.test.ts. */
  readonly level: number;
}

/** A time-varying risk-free rate around 1 basis point a day. */
export function riskFreeSeries(n: number): Float64Array {
  return Float64Array.from({ length: n }, (_, t) => 0.0001 + 0.00002 * Math.sin(t / 25));
}

/**
 * The data sets every window of which is checked:
 * - daily returns of the one-factor model (drawSample) with a time-varying risk-free rate;
 * - a near-constant pair: 0.01 + noise of order 1e-9 (the spread is 1e-7 of the level);
 * - price levels: 1e4 plus a random walk of the simulated returns (moves of order 0.01 on 1e4);
 * - a volatile stretch (returns `burstScale` times larger on rows 300-399) followed by calm rows, which a
 *   running add/remove (downdating) scheme would leave with the volatile stretch's absolute error.
 */
export function dataSets(n = 1200, burstScale = 1e4): DataSet[] {
  const daily = drawSample(dailyStructure, { periods: n, seed: 11 });
  const tiny = drawSample(
    { ...dailyStructure, factorVol: 1e-9, lowNoiseVol: 4e-10, highNoiseVol: 6e-10 },
    { periods: n, seed: 12, riskFree: 0.01 },
  );
  const walk = drawSample(dailyStructure, { periods: n, seed: 13 });
  const level = (x: Float64Array): Float64Array => {
    const out = new Float64Array(x.length);
    let price = 1e4;
    for (let t = 0; t < x.length; t++) out[t] = price += x[t]!;
    return out;
  };
  const calm = drawSample(dailyStructure, { periods: n, seed: 14 });
  const burst = (x: Float64Array): Float64Array => x.map((value, t) => (t >= 300 && t < 400 ? value * burstScale : value));
  return [
    { name: "daily returns", low: daily.low, high: daily.high, riskFree: riskFreeSeries(n), level: 0 },
    { name: "near-constant returns (0.01 + 1e-9 noise)", low: tiny.low, high: tiny.high, riskFree: 0, level: 0.01 },
    { name: "price levels near 1e4 with small moves", low: level(walk.low), high: level(walk.high), riskFree: 0, level: 1e4 },
    { name: "calm returns after a volatile stretch", low: burst(calm.low), high: burst(calm.high), riskFree: 0.0001, level: 0 },
  ];
}

export const specs: readonly WindowSpec[] = [
  { kind: "window", size: 60, step: 1 },
  { kind: "window", size: 252, step: 7 },
  { kind: "window", size: 20, step: 37 },
  { kind: "expanding", minPeriods: 3, step: 1 },
  { kind: "expanding", minPeriods: 100, step: 13 },
];

export function describeSpec(spec: WindowSpec): string {
  return spec.kind === "window" ? `window ${spec.size}, step ${spec.step}` : `expanding from ${spec.minPeriods}, step ${spec.step}`;
}

/** The rows [start, end] of the excess returns, formed as solve forms them (r - rf per row). */
export function excessRows(data: DataSet, start: number, end: number): { low: number[]; high: number[] } {
  const low: number[] = [];
  const high: number[] = [];
  for (let t = start; t <= end; t++) {
    const r = typeof data.riskFree === "number" ? data.riskFree : data.riskFree[t]!;
    low.push(data.low[t]! - r);
    high.push(data.high[t]! - r);
  }
  return { low, high };
}

/** Raw rows [start, end] (what solve is given on the window). */
export function windowSample(data: DataSet, start: number, end: number) {
  return {
    low: data.low.subarray(start, end + 1),
    high: data.high.subarray(start, end + 1),
    riskFree: typeof data.riskFree === "number" ? data.riskFree : data.riskFree.subarray(start, end + 1),
  };
}

/** Moments of the window recomputed from scratch with welfordCrossProducts (the reference of the rolling code). */
export function fromScratch(data: DataSet, start: number, end: number) {
  const { low, high } = excessRows(data, start, end);
  const cp = welfordCrossProducts([low, high]);
  const dof = cp.n - 1;
  return {
    lowMean: cp.means[0]!,
    highMean: cp.means[1]!,
    lowVariance: cp.sums[0]![0]! / dof,
    highVariance: cp.sums[1]![1]! / dof,
    covariance: cp.sums[0]![1]! / dof,
  };
}

/** Collects mismatches |a - e| > rel |e| + abs as messages, so one assertion reports them all. */
export class Mismatches {
  readonly list: string[] = [];
  check(what: string, actual: number | null | undefined, expected: number, rel: number, abs = 0): void {
    if (actual === null || actual === undefined) {
      this.list.push(`${what}: missing (expected ${expected})`);
      return;
    }
    if (!(Math.abs(actual - expected) <= rel * Math.abs(expected) + abs)) {
      this.list.push(`${what}: ${actual} vs ${expected} (relative ${Math.abs(actual - expected) / Math.abs(expected)})`);
    }
  }
  /** The first few mismatches (enough to diagnose, short enough to read). */
  head(): string[] {
    return this.list.slice(0, 10);
  }
}
