/** Sampling frequency from the spacing of dates (the one table: src/core/calendar.ts), and a linear-time median. */
import { DAY_MS, type FrequencyName, frequencies, frequencyTable } from "../../core/calendar.js";
import { copyRows, AREA_ROWS, columnKernel } from "../../core/numerics/seriesKernel.js";

export type { FrequencyName };

/** The sampling frequency of a file and the periods per year used to annualise. */
export interface DetectedFrequency {
  readonly name: FrequencyName;
  readonly periodsPerYear: number;
  /** "detected" from the median gap between dates, or "option" when the caller set periodsPerYear. */
  readonly from: "detected" | "option";
}

/** Median gap (days) ranges per frequency, with its periods per year. */
const BANDS: readonly (readonly [FrequencyName, number, number, number])[] = frequencies.map((name) => {
  const { periodsPerYear, medianGapDays } = frequencyTable[name];
  return [name, medianGapDays[0], medianGapDays[1], periodsPerYear] as const;
});

/** Median of the values (NaN for none); the input is not modified. Quickselect, O(n) expected. */
export function median(values: ArrayLike<number>): number {
  const a = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) a[i] = values[i] as number;
  const n = a.length;
  if (n === 0) return Number.NaN;
  const upper = select(a, n >> 1);
  return n % 2 === 1 ? upper : (upper + maxBelow(a, n >> 1)) / 2;
}

function maxBelow(a: Float64Array, k: number): number {
  let best = -Infinity;
  for (let i = 0; i < k; i++) if ((a[i] as number) > best) best = a[i] as number;
  return best;
}

/** Rearranges `a` so that a[k] is the k-th smallest, everything before it is <= a[k]; returns a[k]. */
function select(a: Float64Array, k: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1] as number;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while ((a[i] as number) < pivot) i++;
      while ((a[j] as number) > pivot) j--;
      if (i <= j) {
        const t = a[i] as number;
        a[i] = a[j] as number;
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k] as number;
}

/** Frequency from date keys (ms, ascending): the band holding the median gap, or null when none does. */
export function detectFrequency(keys: ArrayLike<number>): DetectedFrequency | null {
  if (keys.length < 2) return null;
  let gap = medianWholeDayGap(keys) ?? majorityGap(keys);
  if (gap === null) {
    const gaps = new Float64Array(keys.length - 1);
    for (let i = 1; i < keys.length; i++) gaps[i - 1] = ((keys[i] as number) - (keys[i - 1] as number)) / DAY_MS;
    gap = median(gaps);
  }
  const band = BANDS.find(([, low, high]) => gap >= low && gap <= high);
  return band ? { name: band[0], periodsPerYear: band[3], from: "detected" } : null;
}

/** Gaps of whole days below this are counted in a histogram by `medianWholeDayGap`. */
const HISTOGRAM_DAYS = 1024;

/**
 * The median of the gaps (days) between consecutive keys, from a histogram, when every gap is a whole
 * number of days from 0 to HISTOGRAM_DAYS - 1 (then it is exactly what `median` gives); null otherwise.
 */
export function medianWholeDayGap(keys: ArrayLike<number>, useKernel = true): number | null {
  const counts = wholeDayGapCounts(keys, useKernel);
  if (counts === null) return null;
  const n = keys.length - 1;
  // The values at sorted positions k - 1 and k, k = floor(n / 2), as `median` takes them.
  const k = n >> 1;
  let below = -1;
  let seen = 0;
  for (let value = 0; value < HISTOGRAM_DAYS; value++) {
    seen += counts[value] as number;
    if (below < 0 && seen >= k) below = value;
    if (seen > k) return n % 2 === 1 ? value : (value + below) / 2;
  }
  return null;
}

/**
 * How many consecutive keys are 0, 1, ... HISTOGRAM_DAYS - 1 whole days apart, or null when a gap is not
 * a whole number of days in that range; in the column kernel (WebAssembly, core/numerics/seriesKernel.ts)
 * when it holds the keys, the same counts.
 */
function wholeDayGapCounts(keys: ArrayLike<number>, useKernel: boolean): Int32Array | null {
  // The area holds the keys and, after them, the counts (an Int32 is half a double).
  const kernel = useKernel && keys.length > 1 && keys.length + HISTOGRAM_DAYS / 2 <= AREA_ROWS ? columnKernel() : null;
  if (kernel !== null) {
    copyRows(kernel.area, keys, 0, keys.length);
    return kernel.dayGaps(keys.length, DAY_MS, HISTOGRAM_DAYS);
  }
  const counts = new Int32Array(HISTOGRAM_DAYS);
  let previous = keys[0] as number;
  for (let i = 1; i < keys.length; i++) {
    const key = keys[i] as number;
    const gap = (key - previous) / DAY_MS;
    if (!(gap >= 0 && gap < HISTOGRAM_DAYS && Math.floor(gap) === gap)) return null;
    counts[gap] = (counts[gap] as number) + 1;
    previous = key;
  }
  return counts;
}

/**
 * The gap (days) between consecutive keys that more than half of the gaps have, or null when no gap
 * does. Such a gap fills both middle places of the sorted gaps, so it is exactly what `median`
 * gives ((x + x) / 2 is x); intraday stamps mostly have one (a minute, a second). Found by a
 * majority vote (Boyer and Moore), then counted.
 */
function majorityGap(keys: ArrayLike<number>): number | null {
  let candidate = 0;
  let votes = 0;
  for (let i = 1; i < keys.length; i++) {
    const gap = (keys[i] as number) - (keys[i - 1] as number);
    if (votes === 0) {
      candidate = gap;
      votes = 1;
    } else votes += gap === candidate ? 1 : -1;
  }
  let count = 0;
  for (let i = 1; i < keys.length; i++) if ((keys[i] as number) - (keys[i - 1] as number) === candidate) count++;
  return 2 * count > keys.length - 1 ? candidate / DAY_MS : null;
}

/** The frequency for an explicit periods-per-year: named after the nearest standard frequency. */
export function frequencyFromPeriods(periodsPerYear: number): DetectedFrequency {
  let nearest = BANDS[0] as (typeof BANDS)[number];
  for (const band of BANDS) {
    if (Math.abs(Math.log(band[3] / periodsPerYear)) < Math.abs(Math.log(nearest[3] / periodsPerYear))) nearest = band;
  }
  return { name: nearest[0], periodsPerYear, from: "option" };
}
