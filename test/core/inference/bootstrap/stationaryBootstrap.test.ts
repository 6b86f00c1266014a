/**
 * The stationary bootstrap's resampling plan (Politis & Romano 1994) against the exact conditional
 * moments of the resampled mean (docs/methods.md §7.1, derived there and checked by simulation):
 *   E*(mean*) = Xbar,
 *   Var*(mean*) = (1/n) [c(0) + sum_{i=1}^{n-1} b(i) c(i)],  b(i) = (1 - i/n)(1-p)^i + (i/n)(1-p)^{n-i},
 *   c(k) = (1/n) sum_j (X_j - Xbar)(X_{(j+k) mod n} - Xbar).
 * The simulated moments must lie within 4 Monte Carlo standard errors (estimated from the replicates
 * themselves); the "doubled" form c(0) + 2 sum b(i) c(i), which docs/methods.md shows to be wrong, must not.
 */

import { describe, expect, test } from "vitest";
import { drawBlocks, replicateRandom, resampleIndices } from "../../../../src/core/inference/bootstrap/stationaryBootstrap.js";
import { ar1Series } from "../fixtures.js";

const x = ar1Series().slice(0, 60);
const n = x.length;
const xbar = x.reduce((s, v) => s + v, 0) / n;

function circularAutocovariance(k: number): number {
  let s = 0;
  for (let j = 0; j < n; j++) s += (x[j]! - xbar) * (x[(j + k) % n]! - xbar);
  return s / n;
}

function exactVariance(p: number, doubled = false): number {
  let total = circularAutocovariance(0);
  for (let i = 1; i < n; i++) {
    const b = (1 - i / n) * (1 - p) ** i + (i / n) * (1 - p) ** (n - i);
    total += (doubled ? 2 : 1) * b * circularAutocovariance(i);
  }
  return total / n;
}

function simulate(blockLength: number, replicates: number) {
  const means = new Float64Array(replicates);
  for (let r = 0; r < replicates; r++) {
    const indices = resampleIndices(n, blockLength, 2024, r);
    let s = 0;
    for (const i of indices) s += x[i]!;
    means[r] = s / n;
  }
  const mean = means.reduce((s, v) => s + v, 0) / replicates;
  const squares = means.map((m) => (m - xbar) ** 2);
  const variance = squares.reduce((s, v) => s + v, 0) / replicates;
  const varianceSe = Math.sqrt(squares.reduce((s, v) => s + (v - variance) ** 2, 0) / (replicates - 1) / replicates);
  return { mean, meanSe: Math.sqrt(variance / replicates), variance, varianceSe };
}

describe.each([5, 2])("stationary bootstrap with mean block length %s on 60 AR(1) values", (blockLength) => {
  const p = 1 / blockLength;
  const mc = simulate(blockLength, 100_000);

  test("E*(mean*) = Xbar within 4 Monte Carlo standard errors", () => {
    expect(Math.abs(mc.mean - xbar)).toBeLessThan(4 * mc.meanSe);
  });

  test("Var*(mean*) matches the §7.1 closed form with the b(i) weights within 4 Monte Carlo standard errors", () => {
    expect(Math.abs(mc.variance - exactVariance(p))).toBeLessThan(4 * mc.varianceSe);
  });

  test("the doubled form c(0) + 2 sum b(i) c(i) is rejected by the same simulation", () => {
    expect(Math.abs(mc.variance - exactVariance(p, true))).toBeGreaterThan(10 * mc.varianceSe);
  });
});

describe("block plan", () => {
  test("mean block length 1 resamples single rows (p = 1: every row starts a new block)", () => {
    const starts = new Int32Array(50);
    const lengths = new Int32Array(50);
    expect(drawBlocks(50, 1, replicateRandom(3, 0), starts, lengths)).toBe(50);
    expect([...lengths].every((l) => l === 1)).toBe(true);
  });

  test("block lengths are Geometric(1/b): mean b = 8 within 4 Monte Carlo standard errors", () => {
    // One long resample (n = 400,000, ~50,000 blocks): excluding the final, cut block then biases the
    // mean by only O(b/blocks), far below the Monte Carlo error (a renewal-process length bias).
    const rows = 400_000;
    const starts = new Int32Array(rows);
    const lengths = new Int32Array(rows);
    const count = drawBlocks(rows, 8, replicateRandom(11, 0), starts, lengths);
    const seen = lengths.subarray(0, count - 1);
    const mean = seen.reduce((s, v) => s + v, 0) / seen.length;
    // Geometric(p) has variance (1 - p)/p^2 = 56.
    expect(Math.abs(mean - 8)).toBeLessThan(4 * Math.sqrt(56 / seen.length));
    expect(starts.subarray(0, count).every((s) => s >= 0 && s < rows)).toBe(true);
  });
});
