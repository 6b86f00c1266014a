/**
 * Sharpe-ratio standard errors (docs/methods.md §12).
 * - Lo (2002) Table 1, iid SE sqrt((1 + SR^2/2)/T), printed to 3 decimals (secondhand transcription,
 *   every entry reproduced by the formula in docs/methods.md).
 * - Mertens (2002) example: SR = 0.2, skewness -0.5, kurtosis 5, T = 120 -> 0.0974679 (iid-normal 0.0921954).
 * - The HAC delta method with lag 0 is Mertens' formula with moment estimates (algebra in sharpe.ts).
 */

import { readFileSync } from "node:fs";
import { describe, expect, it, test } from "vitest";
import { sharpeIidStdErr, sharpeMertensStdErr, sharpeStdErrors } from "../../../src/core/inference/sharpe.js";
import { createRandom } from "../../../src/core/numerics/rng.js";
import { expectClose } from "../../support/close.js";

describe("Lo (2002) Table 1: iid standard errors", () => {
  const periods = [12, 24, 36, 48, 60, 125, 250, 500];
  const table: [number, number[]][] = [
    [0.5, [0.306, 0.217, 0.177, 0.153, 0.137, 0.095, 0.067, 0.047]],
    [1.0, [0.354, 0.25, 0.204, 0.177, 0.158, 0.11, 0.077, 0.055]],
    [1.5, [0.421, 0.298, 0.243, 0.21, 0.188, 0.13, 0.092, 0.065]],
    [3.0, [0.677, 0.479, 0.391, 0.339, 0.303, 0.21, 0.148, 0.105]],
  ];
  test.each(table)("SR = %s", (sr, row) => {
    row.forEach((se, i) => expectClose(sharpeIidStdErr(sr, periods[i]!), se, { abs: 5e-4 }));
  });
});

describe("Mertens (2002) non-normal iid standard error (docs/methods.md §12 example)", () => {
  test("SR 0.2, skewness -0.5, kurtosis 5, T = 120: 0.0974679; normal case 0.0921954", () => {
    expectClose(sharpeMertensStdErr(0.2, -0.5, 5, 120), 0.0974679, { abs: 5e-8 });
    expectClose(sharpeMertensStdErr(0.2, 0, 3, 120), 0.0921954, { abs: 5e-8 });
    expectClose(sharpeIidStdErr(0.2, 120), 0.0921954, { abs: 5e-8 });
  });
});

describe("HAC delta-method Sharpe standard error", () => {
  test("with lag 0 it equals Mertens' formula on the sample skewness and kurtosis, up to the T vs T - 1 divisor", () => {
    const random = createRandom(7, 0);
    const n = 400;
    const r = Float64Array.from({ length: n }, () => 0.05 + random.gamma(2) - 2);
    const result = sharpeStdErrors(r, { lags: 0 });
    const mean = r.reduce((s, v) => s + v, 0) / n;
    const m = (p: number) => r.reduce((s, v) => s + (v - mean) ** p, 0) / n;
    const sr = mean / Math.sqrt(m(2));
    const expected = sharpeMertensStdErr(sr, m(3) / m(2) ** 1.5, m(4) / m(2) ** 2, n);
    // sharpe.ts uses sigma with divisor T - 1 in the estimate and the gradient: an O(1/T) difference.
    expectClose(result.hacStdErr, expected, { rel: 3 / n });
    expectClose(result.iidStdErr, sharpeIidStdErr(result.estimate, n), { rel: 1e-15 });
  });
});

describe("the Mertens (2002) iid standard error from the sample's own skewness and kurtosis", () => {
  // scipy.stats.skew and kurtosis(fisher=False) on the bundled example (test/fixtures/inference/sharpe_mertens.py).
  const reference = JSON.parse(readFileSync(new URL("../../fixtures/inference/sharpe-mertens.json", import.meta.url), "utf8")) as {
    series: Record<string, { returns: number[]; sharpe: number; mertensStdErr: number }>;
  };
  it.each(Object.entries(reference.series))("%s", (_, s) => {
    const result = sharpeStdErrors(s.returns);
    expect(result.estimate).toBeCloseTo(s.sharpe, 13);
    expect(Math.abs(result.mertensStdErr / s.mertensStdErr - 1)).toBeLessThan(1e-12);
  });
});
