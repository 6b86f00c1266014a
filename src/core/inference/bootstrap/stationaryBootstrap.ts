/**
 * Resampling plan of the stationary bootstrap.
 *
 * Politis, D. N. & Romano, J. P. (1994), "The stationary bootstrap", JASA 89(428), 1303-1313
 * (docs/methods.md §7.1): I_1 ~ U{1..n}; for t >= 2, with probability p = 1/b a fresh uniform
 * start, otherwise I_t = I_{t-1} + 1, wrapping from n to 1. Equivalently, and as done here, blocks
 * with uniform starts and Geometric(p) lengths, L = 1 + floor(ln U / ln(1 - p)), laid end to end and
 * the last one cut at n rows. One uniform u per block gives both: start = floor(u n) and
 * U = u n - start (for a continuous uniform these are independent, uniform on {0..n-1} and (0, 1)),
 * so a resample costs about n/b generator calls instead of n. Rows of several series
 * are resampled jointly (the same indices for all).
 *
 * Replicate r (0-based) draws from `createRandom(seed, r + 1)`, its own stream, so a replicate's
 * resample depends only on (seed, r, n, b): the same whatever the order or grouping in which
 * replicates are run (ranges on worker threads give identical results). Stream 0 is left unused.
 */

import { createRandom, type RandomSource } from "../../numerics/rng.js";

/** The generator of replicate r. */
export function replicateRandom(seed: number, replicate: number): RandomSource {
  return createRandom(seed, replicate + 1);
}

/**
 * Writes the blocks of one resample of n rows into `starts` and `lengths` (each at least n long,
 * reused between replicates) and returns how many there are. Block i covers rows
 * starts[i], starts[i] + 1, ... (mod n), lengths[i] of them.
 */
export function drawBlocks(n: number, blockLength: number, random: RandomSource, starts: Int32Array, lengths: Int32Array): number {
  const p = 1 / blockLength;
  const logStay = Math.log1p(-p);
  let filled = 0;
  let count = 0;
  while (filled < n) {
    const scaled = random.uniform() * n;
    const start = Math.floor(scaled);
    // The fractional part of a uniform times n is uniform on (0, 1) and independent of its integer
    // part (up to the 2^-53 grid of the generator): one draw gives both the start and the length.
    // A fraction that rounds to exactly 0 gives an infinite length, cut at n below.
    const drawn = p >= 1 ? 1 : 1 + Math.floor(Math.log(scaled - start) / logStay);
    const length = Math.min(drawn, n - filled);
    starts[count] = start;
    lengths[count] = length;
    count++;
    filled += length;
  }
  return count;
}

/** The resampled row indices of replicate r (for checks and generic statistics). */
export function resampleIndices(n: number, blockLength: number, seed: number, replicate: number): Int32Array {
  validateBlockLength(blockLength);
  const starts = new Int32Array(n);
  const lengths = new Int32Array(n);
  const count = drawBlocks(n, blockLength, replicateRandom(seed, replicate), starts, lengths);
  const indices = new Int32Array(n);
  let t = 0;
  for (let b = 0; b < count; b++) {
    for (let i = 0; i < lengths[b]!; i++) indices[t++] = (starts[b]! + i) % n;
  }
  return indices;
}

export function validateBlockLength(blockLength: number): void {
  if (!(blockLength >= 1 && Number.isFinite(blockLength))) {
    throw new RangeError(`stationary bootstrap: mean block length must be a finite number >= 1, got ${blockLength}`);
  }
}
