import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { detectFrequency, frequencyFromPeriods, median } from "../../src/input/frequency.js";

const DAY_MS = 86_400_000;

describe("median", () => {
  it("is the middle value, or the mean of the two middle values", () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNaN();
  });

  it("agrees with sorting on arbitrary arrays and leaves the input unchanged", () => {
    fc.assert(fc.property(fc.array(fc.double({ noNaN: true, min: -1e6, max: 1e6 }), { minLength: 1, maxLength: 200 }), (values) => {
      const copy = [...values];
      const sorted = [...values].sort((a, b) => a - b);
      const n = sorted.length;
      const expected = n % 2 === 1 ? sorted[(n - 1) / 2] : ((sorted[n / 2 - 1] as number) + (sorted[n / 2] as number)) / 2;
      expect(median(values)).toBe(expected);
      expect(values).toEqual(copy);
    }));
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

  it("names an explicit periods-per-year after the nearest standard frequency", () => {
    expect(frequencyFromPeriods(12)).toEqual({ name: "monthly", periodsPerYear: 12, from: "option" });
    expect(frequencyFromPeriods(365)).toEqual({ name: "daily", periodsPerYear: 365, from: "option" });
    expect(frequencyFromPeriods(26)).toEqual({ name: "weekly", periodsPerYear: 26, from: "option" });
  });
});
