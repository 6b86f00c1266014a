/**
 * The input layer's scans of a column (the first extreme value, the first date out of order, the counts
 * of the unit check, the histogram of whole-day gaps) in the column kernel (src/core/numerics/columnKernel.wat) against their JavaScript
 * loops (`useKernel = false`): the same answers, NaN included, at lengths up to what the kernel holds.
 */
import { describe, expect, it } from "vitest";
import { createRandom } from "../../../src/core/numerics/rng.js";
import { KERNEL_ROWS } from "../../../src/core/numerics/seriesKernel.js";
import { nextExtreme } from "../../../src/input/table/convert.js";
import { firstNotIncreasing } from "../../../src/input/table/finish.js";
import { medianMayPass } from "../../../src/input/table/warnings.js";
import { medianWholeDayGap } from "../../../src/input/values/frequency.js";

const ODD = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, -0, 1e300];

function series(n: number, seed: number, centre: number, spread: number, specials: number): Float64Array {
  const random = createRandom(seed);
  const f = Float64Array.from({ length: n }, () => centre + spread * random.normal());
  for (let i = 0; i < specials; i++) f[Math.floor(random.uniform() * n)] = ODD[(i + seed) % ODD.length]!;
  return f;
}

describe("the input layer's scans in the column kernel", () => {
  const column = (n: number, seed: number, specials: number) => series(n, seed, 0, 3, specials);

  it("nextExtreme finds the first |value| beyond the limit as the loop does (NaN never counts)", () => {
    for (const [i, n] of [0, 1, 2, 1025, 10_000, 4 * KERNEL_ROWS].entries()) {
      for (const specials of [0, 1, 4]) {
        const values = column(n, 900 + i, specials);
        expect(nextExtreme(values, 0), `n ${n}`).toBe(nextExtreme(values, 0, false));
      }
    }
    const one = new Float64Array([0.1, Number.NaN, -10, 10.000000000000002, 11]);
    expect(nextExtreme(one, 0)).toBe(3);
    expect(nextExtreme(one, 4)).toBe(4);
  });

  it("firstNotIncreasing finds the first key not above the one before, as the loop does", () => {
    for (const n of [0, 1, 2, 3, 5000]) {
      const keys = Float64Array.from({ length: n }, (_, k) => 86_400_000 * k);
      expect(firstNotIncreasing(keys, 1), `n ${n}, increasing`).toBe(firstNotIncreasing(keys, 1, false));
      for (const at of [1, Math.floor(n / 2), n - 1]) {
        if (at < 1 || at >= n) continue;
        for (const value of [keys[at - 1]!, keys[at - 1]! - 1, Number.NaN]) {
          const broken = keys.slice();
          broken[at] = value;
          expect(firstNotIncreasing(broken, 1), `n ${n}, at ${at}, ${value}`).toBe(firstNotIncreasing(broken, 1, false));
        }
      }
    }
  });

  it("medianMayPass counts as the loop does, above and below, NaN in the sample included", () => {
    for (const [i, n] of [1, 2, 3, 101, 10_000, 25_000].entries()) {
      for (const specials of [0, 3]) {
        const values = column(n, 950 + i, specials);
        const step = Math.max(1, Math.floor(n / 10_000));
        const size = Math.ceil(n / step);
        for (const [threshold, below] of [
          [0.5, false],
          [2, false],
          [0.0005, true],
          [2, true],
        ] as const) {
          expect(medianMayPass(values, step, size, threshold, below), `n ${n}, ${threshold}, ${below}`).toBe(
            medianMayPass(values, step, size, threshold, below, false),
          );
        }
      }
    }
  });
});

describe("the whole-day gaps' histogram in the column kernel", () => {
  const day = 86_400_000;
  /** Keys from gaps (days) starting at 2001-01-01. */
  const keysOf = (gaps: readonly number[]) => {
    const keys = new Float64Array(gaps.length + 1);
    keys[0] = Date.UTC(2001, 0, 1);
    gaps.forEach((g, i) => {
      keys[i + 1] = keys[i]! + g * day;
    });
    return keys;
  };
  const random = createRandom(77);
  const cases: Record<string, readonly number[]> = {
    "business days": Array.from({ length: 2519 }, (_, i) => (i % 5 === 4 ? 3 : 1)),
    "month ends": Array.from({ length: 239 }, () => 28 + Math.floor(random.uniform() * 4)),
    "an even count": [1, 1, 3, 3],
    "an odd count": [7, 7, 7],
    "one gap": [1],
    "a repeated date": [1, 0, 1, 1],
    "a fractional gap": [1, 1, 0.5, 1],
    "a step back": [1, -1, 1],
    "a gap of 1024 days": [1, 1024, 1],
    "a gap of 1023 days": [1, 1023, 1],
    "a missing date": [1, Number.NaN, 1],
    "many rows": Array.from({ length: 40_000 }, (_, i) => (i % 7 === 6 ? 2 : 1)),
  };

  it.each(Object.entries(cases))("gives the loop's median gap: %s", (_, gaps) => {
    const keys = keysOf(gaps);
    expect(medianWholeDayGap(keys)).toBe(medianWholeDayGap(keys, false));
  });

  it("counts the gaps (a median the loop also finds, not null)", () => {
    expect(medianWholeDayGap(keysOf(cases["business days"]!))).toBe(1);
    expect(medianWholeDayGap(keysOf(cases["an even count"]!))).toBe(2);
    expect(medianWholeDayGap(keysOf(cases["a fractional gap"]!))).toBeNull();
  });
});
