/**
 * rollingMoments against crossProducts recomputed from scratch on each window's rows (the reference:
 * src/core/moments.ts, itself checked against NIST StRD in test/core/moments.nist.test.ts).
 *
 * Tolerance: 1e-10 relative (the brief's requirement for return data). Both sides are compensated
 * Welford sums; the rolling side adds one Chan merge, so they agree to a few ulps (measured: below
 * 3e-15 relative on every data set here). Two quantities get an absolute floor, because their
 * rounding error scales with the data's spread, not with their own size: a mean, 1e-12 standard
 * deviations (a window's mean can be arbitrarily close to 0), and the covariance, 1e-12 sqrt(V_l V_h).
 */
import fc from "fast-check";

import { describe, expect, test } from "vitest";
import { iterateRollingMoments, rollingMoments, windowCount, type WindowSpec } from "../../../src/core/rolling/index.js";
import { dataSets, describeSpec, fromScratch, Mismatches, specs } from "./helpers.js";

const rel = 1e-10;
const floor = 1e-12;

describe.each(dataSets().map((data) => ({ name: data.name, data })))("rolling moments of $name", ({ data }) => {
  test.each(specs.map((spec) => ({ label: describeSpec(spec), spec })))(
    "every window ($label) has the moments crossProducts computes from scratch on its rows, to 1e-10",
    ({ spec }) => {
      const windows = rollingMoments(data.low, data.high, data.riskFree, 0.5, spec);
      expect(windows).toHaveLength(windowCount(data.low.length, spec));
      const bad = new Mismatches();
      for (const w of windows) {
        const e = fromScratch(data, w.start, w.end);
        const at = `[${w.start}, ${w.end}]`;
        bad.check(`${at} lowMean`, w.summary.lowMean, e.lowMean, rel, floor * Math.sqrt(e.lowVariance));
        bad.check(`${at} highMean`, w.summary.highMean, e.highMean, rel, floor * Math.sqrt(e.highVariance));
        bad.check(`${at} lowVariance`, w.summary.lowVariance, e.lowVariance, rel);
        bad.check(`${at} highVariance`, w.summary.highVariance, e.highVariance, rel);
        bad.check(`${at} covariance`, w.summary.covariance, e.covariance, rel, floor * Math.sqrt(e.lowVariance * e.highVariance));
      }
      expect(bad.head()).toEqual([]);
    },
  );
});

describe("window placement", () => {
  const n = 100;
  const data = dataSets(n)[0]!;
  const spans = (spec: WindowSpec) =>
    rollingMoments(data.low, data.high, data.riskFree, 0.5, spec).map((w) => [w.start, w.end, w.observations]);

  test("aligned at the start: sliding windows start at row 0 and advance by step; trailing rows may go unreported", () => {
    expect(spans({ kind: "window", size: 30, step: 25, align: "start" })).toEqual([
      [0, 29, 30],
      [25, 54, 30],
      [50, 79, 30],
    ]);
  });

  test("aligned at the end (the default): the newest window ends on the last row; the oldest rows are left out", () => {
    expect(spans({ kind: "window", size: 30, step: 25 })).toEqual([
      [20, 49, 30],
      [45, 74, 30],
      [70, 99, 30],
    ]);
    expect(spans({ kind: "expanding", minPeriods: 40, step: 25 })).toEqual([
      [0, 49, 50],
      [0, 74, 75],
      [0, 99, 100],
    ]);
  });

  test("expanding windows aligned at the start end at minPeriods - 1, then every step rows", () => {
    expect(spans({ kind: "expanding", minPeriods: 40, step: 30, align: "start" })).toEqual([
      [0, 39, 40],
      [0, 69, 70],
      [0, 99, 100],
    ]);
  });

  test("end-aligned windows are the start-aligned windows of the sample without its oldest offset rows", () => {
    fc.assert(
      fc.property(fc.integer({ min: 3, max: 40 }), fc.integer({ min: 1, max: 30 }), (size, step) => {
        const offset = (n - size) % step;
        const end = spans({ kind: "window", size, step });
        const cut = rollingMoments(
          data.low.slice(offset),
          data.high.slice(offset),
          typeof data.riskFree === "number" ? data.riskFree : data.riskFree.slice(offset),
          0.5,
          {
            kind: "window",
            size,
            step,
            align: "start",
          },
        ).map((w) => [w.start + offset, w.end + offset, w.observations]);
        expect(end).toEqual(cut);
        expect(end.at(-1)?.[1]).toBe(n - 1);
      }),
      { numRuns: 100, seed: 7 },
    );
  });

  test("a window longer than the sample gives no windows", () => {
    expect(spans({ kind: "window", size: 101, step: 1 })).toEqual([]);
    expect(windowCount(n, { kind: "expanding", minPeriods: 101, step: 1 })).toBe(0);
  });

  // The sliding window sums its rows backwards and the expanding one forwards: equal up to rounding (1e-13).
  test("the window covering the whole sample has the moments of the expanding window ending at the last row", () => {
    const [whole] = rollingMoments(data.low, data.high, data.riskFree, 0.5, { kind: "window", size: n, step: 1 });
    const [expanding] = rollingMoments(data.low, data.high, data.riskFree, 0.5, { kind: "expanding", minPeriods: n, step: 1 });
    expect([whole?.start, whole?.end]).toEqual([expanding?.start, expanding?.end]);
    const bad = new Mismatches();
    for (const key of ["lowMean", "highMean", "lowVariance", "highVariance", "covariance"] as const) {
      bad.check(key, whole?.summary[key], expanding!.summary[key], 1e-13);
    }
    expect(bad.head()).toEqual([]);
  });

  test("the iterator yields the same windows as the array form", () => {
    const spec: WindowSpec = { kind: "window", size: 10, step: 3 };
    expect(Array.from(iterateRollingMoments(data.low, data.high, data.riskFree, 0.3, spec))).toEqual(
      rollingMoments(data.low, data.high, data.riskFree, 0.3, spec),
    );
  });

  test("a constant risk-free rate gives the same windows as the same rate given as a series", () => {
    const spec: WindowSpec = { kind: "window", size: 15, step: 4 };
    expect(rollingMoments(data.low, data.high, 0.0002, 0.5, spec)).toEqual(
      rollingMoments(data.low, data.high, new Float64Array(n).fill(0.0002), 0.5, spec),
    );
  });
});

describe("arguments that are programming errors throw RangeError", () => {
  const x = new Float64Array(50).map((_, t) => Math.sin(t));
  const y = new Float64Array(50).map((_, t) => Math.cos(t));
  test.each([
    ["a window of fewer than 3 rows", x, y, 0, 0.5, { kind: "window", size: 2, step: 1 }],
    ["an expanding start below 3 rows", x, y, 0, 0.5, { kind: "expanding", minPeriods: 2, step: 1 }],
    ["a step of 0", x, y, 0, 0.5, { kind: "window", size: 10, step: 0 }],
    ["a fractional step", x, y, 0, 0.5, { kind: "window", size: 10, step: 1.5 }],
    ["a weight of 1", x, y, 0, 1, { kind: "window", size: 10, step: 1 }],
    ["series of different lengths", x, y.subarray(1), 0, 0.5, { kind: "window", size: 10, step: 1 }],
    ["a risk-free series of another length", x, y, new Float64Array(3), 0.5, { kind: "window", size: 10, step: 1 }],
  ] as const)("%s", (_, low, high, rf, w, spec) => {
    expect(() => rollingMoments(low, high, rf, w, spec as WindowSpec)).toThrow(RangeError);
  });
});
