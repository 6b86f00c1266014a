/**
 * rollSolveColumns against rollSolve (src/core/rolling/) on every window: the columns are the same
 * computation without the per-window objects, so the reference is rollSolve itself and the values
 * must be identical (NaN exactly where rollSolve reports null).
 */

import { describe, expect, test } from "vitest";
import {
  rollSolve,
  rollSolveColumnBlocks,
  rollSolveColumns,
  windowColumnNames,
  type WindowSolution,
} from "../../../src/core/rolling/index.js";
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

describe("rollSolveColumnBlocks", () => {
  test.each([1, 1000])("gives rollSolveColumns' numbers a block at a time, in reused arrays (returns times %d)", (factor) => {
    const data = dataSets(300)[0]!;
    const low = Float64Array.from(data.low, (x) => x * factor);
    const high = Float64Array.from(data.high, (x) => x * factor);
    // A flat stretch: windows without a set (NaN) between windows with one, across block boundaries.
    low.fill(0.001 * factor, 100, 160);
    const spec = { kind: "window", size: 40, step: 3 } as const;
    const whole = rollSolveColumns(low, high, 0, 0.5, spec);
    const copies = Object.fromEntries(windowColumnNames.map((name) => [name, [] as number[]]));
    const starts: number[] = [];
    const sizes: number[] = [];
    for (const block of rollSolveColumnBlocks(low, high, 0, 0.5, spec, 7)) {
      sizes.push(block.count);
      starts.push(...block.start.subarray(0, block.count));
      // Copied as each block arrives: the next block reuses the arrays.
      for (const name of windowColumnNames) copies[name]!.push(...block.columns[name].subarray(0, block.count));
    }
    expect(sizes.slice(0, -1).every((n) => n === 7)).toBe(true);
    expect(sizes.reduce((a, b) => a + b, 0)).toBe(whole.count);
    expect(starts).toEqual(Array.from(whole.start));
    expect(whole.columns.lowBetaMin.some(Number.isNaN)).toBe(true);
    for (const name of windowColumnNames) expect(copies[name], name).toEqual(Array.from(whole.columns[name]));
  });
});
