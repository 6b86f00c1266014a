/**
 * Where long arrays come from (src/core/numerics/freshMemory.ts) and how the scratch pool asks for
 * them (scratch.ts): plain allocations unless a runtime installs a source; with a source that readies
 * memory ahead, the pool's first long series brings five more with it, once per scope (or six at once
 * when a job expects them), and the results of a pass are the same bits whichever source gave its arrays.
 */
import { afterEach, describe, expect, it } from "vitest";
import { drawSample } from "../../../src/core/forward/simulate.js";
import { assessUncertainty } from "../../../src/core/inference/uncertainty.js";
import { type FreshMemory, freshFloat64, freshInt32, freshUint8, useFreshMemory } from "../../../src/core/numerics/freshMemory.js";
import { borrowSeries, expectSeries, giveBack, SCRATCH_MIN, withScratch } from "../../../src/core/numerics/scratch.js";

/** A source that records the lengths asked of it and hands out arrays in shared memory. */
function recordingSource(readiesAhead: boolean): FreshMemory & { asked: number[] } {
  const asked: number[] = [];
  const shared = (bytes: number) => new SharedArrayBuffer(Math.max(4, Math.ceil(bytes / 4) * 4));
  return {
    asked,
    float64: (length) => {
      asked.push(length);
      return new Float64Array(shared(8 * length), 0, length);
    },
    int32: (length) => new Int32Array(shared(4 * length), 0, length),
    uint8: (length) => new Uint8Array(shared(length), 0, length),
    readiesAhead,
  };
}

afterEach(() => useFreshMemory(null));

describe("fresh memory", () => {
  it("is plain allocation until a source is installed, and again once it is removed", () => {
    expect(freshFloat64(3).buffer).toBeInstanceOf(ArrayBuffer);
    const source = recordingSource(false);
    useFreshMemory(source);
    const a = freshFloat64(5);
    expect(a.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect([...a]).toEqual([0, 0, 0, 0, 0]);
    expect(freshInt32(3).length).toBe(3);
    expect(freshUint8(7).length).toBe(7);
    expect(source.asked).toEqual([5]);
    useFreshMemory(null);
    expect(freshFloat64(3).buffer).toBeInstanceOf(ArrayBuffer);
  });

  it("gives the scratch pool five more long series at its first one when the source readies memory ahead", () => {
    const long = 1 << 18;
    const source = recordingSource(true);
    useFreshMemory(source);
    withScratch(() => {
      const first = borrowSeries(long);
      expect(source.asked).toEqual([long, long, long, long, long, long]);
      const more = [1, 2, 3, 4, 5].map(() => borrowSeries(long));
      // The five came from the pool: nothing more was asked of the source.
      expect(source.asked.length).toBe(6);
      expect(new Set([first, ...more]).size).toBe(6);
      borrowSeries(long);
      expect(source.asked.length).toBe(7);
      giveBack(first);
      expect(borrowSeries(long)).toBe(first);
    });
    // Once per scope (a new scope asks again), and only for long series.
    withScratch(() => borrowSeries(long));
    expect(source.asked.length).toBe(13);
    withScratch(() => borrowSeries(long - 1));
    expect(source.asked.length).toBe(14);
    withScratch(() => borrowSeries(SCRATCH_MIN - 1));
    expect(source.asked.length).toBe(14);
  });

  it("gives the pool six long series at once when a scope expects them, and the next six borrows ask nothing", () => {
    const long = 1 << 18;
    const source = recordingSource(true);
    useFreshMemory(source);
    withScratch(() => {
      expectSeries(long);
      expect(source.asked).toEqual([long, long, long, long, long, long]);
      const borrowed = Array.from({ length: 6 }, () => borrowSeries(long));
      expect(source.asked.length).toBe(6);
      expect(new Set(borrowed).size).toBe(6);
      expectSeries(long); // once per scope, and no more ahead at the next borrow
      borrowSeries(long);
      expect(source.asked.length).toBe(7);
    });
    // Nothing outside a scope or for shorter series.
    expectSeries(long);
    withScratch(() => expectSeries(long - 1));
    expect(source.asked.length).toBe(7);
  });

  it("asks nothing ahead of a source that does not ready memory", () => {
    const source = recordingSource(false);
    useFreshMemory(source);
    withScratch(() => borrowSeries(1 << 18));
    expect(source.asked).toEqual([1 << 18]);
    withScratch(() => expectSeries(1 << 18));
    expect(source.asked).toEqual([1 << 18]);
  });

  it("leaves the uncertainty's numbers as they are, bit for bit, with arrays in shared memory readied ahead", () => {
    const w = 0.5;
    const sample = drawSample(
      { lowBeta: 0.7, weight: w, factorVol: 0.01, factorMean: 0.0004, lowNoiseVol: 0.004, highNoiseVol: 0.005 },
      { periods: 3000, seed: 5, noiseAr: 0.3 },
    );
    const plain = assessUncertainty(sample, { weight: w });
    useFreshMemory(recordingSource(true));
    expect(assessUncertainty(sample, { weight: w })).toStrictEqual(plain);
  });
});
