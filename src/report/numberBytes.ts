/**
 * Numbers written as bytes, the very text `String(x)` gives (ECMAScript's Number::toString: the
 * shortest decimal that reads back as x, the closest such if several), without making a string.
 *
 * The fast path covers 1e-6 <= |x| < 1e17 with exact arithmetic on doubles: X = x * 10^p, scaled into
 * [1e16, 1e17) with p in [0, 22] (10^p exact), is held exactly as a sum P + Q (Dekker's product);
 * the decimals that read back as x are the ones within half an ulp of x, which is H = ulp(x)/2 * 10^p
 * on that scale (exact: a power of two times 10^p). The shortest decimal is the multiple of the
 * largest power of ten with a multiple strictly inside (X - H, X + H), the closest to X of them;
 * every distance is an exact double-double (Knuth's two-sum), compared exactly. Whatever the fast
 * path cannot settle (a distance equal to H or a tie, where reading rounds half to even; a power of
 * two, whose interval is lopsided; ten significant digits or fewer; other magnitudes, infinities,
 * NaN) is written from `String(x)`.
 */

const powersOfTen = [
  1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

const scratch = new Float64Array(1);
const words = new Uint32Array(scratch.buffer);
/** The fast path reads a double's exponent through its words, as laid out on little-endian hosts. */
const littleEndian = (() => {
  scratch[0] = 1;
  return words[1] === 0x3ff00000 && words[0] === 0;
})();

/** Veltkamp's splitting constant for doubles (2^27 + 1), for Dekker's exact product. */
const split = 134217729;

/** -1, 0 or 1 as the exact difference a - b compares with the double h (Knuth's two-sum, exact). */
function compareDifference(a: number, b: number, h: number): number {
  const s = a - b;
  const bb = s - a;
  const low = a - (s - bb) - (b + bb);
  if (s !== h) return s < h ? -1 : 1;
  return low < 0 ? -1 : low > 0 ? 1 : 0;
}

/** Nearest doubles to 10^k for k from -7 to 18 (index k + 7): where a number's decade starts. */
const decades = [
  1e-7, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 1e-1, 1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17,
  1e18,
];

/** Writes positive x's text at `at` by the fast path: the end, or -1 when it cannot be sure. */
function writePositive(x: number, out: Uint8Array, at: number): number {
  if (!(x >= 1e-6 && x < 1e17) || !littleEndian) return -1;
  scratch[0] = x;
  const high = words[1]!;
  if ((high & 0xfffff) === 0 && words[0] === 0) return -1; // a power of two
  const biased = high >>> 20;
  // The decade: floor(log10 x) is floor(e2 log10 2) or one more, for 2^e2 <= x < 2^(e2+1).
  let e = Math.floor((biased - 1023) * 0.3010299956639812);
  if (x >= decades[e + 8]!) e += 1;
  // X = x * 10^p in [1e16, 1e17) exactly as P + Q (Dekker's product), checked, not assumed.
  const p = 16 - e;
  if (p < 0 || p > 22) return -1;
  const b = powersOfTen[p]!;
  const big = x * b;
  let t = split * x;
  const xh = t - (t - x);
  const xl = x - xh;
  t = split * b;
  const bh = t - (t - b);
  const bl = b - bh;
  const small = xh * bh - big + xh * bl + xl * bh + xl * bl;
  if (big < 1e16 || (big === 1e16 && small < 0) || big >= 1e17) return -1;
  // Half an ulp of x, 2^(E - 1076) for the biased exponent E, built from its bits, on X's scale.
  words[1] = (biased - 53) << 20;
  words[0] = 0;
  const h = scratch[0]! * b;
  // P = upper * 1e8 + lower, exactly (upper * 1e8 is exact: upper * 5^8 < 2^53).
  let upper = Math.floor(big / 1e8);
  let lower = big - upper * 1e8;
  if (lower < 0) {
    upper -= 1;
    lower += 1e8;
  } else if (lower >= 1e8) {
    upper += 1;
    lower -= 1e8;
  }
  // X = upper * 1e8 + lower + small. Below, "offset" k names the integer upper * 1e8 + lower + k; its
  // distance from X is small - k (exact by two-sum). The largest power of ten (up to 1e8) with a
  // multiple strictly within H of X; there is always an integer (H > 0.55 on this scale).
  let unit = 1;
  let below = Math.floor(small); // offset of the integer at or below X
  let quotient = lower | 0; // floor(lower / unit)
  let remainder = 0; // lower mod unit
  for (;;) {
    const next = unit * 10;
    if (next > 1e7) return -1; // ten significant digits or fewer: left to String
    const q = (quotient / 10) | 0;
    const r = remainder + (quotient - q * 10) * unit; // lower mod next
    // The multiple of `next` at or below X: from the one at or below P, one step at most either
    // way, as |Q| <= 8 < next.
    let k = 0 - r;
    if (small < k) k -= next;
    else if (small >= k + next) k += next;
    const down = compareDifference(small, k, h);
    const up = compareDifference(k + next, small, h);
    if (down === 0 || up === 0) return -1; // a decimal at the very edge: reading rounds half to even
    if (down > 0 && up > 0) break;
    unit = next;
    below = k;
    quotient = q;
    remainder = r;
  }
  // The closest multiple of it to X, below or above (a tie is left to String). It is no multiple of
  // ten units (those are all farther than H), so its digits are 17 less the zeros of the unit.
  const middle = below + unit / 2;
  if (small === middle) return -1;
  let low = lower + (small < middle ? below : below + unit);
  const carry = Math.floor(low / 1e8);
  low -= carry * 1e8;
  upper += carry;
  if (upper < 1e8 || upper >= 1e9) return -1;
  let count = 17;
  for (let u = unit; u > 1; u /= 10) count--;
  return layOut(upper, low / unit, count, e + 1, out, at);
}

/** "00" to "99" as bytes, two digits at a time. */
const digitPairs = (() => {
  const pairs = new Uint8Array(200);
  for (let v = 0; v < 100; v++) {
    pairs[2 * v] = 48 + Math.floor(v / 10);
    pairs[2 * v + 1] = 48 + (v % 10);
  }
  return pairs;
})();

/** Writes the `count` digits of v (zero-padded) ending just before `end`, two at a time. */
function writeDigits(v: number, count: number, out: Uint8Array, end: number): void {
  let rest = v | 0;
  let i = end;
  let left = count;
  while (left >= 2) {
    const q = (rest / 100) | 0;
    const pair = (rest - q * 100) << 1;
    out[--i] = digitPairs[pair + 1]!;
    out[--i] = digitPairs[pair]!;
    rest = q;
    left -= 2;
  }
  if (left === 1) out[--i] = 48 + rest;
}

/**
 * Number::toString's layout of the digits d1..dk (the 9 of `head`, then those of `tail`, zero-padded
 * to k - 9) times 10^(n-k), for -6 < n <= 21, written straight into `out`.
 */
function layOut(head: number, tail: number, count: number, n: number, out: Uint8Array, at: number): number {
  let start = at;
  if (n <= 0) {
    out[start++] = 48;
    out[start++] = 46;
    for (let z = n; z < 0; z++) out[start++] = 48;
  } else if (n < count) {
    // The digits one place right, then the first n back left with the point after them.
    writeDigits(tail, count - 9, out, start + 1 + count);
    writeDigits(head, 9, out, start + 10);
    for (let d = 0; d < n; d++) out[start + d] = out[start + d + 1]!;
    out[start + n] = 46;
    return start + count + 1;
  }
  writeDigits(tail, count - 9, out, start + count);
  writeDigits(head, 9, out, start + 9);
  for (let z = count; z < n; z++) out[start + z] = 48;
  return start + Math.max(n, count);
}

/** The most bytes `writeNumber` writes for one number ("-1.2345678901234567e-308" is 24). */
export const maxNumberBytes = 25;

/**
 * Writes String(x) as bytes at `at` (room for `maxNumberBytes` assumed) and returns the end.
 * Integers below 2^53 are written digit by digit; other numbers by the fast path, or from String(x).
 */
export function writeNumber(x: number, out: Uint8Array, at: number): number {
  let i = at;
  let magnitude = x;
  if (x < 0) {
    out[i++] = 45;
    magnitude = -x;
  }
  if (magnitude < 2147483648 && (magnitude | 0) === magnitude) {
    // Integers (and -0, whose text is "0") within 32 bits.
    let v = magnitude | 0;
    if (v === 0) return writeAscii("0", out, at);
    let end = i;
    for (let t = v; t > 0; t = (t / 10) | 0) end++;
    for (let k = end - 1; k >= i; k--) {
      const q = (v / 10) | 0;
      out[k] = 48 + v - q * 10;
      v = q;
    }
    return end;
  }
  const end = writePositive(magnitude, out, i);
  return end < 0 ? writeAscii(String(x), out, at) : end;
}

/** Writes an ASCII string's bytes at `at` and returns the end. */
function writeAscii(text: string, out: Uint8Array, at: number): number {
  for (let k = 0; k < text.length; k++) out[at + k] = text.charCodeAt(k);
  return at + text.length;
}
