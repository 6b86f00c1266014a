import { describe, expect, it } from "vitest";
import { createRandom } from "../../src/core/numerics/rng.js";
import { maxNumberBytes, writeNumber } from "../../src/report/numberBytes.js";

// The reference is the engine's own String(x) (ECMAScript Number::toString): every number's bytes
// must equal Buffer.from(String(x)), whichever path wrote them.

const buffer = new Uint8Array(4 * maxNumberBytes);

/** The numbers among `xs` whose written bytes differ from String(x)'s (at most 10, as text). */
function mismatches(xs: Iterable<number>): string[] {
  const found: string[] = [];
  const sentinel = 0xff;
  for (const x of xs) {
    buffer.fill(sentinel);
    const end = writeNumber(x, buffer, maxNumberBytes);
    const want = String(x); // ASCII: its bytes are its character codes
    let same = end - maxNumberBytes === want.length && want.length <= maxNumberBytes;
    for (let k = 0; same && k < want.length; k++) same = buffer[maxNumberBytes + k] === want.charCodeAt(k);
    // Nothing written outside [start, end).
    same &&= buffer[maxNumberBytes - 1] === sentinel && buffer[end] === sentinel && buffer[end + maxNumberBytes] === sentinel;
    if (!same) {
      found.push(`${want} written as ${Buffer.from(buffer.subarray(maxNumberBytes, end)).toString("latin1")}`);
      if (found.length >= 10) break;
    }
  }
  return found;
}

const bits = new Float64Array(1);
const words = new Uint32Array(bits.buffer);

/** Doubles from uniform random bit patterns: every magnitude, subnormals, both signs (no NaN). */
function* randomBitPatterns(count: number, seed: number): Generator<number> {
  const random = createRandom(seed);
  for (let i = 0; i < count; i++) {
    words[0] = Math.floor(random.uniform() * 2 ** 32);
    words[1] = Math.floor(random.uniform() * 2 ** 32);
    if (!Number.isNaN(bits[0]!)) yield bits[0]!;
  }
}

/** Doubles spread over the decades the fast path covers (1e-7 to 1e18), log-uniform. */
function* randomDecades(count: number, seed: number): Generator<number> {
  const random = createRandom(seed);
  for (let i = 0; i < count; i++) {
    const x = 10 ** (25 * random.uniform() - 7);
    yield random.uniform() < 0.5 ? -x : x;
  }
}

/** Decimals of few digits (3 to 12 significant), where shorter texts and exact ties are frequent. */
function* shortDecimals(count: number, seed: number): Generator<number> {
  const random = createRandom(seed);
  for (let i = 0; i < count; i++) {
    const digits = 3 + Math.floor(10 * random.uniform());
    const mantissa = Math.floor(random.uniform() * 10 ** digits);
    yield mantissa / 10 ** Math.floor(22 * random.uniform());
  }
}

/** Sums and products of short decimals (0.1 + 0.2 and its kind): near-ties of the 17th digit. */
function* roundedArithmetic(count: number, seed: number): Generator<number> {
  const random = createRandom(seed);
  for (let i = 0; i < count; i++) {
    const a = Math.floor(random.uniform() * 1000) / 10 ** Math.floor(6 * random.uniform());
    const b = Math.floor(random.uniform() * 1000) / 10 ** Math.floor(6 * random.uniform());
    yield random.uniform() < 0.5 ? a + b : a * b;
  }
}

/** Neighbours of powers of two and ten: x and the doubles a few ulps either side. */
function* neighbours(): Generator<number> {
  for (let e = -1074; e <= 1023; e++) for (const x of [2 ** e, 3 * 2 ** (e - 1)]) yield* around(x);
  for (let e = -323; e <= 308; e++) yield* around(Number(`1e${e}`));
}

function* around(x: number): Generator<number> {
  if (!Number.isFinite(x) || x === 0) return;
  bits[0] = x;
  const low = words[0]!;
  const high = words[1]!;
  for (let d = -3; d <= 3; d++) {
    const shifted = low + d;
    words[0] = shifted >>> 0;
    words[1] = high + Math.floor(shifted / 2 ** 32);
    yield bits[0]!;
    yield -bits[0]!;
  }
}

describe("writeNumber writes the bytes of String(x)", () => {
  it("for the edge cases: zeros, integers, the limits of each notation, subnormals, infinities", () => {
    const edges = [
      0,
      -0,
      1,
      -1,
      7,
      252,
      2 ** 31 - 1,
      2 ** 31,
      -(2 ** 31),
      2 ** 53,
      2 ** 53 + 2,
      2 ** 53 + 1, // 9007199254740993 read as 2^53
      0.1,
      0.2,
      0.1 + 0.2,
      1 / 3,
      2 / 3,
      0.5,
      1e-6,
      1e-7,
      1.5e-7,
      0.000001234,
      0.0000012345678901234567,
      1e15,
      1e16,
      1e17,
      1e20,
      1e21,
      123456789012345680000,
      1.7976931348623157e308,
      2.2250738585072014e-308,
      2.225073858507201e-308,
      5e-324,
      -5e-324,
      Number.EPSILON,
      Number.MAX_SAFE_INTEGER,
      Number.POSITIVE_INFINITY,
      Number.NEGATIVE_INFINITY,
      Number.NaN,
    ];
    expect(mismatches(edges)).toEqual([]);
  });

  // Counts keep the file near two seconds: the bit patterns mostly reach the fallback (the fast path
  // spans 23 of the 632 decades), the decades the fast path itself.
  it("for 200,000 doubles of random bit patterns (every magnitude, subnormals, both signs)", () => {
    expect(mismatches(randomBitPatterns(200_000, 11))).toEqual([]);
  });

  it("for 500,000 doubles spread over the decades of the fast path", () => {
    expect(mismatches(randomDecades(500_000, 12))).toEqual([]);
  });

  it("for short decimals and their sums and products", () => {
    expect(mismatches(shortDecimals(150_000, 13))).toEqual([]);
    expect(mismatches(roundedArithmetic(150_000, 14))).toEqual([]);
  });

  it("for the neighbours of every power of two and of ten", () => {
    expect(mismatches(neighbours())).toEqual([]);
  });

  it("writes no more than maxNumberBytes", () => {
    const longest = [-1.2345678901234567e-308, -2.2250738585072014e-308, -1.7976931348623157e308, -0.0000012345678901234567];
    for (const x of longest) expect(writeNumber(x, buffer, 0)).toBeLessThanOrEqual(maxNumberBytes);
  });
});
