/**
 * Date stamps read straight from ASCII bytes by the byte engine: the common ISO 8601 forms
 * "YYYY-MM-DD", "YYYY-MM-DD HH:MM", "YYYY-MM-DDTHH:MM:SS", with one to three digits of a fraction of
 * a second and a final "Z". Each gives the key `readUnambiguousDate` gives for its text, and a form:
 * which of those parts it was written with. When every stamp of a column has the same form, the
 * texts as written and their ISO texts are recovered from the keys (`stampText`, `stampIso`), so no
 * string is made per row. Anything else (offsets such as "+01:00", more fraction digits, spaces, an
 * hour 24, mixed forms) is left to the text path, which stays the definition of every result.
 *
 * The row kernel (engines/rowKernel.wat) reads the same forms and codes them the same way.
 */
import { civilOfDay, DAY_MS, daysInMonth, plainDateKey, plainIsoDateOfKey } from "./dates.js";

/** The form of a column of plain "YYYY-MM-DD" dates. */
export const PLAIN_DATE_FORM = 0;
/** No stamp read yet: the first one sets the column's form. */
export const NO_FORM = -1;
/** Form bits: a time is written; its separator is "T" (else a space); seconds are written; "Z" ends it. */
export const STAMP_TIME = 1;
export const STAMP_T = 2;
export const STAMP_SECONDS = 4;
/** Bits 3 and 4: how many fraction digits of a second (0 to 3) are written. */
export const STAMP_FRACTION_SHIFT = 3;
export const STAMP_ZULU = 32;

/** What a scan of a column's stamps carries from row to row. */
export interface StampScan {
  /** The month of the previous date (y * 100 + m), its first day's key and its length. */
  month: number;
  monthKey: number;
  monthLength: number;
  /** The column's form so far (NO_FORM before the first stamp). */
  form: number;
}

/** A fresh StampScan. */
export const stampScan = (): StampScan => ({ month: -1, monthKey: 0, monthLength: 0, form: NO_FORM });

/** True when a stamp's time may be read where fields end at `d`: no byte of a time is the delimiter. */
export const timesReadable = (d: number): boolean => d !== 32 && d !== 84 && d !== 58 && d !== 90;

const digit = (bytes: Uint8Array, i: number): number => {
  const v = (bytes[i] as number) - 48;
  return v >= 0 && v <= 9 ? v : Number.NaN;
};

/**
 * Reads the stamp of the field at bytes [p, ...) of a row ending at `end` (fields end at byte `d`):
 * when it is one of the forms above, exactly up to the delimiter or the row's end, a real date and
 * time, and of the column's form (`scan.form`, which the first stamp sets), writes its key to
 * keys[k] and returns where it ends; returns -1 otherwise (keys[k] may be written).
 */
export function scanStamp(bytes: Uint8Array, p: number, end: number, d: number, keys: Float64Array, k: number, scan: StampScan): number {
  if (p + 10 > end || bytes[p + 4] !== 45 || bytes[p + 7] !== 45) return -1;
  const y = digit(bytes, p) * 1000 + digit(bytes, p + 1) * 100 + digit(bytes, p + 2) * 10 + digit(bytes, p + 3);
  const m = digit(bytes, p + 5) * 10 + digit(bytes, p + 6);
  const day = digit(bytes, p + 8) * 10 + digit(bytes, p + 9);
  if (y * 100 + m !== scan.month) {
    scan.monthKey = plainDateKey(y, m, 1);
    scan.month = y * 100 + m;
    scan.monthLength = daysInMonth(y, m);
  }
  if (!(day >= 1 && day <= scan.monthLength) || Number.isNaN(scan.monthKey)) return -1;
  // plainDateKey(y, m, day): the day count is linear in the day of the month.
  let key = scan.monthKey + (day - 1) * DAY_MS;
  let q = p + 10;
  let form = PLAIN_DATE_FORM;
  if (q < end && bytes[q] !== d) {
    const separator = bytes[q] as number;
    if ((separator !== 32 && separator !== 84) || !timesReadable(d) || q + 6 > end || bytes[q + 3] !== 58) return -1;
    const hour = digit(bytes, q + 1) * 10 + digit(bytes, q + 2);
    const minute = digit(bytes, q + 4) * 10 + digit(bytes, q + 5);
    form = STAMP_TIME | (separator === 84 ? STAMP_T : 0);
    q += 6;
    let second = 0;
    let ms = 0;
    if (q < end && bytes[q] === 58) {
      if (q + 3 > end) return -1;
      second = digit(bytes, q + 1) * 10 + digit(bytes, q + 2);
      form |= STAMP_SECONDS;
      q += 3;
      if (q < end && bytes[q] === 46) {
        const from = ++q;
        while (q < end && q - from < 4 && (bytes[q] as number) >= 48 && (bytes[q] as number) <= 57)
          ms = ms * 10 + (bytes[q++] as number) - 48;
        const n = q - from;
        if (n === 0 || n > 3) return -1;
        // Math.round(Number(`0.${digits}`) * 1000), as readUnambiguousDate computes it, is exact here.
        ms *= n === 1 ? 100 : n === 2 ? 10 : 1;
        form |= n << STAMP_FRACTION_SHIFT;
      }
    }
    if (q < end && bytes[q] === 90) {
      form |= STAMP_ZULU;
      q++;
    }
    if ((q < end && bytes[q] !== d) || !(hour <= 23 && minute <= 59 && second <= 59)) return -1;
    key += ((hour * 60 + minute) * 60 + second) * 1000 + ms;
  }
  if (form !== scan.form) {
    if (scan.form !== NO_FORM) return -1;
    scan.form = form;
  }
  keys[k] = key;
  return q;
}

const TWO_DIGITS = Array.from({ length: 100 }, (_, n) => String(n).padStart(2, "0"));

/** The time of day of a key, as "HH:MM", then ":SS" and the fraction when the form writes them. */
function timeOfDay(key: number, form: number): string {
  const ms = key - Math.floor(key / DAY_MS) * DAY_MS;
  const seconds = Math.floor(ms / 1000);
  const minutes = Math.floor(seconds / 60);
  let text = `${TWO_DIGITS[Math.floor(minutes / 60)] as string}:${TWO_DIGITS[minutes % 60] as string}`;
  if ((form & STAMP_SECONDS) === 0) return text;
  text += `:${TWO_DIGITS[seconds % 60] as string}`;
  const digits = (form >> STAMP_FRACTION_SHIFT) & 3;
  if (digits > 0)
    text += `.${String(ms % 1000)
      .padStart(3, "0")
      .slice(0, digits)}`;
  return text;
}

/** Most bytes `writeStampIso` writes: "YYYY-MM-DDTHH:MM:SS.fffZ". */
export const MAX_STAMP_ISO_BYTES = 24;

/**
 * Writes the bytes of `stampIso(key, form)` at `at` of `out` (ASCII, no string made); returns the end.
 * For a key of a year from 0 to 9999 (the stamps scanStamp reads).
 */
export function writeStampIso(key: number, form: number, out: Uint8Array, at: number): number {
  const day = Math.floor(key / DAY_MS);
  civilOfDay(day, civil);
  const year = civil[0] as number;
  const month = civil[1] as number;
  const dayOfMonth = civil[2] as number;
  let i = twoDigits(Math.floor(year / 100), out, at);
  i = twoDigits(year % 100, out, i);
  out[i++] = 45;
  i = twoDigits(month, out, i);
  out[i++] = 45;
  i = twoDigits(dayOfMonth, out, i);
  if (form === PLAIN_DATE_FORM) return i;
  const ms = key - day * DAY_MS;
  const seconds = Math.floor(ms / 1000);
  const minutes = Math.floor(seconds / 60);
  out[i++] = 84; // "T"
  i = twoDigits(Math.floor(minutes / 60), out, i);
  out[i++] = 58;
  i = twoDigits(minutes % 60, out, i);
  out[i++] = 58;
  i = twoDigits(seconds % 60, out, i);
  const digits = (form >> STAMP_FRACTION_SHIFT) & 3;
  if (digits > 0) {
    out[i++] = 46;
    const fraction = ms % 1000;
    const all = [Math.floor(fraction / 100), Math.floor(fraction / 10) % 10, fraction % 10];
    for (let d = 0; d < digits; d++) out[i++] = 48 + (all[d] as number);
  }
  if ((form & STAMP_ZULU) !== 0) out[i++] = 90;
  return i;
}

/** civilOfDay's output, reused. */
const civil = new Int32Array(3);

/** Writes n (0 to 99) as two digits. */
function twoDigits(n: number, out: Uint8Array, at: number): number {
  out[at] = 48 + Math.floor(n / 10);
  out[at + 1] = 48 + (n % 10);
  return at + 2;
}

/** The text of a stamp of key `key` written in form `form` (see scanStamp), exactly as written. */
export function stampText(key: number, form: number): string {
  const date = plainIsoDateOfKey(key);
  if (form === PLAIN_DATE_FORM) return date;
  const zone = (form & STAMP_ZULU) === 0 ? "" : "Z";
  return `${date}${(form & STAMP_T) === 0 ? " " : "T"}${timeOfDay(key, form)}${zone}`;
}

/** The ISO text `readUnambiguousDate` gives for the stamp of key `key` written in form `form`. */
export function stampIso(key: number, form: number): string {
  const date = plainIsoDateOfKey(key);
  if (form === PLAIN_DATE_FORM) return date;
  const zone = (form & STAMP_ZULU) === 0 ? "" : "Z";
  return `${date}T${timeOfDay(key, form | STAMP_SECONDS)}${zone}`;
}
