/**
 * Shared by the tests of the WebAssembly kernels against their JavaScript twins: series with edge
 * values, and a bit-for-bit comparison (`Object.is` on every number, so NaN equals NaN and 0 differs
 * from -0).
 */
import { expect } from "vitest";
import { createRandom } from "../../src/core/numerics/rng.js";

/** Edge values a pass must treat as its twin does: non-finite, signed zeros, huge and subnormal. */
export const EDGE_VALUES = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, -0, 0, 1e300, -1e-320, 5e-324, -1e300];

/** n rows of centre + spread x normal draws, with `specials` of them replaced by edge values. */
export function edgeSeries(n: number, seed: number, centre = 0.01, spread = 0.02, specials = 0): Float64Array {
  const random = createRandom(seed);
  const f = Float64Array.from({ length: n }, () => centre + spread * random.normal());
  for (let i = 0; i < specials; i++) f[Math.floor(random.uniform() * n)] = EDGE_VALUES[(i + seed) % EDGE_VALUES.length]!;
  return f;
}

/** The numbers of nested arrays, typed arrays and objects, in order. */
function numbersOf(x: unknown): unknown[] {
  if (Array.isArray(x)) return x.flatMap(numbersOf);
  if (x !== null && typeof x === "object") return Object.values(x).flatMap(numbersOf);
  return [x];
}

/** `got` and `expected` hold the same values in the same places, bit for bit. */
export function expectSameBits(got: unknown, expected: unknown, label: string): void {
  const [a, b] = [numbersOf(got), numbersOf(expected)];
  expect(a.length, `${label}: length`).toBe(b.length);
  const j = a.findIndex((x, i) => !Object.is(x, b[i]));
  expect(j === -1 ? "same" : `${label}: first difference at [${j}]: ${String(a[j])} vs ${String(b[j])}`).toBe("same");
}
