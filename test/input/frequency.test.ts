import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { detectFrequency, frequencyFromPeriods, median } from "../../src/input/values/frequency.js";

const DAY_MS = 86_400_000;

describe("median", () => {
  it("is the middle value, or the mean of the two middle values", () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNaN();
  });

  it("agrees with sorting on arbitrary arrays and leaves the input unchanged", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), { minLength: 1, maxLength: 200 }), (values) => {
        const copy = [...values];
        const sorted = [...values].sort((a, b) => a - b);
        const n = sorted.length;
        const expected = n % 2 === 1 ? sorted[(n - 1) / 2] : ((sorted[n / 2 - 1] as number) + (sorted[n / 2] as number)) / 2;
        // + 0 makes -0 and 0 equal: the order of equal values (as -0 and 0 are to a sort) is not part of the contract.
        expect(median(values) + 0).toBe((expected as number) + 0);
        expect(values).toEqual(copy);
      }),
    );
  });
});

describe("detectFrequency", () => {
  it("reads business-day data with weekend gaps as daily", () => {
    const keys = [0, 1, 2, 3, 4, 7, 8, 9, 10, 11, 14].map((d) => d * DAY_MS);
    expect(detectFrequency(keys)).toEqual({ name: "daily", periodsPerYear: 252, from: "detected" });
  });

  it("needs at least two dates", () => {
    expect(detectFrequency([0])).toBeNull();
  });

  it("is robust to a few long gaps", () => {
    const keys = [0, 7, 14, 21, 100, 107, 114].map((d) => d * DAY_MS);
    expect(detectFrequency(keys)?.name).toBe("weekly");
  });

  it("gives what the median of all gaps gives, with whole-day gaps counted in a histogram or not", () => {
    const BANDS = [
      ["daily", 0.5, 4.5],
      ["weekly", 5, 10],
      ["monthly", 25, 35],
      ["quarterly", 80, 100],
      ["annual", 350, 380],
    ] as const;
    const reference = (keys: readonly number[]): string | null => {
      const gaps = keys.slice(1).map((k, i) => (k - (keys[i] as number)) / DAY_MS);
      const gap = median(gaps);
      return BANDS.find(([, low, high]) => gap >= low && gap <= high)?.[0] ?? null;
    };
    const gap = fc.oneof(
      fc.integer({ min: 0, max: 1100 }),
      fc.constantFrom(1, 3, 7, 28, 30, 31, 91, 365, 366),
      fc.double({ min: 0, max: 400, noNaN: true }),
    );
    fc.assert(
      fc.property(fc.array(gap, { minLength: 1, maxLength: 60 }), fc.integer({ min: -1e6, max: 1e6 }), (gaps, start) => {
        const keys = [start * DAY_MS];
        for (const g of gaps) keys.push((keys[keys.length - 1] as number) + g * DAY_MS);
        expect(detectFrequency(keys)?.name ?? null).toBe(reference(keys));
      }),
      { numRuns: 2000 },
    );
    // Medians that fall right on the edge of a band: (4 + 5) / 2 = 4.5 is daily, (10 + 11) / 2 is not weekly.
    expect(detectFrequency([0, 4, 9, 13, 18].map((d) => d * DAY_MS))?.name).toBe("daily");
    expect(detectFrequency([0, 10, 21].map((d) => d * DAY_MS))).toBeNull();
  });

  it("gives what the median of all gaps gives when one gap that is not whole days is most of them", () => {
    const BANDS = [
      ["daily", 0.5, 4.5],
      ["weekly", 5, 10],
    ] as const;
    const reference = (keys: readonly number[]): string | null => {
      const gaps = keys.slice(1).map((k, i) => (k - (keys[i] as number)) / DAY_MS);
      const gap = median(gaps);
      return BANDS.find(([, low, high]) => gap >= low && gap <= high)?.[0] ?? null;
    };
    // Gaps in milliseconds: a minute, half days and four and a half days (band edges), a week and a half.
    const common = fc.constantFrom(60_000, DAY_MS / 2, 4.5 * DAY_MS, 10.5 * DAY_MS, 0.25 * DAY_MS);
    const other = fc.oneof(common, fc.integer({ min: 1, max: 20 * DAY_MS }));
    fc.assert(
      fc.property(common, fc.array(fc.tuple(fc.boolean(), other), { minLength: 1, maxLength: 60 }), (main, draws) => {
        const keys = [0];
        for (const [same, g] of draws) keys.push((keys[keys.length - 1] as number) + (same ? main : g));
        expect(detectFrequency(keys)?.name ?? null).toBe(reference(keys));
      }),
      { seed: 20261204, numRuns: 2000 },
    );
  });

  it("names an explicit periods-per-year after the nearest standard frequency", () => {
    expect(frequencyFromPeriods(12)).toEqual({ name: "monthly", periodsPerYear: 12, from: "option" });
    expect(frequencyFromPeriods(365)).toEqual({ name: "daily", periodsPerYear: 365, from: "option" });
    expect(frequencyFromPeriods(26)).toEqual({ name: "weekly", periodsPerYear: 26, from: "option" });
  });
});
