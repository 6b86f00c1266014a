/**
 * Imbens & Manski (2004) critical values and intervals, against docs/methods.md §5.1 (C_N table
 * computed with scipy brentq) and section 1.7 Example A (T = 120). The table is printed to 6-7
 * decimals, so the tolerance is half a unit of the last printed decimal.
 */

import { describe, test } from "vitest";
import { imbensManskiCriticalValue, imbensManskiInterval } from "../../../src/core/inference/imbensManski.js";
import { expectClose } from "../../support/close.js";

describe("Imbens-Manski critical value C_N (docs/methods.md §5.1, alpha = 0.05)", () => {
  // r = Delta / max(se):   0        0.1      0.25     0.5      1        1.5      2        3        >= 4
  const table: [number, number][] = [
    [0, 1.959964],
    [0.1, 1.912412],
    [0.25, 1.850183],
    [0.5, 1.769713],
    [1, 1.681477],
    [1.5, 1.652746],
    [2, 1.646146],
    [3, 1.64487],
    [4, 1.644854],
    [35, 1.644854],
  ];
  test.each(table)("r = %s gives C = %s", (r, c) => {
    expectClose(imbensManskiCriticalValue(r, 0.95), c, { abs: 5e-7 });
  });
});

describe("Imbens-Manski critical value C_N (docs/methods.md §5.1, alpha = 0.10)", () => {
  const table: [number, number][] = [
    [0, 1.644854],
    [0.5, 1.445581],
    [1, 1.338751],
    [2, 1.284468],
    [4, 1.281552],
  ];
  test.each(table)("r = %s gives C = %s", (r, c) => {
    expectClose(imbensManskiCriticalValue(r, 0.9), c, { abs: 5e-7 });
  });
});

describe("Imbens-Manski intervals", () => {
  test("Example A, T = 120: se (0.0278050, 0.0299027) give the 95% interval [0.6685506, 0.9380745] (docs/methods.md §1.7)", () => {
    const interval = imbensManskiInterval({ lower: 5 / 7, upper: 8 / 9, lowerStdError: 0.027805, upperStdError: 0.0299027 }, 0.95);
    expectClose(interval.criticalValue.lower, 1.6448536, { abs: 5e-8 });
    expectClose(interval.lower, 0.6685506, { abs: 5e-8 });
    expectClose(interval.upper, 0.9380745, { abs: 5e-8 });
  });

  test("(0.6, 0.61, se 0.02, 0.08) gives c = 1.90129 and [0.561974, 0.762103] (docs/methods.md §5.2)", () => {
    const interval = imbensManskiInterval({ lower: 0.6, upper: 0.61, lowerStdError: 0.02, upperStdError: 0.08 }, 0.95);
    expectClose(interval.criticalValue.upper, 1.90129, { abs: 5e-6 });
    expectClose(interval.lower, 0.561974, { abs: 5e-7 });
    expectClose(interval.upper, 0.762103, { abs: 5e-7 });
  });
});
