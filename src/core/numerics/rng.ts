/**
 * A seeded pseudo-random generator with independent streams.
 *
 * ## Method
 * xoshiro128** (Blackman & Vigna 2018, "Scrambled linear pseudorandom number generators") on four
 * 32-bit words, seeded through SplitMix32-style mixing of (seed, stream) so that every stream of a
 * seed is a different, reproducible sequence. Uniforms on (0, 1) use 53 bits from two outputs.
 * Normals use the Marsaglia polar method; gamma variates Marsaglia & Tsang (2000), ACM TOMS 26(3).
 * Same seed and stream give the same numbers on every platform (only integer and IEEE operations).
 */

export interface RandomSource {
  /** Uniform on the open interval (0, 1). */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
  /** Gamma with the given shape and unit scale. */
  gamma(shape: number): number;
}

function mix32(x: number): number {
  let z = (x + 0x9e3779b9) | 0;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
  return (z ^ (z >>> 16)) >>> 0;
}

/**
 * A generator for `seed` (any integer up to 2^53) and `stream` (0, 1, 2, ... for independent uses).
 * @throws RangeError for a seed or stream that is not a non-negative safe integer (a programming
 *   error: 1.5 would otherwise be read silently as 1).
 */
export function createRandom(seed: number, stream = 0): RandomSource {
  if (!(Number.isSafeInteger(seed) && seed >= 0 && Number.isSafeInteger(stream) && stream >= 0)) {
    throw new RangeError(`createRandom: the seed and the stream must be whole numbers from 0 to 2^53 - 1, got ${seed} and ${stream}`);
  }
  const low = seed >>> 0;
  const high = Math.floor(seed / 2 ** 32) >>> 0;
  let s0 = mix32(low ^ mix32(stream));
  let s1 = mix32(high ^ mix32(s0 + stream + 1));
  let s2 = mix32(s1 ^ 0x6a09e667);
  let s3 = mix32(s2 ^ 0xbb67ae85);
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;

  const next = (): number => {
    const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return result;
  };
  const uniform = (): number => {
    // 53 random bits, shifted by half a unit so that 0 is never returned.
    const value = ((next() >>> 5) * 67108864 + (next() >>> 6) + 0.5) / 9007199254740992;
    return value;
  };
  let spare: number | null = null;
  const normal = (): number => {
    if (spare !== null) {
      const value = spare;
      spare = null;
      return value;
    }
    for (;;) {
      const u = 2 * uniform() - 1;
      const v = 2 * uniform() - 1;
      const s = u * u + v * v;
      if (s > 0 && s < 1) {
        const factor = Math.sqrt((-2 * Math.log(s)) / s);
        spare = v * factor;
        return u * factor;
      }
    }
  };
  const gamma = (shape: number): number => {
    if (shape < 1) return gamma(shape + 1) * uniform() ** (1 / shape);
    const d = shape - 1 / 3;
    const c = 1 / Math.sqrt(9 * d);
    for (;;) {
      let x: number;
      let v: number;
      do {
        x = normal();
        v = 1 + c * x;
      } while (v <= 0);
      v = v * v * v;
      const u = uniform();
      if (u < 1 - 0.0331 * x ** 4 || Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) return d * v;
    }
  };
  return { uniform, normal, gamma };
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
