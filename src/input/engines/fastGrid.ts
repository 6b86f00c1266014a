/**
 * The fast engine: for text without quote characters and with LF or CRLF line ends, rows are
 * physical lines and fields are split at every delimiter; field counts are computed on demand.
 * Numbers are parsed while scanning, and give exactly what `parseDecimal` gives: with at most 15
 * significant digits and at most 22 fraction digits (Clinger's fast path) the mantissa and the power
 * of ten are exact doubles, so one correctly rounded division gives the correctly rounded value;
 * anything else is handed to `parseDecimal`.
 */
import { plainDateKey } from "../values/dates.js";
import type { Grid } from "./grid.js";
import { parseDecimal } from "../values/numbers.js";

const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => 10 ** k);

/** Build the fast grid, or null when the text needs the general engine (quotes or CR-only line ends). */
export function fastGrid(text: string, delimiter: string): Grid | null {
  if (text.includes('"')) return null;
  if (text.includes("\r") && /\r(?!\n)/.test(text)) return null;
  let lines = 0;
  for (let i = text.indexOf("\n"); i >= 0; i = text.indexOf("\n", i + 1)) lines++;
  if (text.length > 0 && !text.endsWith("\n")) lines++;
  const starts = new Int32Array(lines);
  const ends = new Int32Array(lines);
  let from = 0;
  for (let row = 0; row < lines; row++) {
    let end = text.indexOf("\n", from);
    if (end < 0) end = text.length;
    starts[row] = from;
    ends[row] = end > from && text.charCodeAt(end - 1) === 13 ? end - 1 : end;
    from = end + 1;
  }
  return new FastGrid(text, delimiter, starts, ends);
}

class FastGrid implements Grid {
  private readonly counts: Int32Array;
  private readonly d: number;

  constructor(
    private readonly text: string,
    readonly delimiter: string,
    private readonly starts: Int32Array,
    private readonly ends: Int32Array,
  ) {
    this.counts = new Int32Array(starts.length).fill(-1);
    this.d = delimiter.charCodeAt(0);
  }

  get rowCount(): number {
    return this.starts.length;
  }

  line(row: number): number {
    return row + 1;
  }

  isBlank(row: number): boolean {
    const { text, d } = this;
    const end = this.ends[row] as number;
    for (let i = this.starts[row] as number; i < end; i++) {
      const code = text.charCodeAt(i);
      if (code === d || code === 32 || code === 9) continue;
      if (code > 32 && code < 128) return false;
      return this.fields(row).every((field) => field.trim() === "");
    }
    return true;
  }

  fieldCount(row: number): number {
    const cached = this.counts[row] as number;
    if (cached >= 0) return cached;
    let count = 0;
    if (!this.isBlank(row)) {
      count = 1;
      const end = this.ends[row] as number;
      for (let i = this.starts[row] as number; i < end; i++) if (this.text.charCodeAt(i) === this.d) count++;
    }
    this.counts[row] = count;
    return count;
  }

  field(row: number, index: number): string {
    const end = this.ends[row] as number;
    let from = this.starts[row] as number;
    for (let f = 0; f < index; f++) {
      const next = this.text.indexOf(this.delimiter, from);
      if (next < 0 || next >= end) return "";
      from = next + 1;
    }
    const next = this.text.indexOf(this.delimiter, from);
    return this.text.slice(from, next < 0 || next > end ? end : next);
  }

  fields(row: number): string[] {
    return this.text.slice(this.starts[row], this.ends[row]).split(this.delimiter);
  }

  readNumbers(row: number, slots: Int32Array, out: readonly Float64Array[], at: number): number {
    const { text, delimiter } = this;
    const end = this.ends[row] as number;
    let i = this.starts[row] as number;
    let f = 0;
    for (;;) {
      const slot = f < slots.length ? (slots[f] as number) : -1;
      if (slot >= 0) {
        i = this.scanNumber(i, end, out[slot] as Float64Array, at);
      } else {
        const next = text.indexOf(delimiter, i);
        i = next < 0 || next > end ? end : next;
      }
      f++;
      if (i >= end) return f;
      i++;
    }
  }

  plainIsoDates(rows: Int32Array, index: number, keys: Float64Array): boolean {
    const { text, delimiter } = this;
    for (let k = 0; k < rows.length; k++) {
      const row = rows[k] as number;
      const end = this.ends[row] as number;
      let p = this.starts[row] as number;
      for (let f = 0; f < index && p >= 0; f++) {
        const next = text.indexOf(delimiter, p);
        p = next < 0 || next >= end ? -1 : next + 1;
      }
      if (p < 0 || p + 10 > end || (p + 10 < end && text.charCodeAt(p + 10) !== this.d)) return false;
      if (text.charCodeAt(p + 4) !== 45 || text.charCodeAt(p + 7) !== 45) return false;
      const key = plainDateKey(
        digit(text, p) * 1000 + digit(text, p + 1) * 100 + digit(text, p + 2) * 10 + digit(text, p + 3),
        digit(text, p + 5) * 10 + digit(text, p + 6),
        digit(text, p + 8) * 10 + digit(text, p + 9),
      );
      if (Number.isNaN(key)) return false;
      keys[k] = key;
    }
    return true;
  }

  /**
   * Parse the number starting at `from` into target[at] (written there, not returned, so that no
   * double is boxed); returns the position of the delimiter or line end after the field.
   */
  private scanNumber(from: number, end: number, target: Float64Array, at: number): number {
    // The character at `end` is a line break or past the text (NaN), so no loop below passes it.
    const { text, d } = this;
    let i = from;
    let code = text.charCodeAt(i);
    while ((code === 32 || code === 9) && code !== d) code = text.charCodeAt(++i);
    const negative = code === 45;
    if (code === 45 || code === 43) code = text.charCodeAt(++i);
    let mantissa = 0;
    let digits = 0;
    let significant = 0;
    let scale = 0;
    while (code >= 48 && code <= 57) {
      mantissa = mantissa * 10 + (code - 48);
      if (mantissa !== 0) significant++;
      digits++;
      code = text.charCodeAt(++i);
    }
    if (code === 46) {
      code = text.charCodeAt(++i);
      while (code >= 48 && code <= 57) {
        mantissa = mantissa * 10 + (code - 48);
        if (mantissa !== 0) significant++;
        digits++;
        scale--;
        code = text.charCodeAt(++i);
      }
    }
    while ((code === 32 || code === 9) && code !== d) code = text.charCodeAt(++i);
    if (i > end || (i < end && code !== d)) {
      const next = text.indexOf(this.delimiter, Math.min(i, end));
      i = next < 0 || next > end ? end : next;
    } else if (digits > 0 && significant <= 15 && scale >= -22) {
      const magnitude = scale === 0 ? mantissa : mantissa / (POWERS_OF_TEN[-scale] as number);
      target[at] = negative ? -magnitude : magnitude;
      return i;
    }
    target[at] = parseDecimal(text.slice(from, i)) ?? Number.NaN;
    return i;
  }
}

function digit(text: string, i: number): number {
  const v = text.charCodeAt(i) - 48;
  return v >= 0 && v <= 9 ? v : Number.NaN;
}
