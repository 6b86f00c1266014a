/**
 * The table's index arrays (src/input/table/arrays.ts): runs a[i] = start + i are views of one shared
 * counting array, and an identity order is known as one without a pass.
 */
import { describe, expect, it } from "vitest";
import { countingFrom, identityOf, isIdentity } from "../../src/input/table/arrays.js";

describe("counting runs", () => {
  it("hold start + i, whatever was asked for before", () => {
    for (const [start, length] of [
      [0, 5],
      [7, 3],
      [3, 5000],
      [0, 0],
      [4999, 2],
    ] as const) {
      const run = countingFrom(start, length);
      expect(run.length).toBe(length);
      expect(Array.from(run)).toEqual(Array.from({ length }, (_, i) => start + i));
    }
  });

  it("share one array: a run costs no memory of its own", () => {
    const a = countingFrom(2, 10);
    const b = countingFrom(5, 10);
    expect(a.buffer).toBe(b.buffer);
    expect(b.byteOffset - a.byteOffset).toBe(3 * Int32Array.BYTES_PER_ELEMENT);
  });

  it("make identity orders that isIdentity knows, and tell other runs apart", () => {
    expect(isIdentity(identityOf(100))).toBe(true);
    expect(isIdentity(countingFrom(1, 100))).toBe(false);
    expect(isIdentity(Int32Array.from([0, 1, 3]))).toBe(false);
  });
});
