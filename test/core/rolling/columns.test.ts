/**
 * rollSolveColumns against rollSolve (src/core/rolling/) on every window: the columns are the same
 * computation without the per-window objects, so the reference is rollSolve itself and the values
 * must be identical (NaN exactly where rollSolve reports null).
 */

import { describe, expect, test } from "vitest";
import { rollSolve, rollSolveColumns, windowColumnNames, type WindowSolution } from "../../../src/core/rolling/index.js";
import { dataSets, describeSpec, specs } from "./helpers.js";

function expectedRow(w: WindowSolution): number[] {
  const s = w.summary;
  const line = (book: "low" | "high") => {
    const l = w.capm?.[book];
    return [l?.alpha, l?.beta, l?.alphaStdErr, l?.betaStdErr, l?.rSquared, l?.residualVariance];
  };
  const b = w.bounds;
  const m = w.landmarks;
  return [
    s.lowMean,
    s.highMean,
    s.lowVariance,
    s.highVariance,
    s.covariance,
    w.market.mean,
    w.market.variance,
    ...line("low"),
    ...line("high"),
    b?.lowBeta.min,
    b?.lowBeta.max,
    b?.highBeta.min,
    b?.highBeta.max,
    b?.factorVariance.min,
    b?.factorVariance.max,
    m?.lowNoiseFree.lowBeta,
    m?.highNoiseFree.lowBeta,
    m?.equalNoise.lowBeta,
    m?.capmConsistent.lowBeta,
    m?.returnImplied?.lowBeta,
  ].map((x) => x ?? Number.NaN);
}

describe.each(dataSets(600).map((data) => ({ name: data.name, data })))("rollSolveColumns on $name", ({ data }) => {
  test.each(specs.map((spec) => ({ label: describeSpec(spec), spec })))(
    "every window ($label) holds exactly rollSolve's numbers, NaN where it has null",
    ({ spec }) => {
      const records = rollSolve(data.low, data.high, data.riskFree, 0.5, spec);
      const table = rollSolveColumns(data.low, data.high, data.riskFree, 0.5, spec);
      expect(table.count).toBe(records.length);
      const mismatches: string[] = [];
      records.forEach((w, k) => {
        if (table.start[k] !== w.start || table.end[k] !== w.end || table.observations[k] !== w.observations)
          mismatches.push(`${k}: indices`);
        expectedRow(w).forEach((value, j) => {
          const name = windowColumnNames[j]!;
          if (!Object.is(table.columns[name][k], value))
            mismatches.push(`[${w.start}, ${w.end}] ${name}: ${table.columns[name][k]} vs ${value}`);
        });
      });
      expect(mismatches.slice(0, 10)).toEqual([]);
    },
  );
});

test("a window rollSolve rejects for a constant book has NaN bounds and landmarks in the columns", () => {
  const data = dataSets(60)[0]!;
  const low = Float64Array.from(data.low, (x, t) => (t < 30 ? 0.001 : x));
  const table = rollSolveColumns(low, data.high, 0, 0.5, { kind: "window", size: 20, step: 20 });
  expect(Array.from(table.columns.lowBetaMin).map(Number.isNaN)).toEqual([true, false, false]);
  expect(Array.from(table.columns.returnImpliedLowBeta.subarray(0, 1)).map(Number.isNaN)).toEqual([true]);
});
