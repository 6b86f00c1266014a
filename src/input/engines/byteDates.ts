/** Plain "YYYY-MM-DD" dates read from the bytes of a row, for the byte grid's plainIsoDates (byteGrid.ts). */
import { DAY_MS, daysInMonth, plainDateKey } from "../values/dates.js";

/** Reads dates one after another; consecutive dates mostly share their month: its first day's key and length are kept. */
export class IsoDates {
  private month = -1;
  private monthKey = 0;
  private monthLength = 0;

  /** `d`: the delimiter's byte. */
  constructor(private readonly d: number) {}

  /**
   * When bytes [p, end) start with exactly a real "YYYY-MM-DD" date (then the delimiter or the end),
   * sets keys[k] = plainIsoDateKey of it and returns true; false otherwise.
   */
  read(bytes: Uint8Array, p: number, end: number, keys: Float64Array, k: number): boolean {
    if (p + 10 > end || (p + 10 < end && bytes[p + 10] !== this.d) || bytes[p + 4] !== 45 || bytes[p + 7] !== 45) return false;
    const y = digit(bytes, p) * 1000 + digit(bytes, p + 1) * 100 + digit(bytes, p + 2) * 10 + digit(bytes, p + 3);
    const m = digit(bytes, p + 5) * 10 + digit(bytes, p + 6);
    const day = digit(bytes, p + 8) * 10 + digit(bytes, p + 9);
    if (y * 100 + m !== this.month) {
      this.monthKey = plainDateKey(y, m, 1);
      if (Number.isNaN(this.monthKey)) return false;
      this.month = y * 100 + m;
      this.monthLength = daysInMonth(y, m);
    }
    if (!(day >= 1 && day <= this.monthLength)) return false;
    // plainDateKey(y, m, day): the day count is linear in the day of the month.
    keys[k] = this.monthKey + (day - 1) * DAY_MS;
    return true;
  }
}

function digit(bytes: Uint8Array, i: number): number {
  const v = (bytes[i] as number) - 48;
  return v >= 0 && v <= 9 ? v : Number.NaN;
}
