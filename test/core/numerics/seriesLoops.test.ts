/**
 * The chunked elementwise passes (src/core/numerics/seriesLoops.ts) against the plain loops they stand
 * for, written out here: the same bits, over lengths around the chunk size, signed zeros included.
 */
import { describe, expect, it } from "vitest";
import { addScaledInto, blendInto, plainSum, productInto, scaledInto } from "../../../src/core/numerics/seriesLoops.js";
import { normals } from "../../support/random.js";

function sample(n: number, seed: number): Float64Array {
  const draw = normals(seed);
  // Every seventh value a zero of either sign: 0 + w * (-0) is +0, w * (-0) alone is -0.
  return Float64Array.from({ length: n }, (_, t) => (t % 7 === 3 ? -0 : t % 7 === 5 ? 0 : draw()));
}

const same = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((v, i) => Object.is(v, b[i]));

describe("elementwise passes in chunks", () => {
  for (const n of [0, 1, 1023, 1024, 1025, 5000]) {
    it(`equal the plain loops on ${n} rows`, () => {
      const a = sample(n, n + 1);
      const b = sample(n, n + 2);
      const w = -0.37;
      const plainProduct = a.map((v, t) => v * b[t]!);
      expect(same(productInto(new Float64Array(n).fill(Number.NaN), a, b), plainProduct)).toBe(true);
      const plainAdd = a.map((v, t) => v + w * b[t]!);
      expect(same(addScaledInto(Float64Array.from(a), w, b), plainAdd)).toBe(true);
      // scaledInto is addScaledInto on zeros, whatever the array held.
      const onZeros = addScaledInto(new Float64Array(n), w, b);
      expect(same(scaledInto(new Float64Array(n).fill(Number.NaN), w, b), onZeros)).toBe(true);
      if (n > 5) expect(Object.is(scaledInto(new Float64Array(n), 2, b)[3], 0)).toBe(true);
      let sum = 0;
      for (let t = 0; t < n; t++) sum += a[t]!;
      expect(Object.is(plainSum(a), sum)).toBe(true);
      const plainBlend = a.map((v, t) => 0.3 * v + (1 - 0.3) * b[t]!);
      expect(same(blendInto(new Float64Array(n).fill(Number.NaN), 0.3, a, 1 - 0.3, b), plainBlend)).toBe(true);
    });
  }
});
