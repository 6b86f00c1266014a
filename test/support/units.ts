/**
 * Which numbers of betabound's results carry the returns' units: when every return is multiplied by s,
 * a first-order field (a mean, an alpha, a standard deviation) is multiplied by s, a second-order one
 * (a variance, a covariance, a factor or noise variance, a residual variance or sum of squares) by s^2,
 * and every other number (betas, correlations, t statistics, p-values, shares, Sharpe ratios, counts)
 * is unchanged (docs/methods.md §29). Fields are named the same in the core's values and the JSON.
 */
import { expect } from "vitest";

const firstOrder = new Set([
  "mean",
  "stdev",
  "alpha",
  "alphaStdErr",
  "residualStdError",
  "expectedLowAlpha",
  "expectedHighAlpha",
  "marketMean",
  "lowMean",
  "highMean",
  "lowCapmAlpha",
  "highCapmAlpha",
  "factorMean",
  "factorVol",
  "lowNoiseVol",
  "highNoiseVol",
  "rf",
  "rate",
  "expectedReturns",
]);
const secondOrder = new Set([
  "variance",
  "lowVariance",
  "highVariance",
  "covariance",
  "factorVariance",
  "lowNoiseVariance",
  "highNoiseVariance",
  "residualVariance",
  "lowResidualVariance",
  "highResidualVariance",
  "residualSumOfSquares",
  "roundingError",
]);

/** The power of s a number at `path` carries: 2 if a key is a second-order field, else 1 if one is first-order, else 0. */
export function unitPower(path: readonly string[]): number {
  if (path.includes("validReplicates")) return 0; // counts of replicates, per quantity
  if (path.some((key) => secondOrder.has(key))) return 2;
  return path.some((key) => firstOrder.has(key)) ? 1 : 0;
}

export interface ScaledDifference {
  /** The largest relative difference |scaled - plain s^power| / max(|both|). */
  readonly largest: number;
  /** Where it is. */
  readonly at: string;
  /** How many numbers were compared. */
  readonly compared: number;
}

/**
 * Every number of `scaled` against the one of `plain` times s^power; texts (but messages and sources)
 * and nulls must be equal. Numbers below `zero` in the plain result (0 in exact arithmetic, such as an
 * expected alpha at the CAPM-consistent point) are compared absolutely, to `zero` times their unit.
 */
export function scaledDifference(plain: unknown, scaled: unknown, s: number, zero = 1e-13): ScaledDifference {
  let largest = 0;
  let at = "";
  let compared = 0;
  const walk = (a: unknown, b: unknown, path: string[]): void => {
    const where = path.join(".");
    if (typeof a === "number") {
      expect(typeof b, where).toBe("number");
      const unit = s ** unitPower(path);
      const expected = a * unit;
      compared++;
      if (Math.abs(a) < zero) {
        expect(Math.abs((b as number) - expected), where).toBeLessThanOrEqual(zero * unit);
        return;
      }
      const difference = Math.abs((b as number) - expected) / Math.max(Math.abs(expected), Math.abs(b as number));
      if (difference > largest) {
        largest = difference;
        at = where;
      }
      return;
    }
    if (a === null || typeof a !== "object") {
      if (!path.includes("message") && !path.includes("source")) expect(b, where).toEqual(a);
      return;
    }
    expect(b !== null && typeof b === "object", where).toBe(true);
    for (const key of Object.keys(a)) walk((a as Record<string, unknown>)[key], (b as Record<string, unknown>)[key], [...path, key]);
  };
  walk(plain, scaled, []);
  return { largest, at, compared };
}
