/**
 * The discrete Fourier transform of a complex sequence whose length is a power of two: iterative
 * radix-2 Cooley-Tukey (decimation in time, bit-reversed input order), in place on separate real and
 * imaginary arrays (docs/methods.md §8, "Kernel sums by fast convolution").
 *
 * Convention (numpy.fft's): forward X_k = sum_m x_m e^{-2 pi i k m / N}; the inverse is the same sum
 * with e^{+2 pi i k m / N} and NOT divided by N (the caller scales). The twiddle factors are each
 * computed from Math.cos and Math.sin of their own angle (not by a recurrence), so the rounding error of
 * a transform grows with log2 N only.
 */

/**
 * The twiddle factors of every stage of a transform of length N, stage by stage so each stage reads
 * them in order: for the stage that pairs entries `span` apart (span = 1, 2, 4, ..., N/2),
 * cos and sin of pi k / span at index span - 1 + k, k < span (N - 1 of each).
 */
export interface Twiddles {
  readonly size: number;
  readonly cos: Float64Array;
  readonly sin: Float64Array;
}

export function twiddles(size: number): Twiddles {
  if (!(Number.isInteger(size) && size >= 1 && (size & (size - 1)) === 0)) {
    throw new RangeError(`fft: the length must be a power of two, got ${size}`);
  }
  const cos = new Float64Array(Math.max(size - 1, 1));
  const sin = new Float64Array(Math.max(size - 1, 1));
  for (let span = 1; span < size; span <<= 1) {
    for (let k = 0; k < span; k++) {
      const angle = (Math.PI * k) / span;
      cos[span - 1 + k] = Math.cos(angle);
      sin[span - 1 + k] = Math.sin(angle);
    }
  }
  return { size, cos, sin };
}

/** Transforms (re, im) in place: forward (e^{-i...}) or inverse (e^{+i...}, unscaled). */
export function fft(re: Float64Array, im: Float64Array, table: Twiddles, inverse: boolean): void {
  const n = table.size;
  if (re.length < n || im.length < n) throw new RangeError(`fft: arrays shorter than the length ${n}`);
  bitReverse(re, im, n);
  if (n > 1) pairs(re, im, n);
  const sign = inverse ? 1 : -1;
  for (let span = 2; span < n; span <<= 1) butterflies(re, im, n, span, table.cos, table.sin, sign);
}

/** Swaps entries m and reverse(m) (log2 n bits). */
function bitReverse(re: Float64Array, im: Float64Array, n: number): void {
  for (let m = 1, r = 0; m < n; m++) {
    let bit = n >> 1;
    for (; r & bit; bit >>= 1) r ^= bit;
    r |= bit;
    if (m < r) {
      const tr = re[m]!;
      re[m] = re[r]!;
      re[r] = tr;
      const ti = im[m]!;
      im[m] = im[r]!;
      im[r] = ti;
    }
  }
}

/** The first stage (entries 1 apart, twiddle 1): sums and differences. */
function pairs(re: Float64Array, im: Float64Array, n: number): void {
  for (let p = 0; p < n; p += 2) {
    const ar = re[p]!;
    const ai = im[p]!;
    const br = re[p + 1]!;
    const bi = im[p + 1]!;
    re[p] = ar + br;
    im[p] = ai + bi;
    re[p + 1] = ar - br;
    im[p + 1] = ai - bi;
  }
}

/** One stage: pairs `span` apart in groups of 2 span, the stage's twiddles from index span - 1. */
function butterflies(
  re: Float64Array,
  im: Float64Array,
  n: number,
  span: number,
  cos: Float64Array,
  sin: Float64Array,
  sign: number,
): void {
  for (let group = 0; group < n; group += 2 * span) {
    for (let k = 0; k < span; k++) {
      const wr = cos[span - 1 + k]!;
      const wi = sign * sin[span - 1 + k]!;
      const p = group + k;
      const q = p + span;
      const xr = re[q]! * wr - im[q]! * wi;
      const xi = re[q]! * wi + im[q]! * wr;
      re[q] = re[p]! - xr;
      im[q] = im[p]! - xi;
      re[p] = re[p]! + xr;
      im[p] = im[p]! + xi;
    }
  }
}
