/**
 * Politis-White (2004) / Patton-Politis-White (2009) block length with arch's conventions, against
 * the arch test suite (bashtage/arch arch/tests/bootstrap/test_block_length.py, docs/methods.md §7.2):
 * AR(1) with coefficient 0.3 from numpy RandomState(0), n = 10,000
 * (test/fixtures/inference/ar1_phi0.3_n10000.csv): stationary 13.635665, circular 15.60894, rtol 1e-4
 * as in that test (docs/methods.md's own port gives 13.63566513031823 / 15.608940081363112).
 */

import { describe, expect, test } from "vitest";
import { commonBlockLength, optimalBlockLength } from "../../../../src/core/inference/bootstrap/blockLength.js";
import { expectClose } from "../../../support/close.js";
import { ar1Series } from "../fixtures.js";

const series = ar1Series();

describe("optimal block length (arch conventions)", () => {
  test("the fixture is the arch series: n = 10,000, first value 2.06570021 (docs/methods.md §7.2)", () => {
    expect(series.length).toBe(10000);
    expectClose(series[0], 2.06570021, { abs: 5e-9 });
  });

  test("stationary bootstrap 13.635665 and circular 15.60894 on the AR(1) series (rtol 1e-4, arch test)", () => {
    const b = optimalBlockLength(series);
    expectClose(b.stationary, 13.635665, { rel: 1e-4 });
    expectClose(b.circular, 15.60894, { rel: 1e-4 });
  });

  test("the independent numpy port of docs/methods.md §7.2 agrees to 1e-12: 13.63566513031823 / 15.608940081363112", () => {
    const b = optimalBlockLength(series);
    expectClose(b.stationary, 13.63566513031823, { rel: 1e-12 });
    expectClose(b.circular, 15.608940081363112, { rel: 1e-12 });
  });

  test("the circular block is (3/2)^(1/3) times the stationary one when neither is capped (D_CB/D_SB = 2/3)", () => {
    const b = optimalBlockLength(series);
    expectClose(b.circular / b.stationary, Math.cbrt(1.5), { rel: 1e-14 });
  });

  test("several series take the largest per-series block length", () => {
    const half = series.subarray(0, 5000);
    const other = series.subarray(5000);
    expect(commonBlockLength([half, other])).toBe(Math.max(optimalBlockLength(half).stationary, optimalBlockLength(other).stationary));
  });
});
