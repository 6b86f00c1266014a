/**
 * Numbers read straight from plain ASCII bytes. When the digits, read as an integer, are below 2^53
 * and there are at most 22 fraction digits (Clinger's fast path) the mantissa and the power of ten
 * are exact doubles, so one correctly rounded division gives the correctly rounded value, which is
 * what `Number` (and so `parseDecimal`) gives; anything else is handed to `parseDecimal` on the
 * field's text.
 */
import { parseDecimal } from "../values/numbers.js";
import { asciiText } from "./plainLines.js";

const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => 10 ** k);
/** 2^53: digits accumulated in a double are exact when the result is below it (rounding is monotonic). */
const MAX_EXACT = 2 ** 53;

/**
 * Parse the number in bytes [from, ...) into target[at] (written there, not returned, so that no
 * double is boxed); returns the position p of the delimiter `d` or line end `end` after the field,
 * or ~p when the field was handed to `parseDecimal` (only then can it hold other bytes than digits,
 * signs, a point, spaces and tabs). The byte at `end` must not be a digit, point, sign, space, tab
 * or `d` (a line break does). target[at] is what `parseDecimal` gives for the field's text, NaN for null.
 */
export function scanDecimal(bytes: Uint8Array, from: number, end: number, d: number, target: Float64Array, at: number): number {
  let i = from;
  let code = bytes[i] as number;
  while ((code === 32 || code === 9) && code !== d) code = bytes[++i] as number;
  const negative = code === 45;
  if (code === 45 || code === 43) code = bytes[++i] as number;
  // Digits are accumulated in a double: exact while below 2^53, and the value only grows.
  let mantissa = 0;
  const integerStart = i;
  while (code >= 48 && code <= 57) {
    mantissa = mantissa * 10 + (code - 48);
    code = bytes[++i] as number;
  }
  let digits = i - integerStart;
  let fraction = 0;
  if (code === 46) {
    const fractionStart = ++i;
    code = bytes[i] as number;
    while (code >= 48 && code <= 57) {
      mantissa = mantissa * 10 + (code - 48);
      code = bytes[++i] as number;
    }
    fraction = i - fractionStart;
    digits += fraction;
  }
  while ((code === 32 || code === 9) && code !== d) code = bytes[++i] as number;
  if (i > end || (i < end && code !== d)) {
    i = Math.min(i, end);
    while (i < end && bytes[i] !== d) i++;
  } else if (digits > 0 && mantissa < MAX_EXACT && fraction <= 22) {
    const magnitude = fraction === 0 ? mantissa : mantissa / (POWERS_OF_TEN[fraction] as number);
    target[at] = negative ? -magnitude : magnitude;
    return i;
  }
  target[at] = parseDecimal(asciiText(bytes, from, i)) ?? Number.NaN;
  return ~i;
}

/**
 * What the byte engine reads for one field of ASCII bytes (no delimiter, no line break inside):
 * `scanDecimal` on it, so parseDecimal of its text or NaN for null.
 */
export function decimalOfBytes(field: Uint8Array, delimiter = ","): number {
  const padded = new Uint8Array(field.length + 1);
  padded.set(field);
  padded[field.length] = 10;
  const out = new Float64Array(1);
  scanDecimal(padded, 0, field.length, delimiter.charCodeAt(0), out, 0);
  return out[0] as number;
}
