/** Warnings about a table that was read: units that look wrong, skipped titles, other tables. */
import { AREA_ROWS, columnKernel } from "../../core/numerics/seriesKernel.js";
import { float64Of } from "./arrays.js";
import type { Extracted } from "./extracted.js";
import { median } from "../values/frequency.js";
import type { InputWarning } from "../issues.js";
import type { ReadOptions } from "../options.js";

/** Decimal returns with a median |r| above this look like percent. */
export const PERCENT_LOOKING_MEDIAN = 0.5;
/** Percent-read returns with a median |r| (decimal) below this look like decimal data. */
export const DECIMAL_LOOKING_MEDIAN = 0.0005;

/** The unit check looks at about this many evenly spaced values of each column. */
const SAMPLE = 10_000;

/** "looks-like-percent" / "looks-like-decimal" of one column, from the median |return| of a sample (not for prices). */
export function columnUnitWarnings(column: string, values: Float64Array, options: ReadOptions): InputWarning[] {
  if (options.input === "prices") return [];
  const percent = options.units === "percent";
  const step = Math.max(1, Math.floor(values.length / SAMPLE));
  const size = Math.ceil(values.length / step);
  const threshold = percent ? DECIMAL_LOOKING_MEDIAN : PERCENT_LOOKING_MEDIAN;
  if (!medianMayPass(values, step, size, threshold, percent)) return [];
  const medianAbs = median(float64Of(size, (i) => Math.abs(values[i * step] as number)));
  const warnings: InputWarning[] = [];
  if (!percent && medianAbs > PERCENT_LOOKING_MEDIAN)
    warnings.push({ code: "looks-like-percent", source: options.source, column, medianAbs });
  if (percent && medianAbs > 0 && medianAbs < DECIMAL_LOOKING_MEDIAN)
    warnings.push({ code: "looks-like-decimal", source: options.source, column, medianAbs });
  return warnings;
}

/**
 * False when the sample's median |x| is surely not above `threshold` (`below` false) or not below it
 * (`below` true), from one count instead of a selection: with the sample sorted a[0..m), k = floor(m/2),
 * the median is a[k] or (a[k-1] + a[k]) / 2, so it is above t only if at least m - k values are, and
 * below t only if at least k are. A NaN in the sample leaves the answer to the median itself. The
 * counts come from the column kernel (WebAssembly, core/numerics/seriesKernel.ts) when it holds the column.
 */
export function medianMayPass(
  values: Float64Array,
  step: number,
  size: number,
  threshold: number,
  below: boolean,
  useKernel = true,
): boolean {
  const k = size >> 1;
  const kernel = useKernel && values.length <= AREA_ROWS ? columnKernel() : null;
  if (kernel !== null) {
    kernel.area.set(values);
    kernel.sampleCounts(size, step, threshold, below);
    return kernel.state[1]! > 0 || kernel.state[0]! >= (below ? k : size - k);
  }
  let count = 0;
  let nan = 0;
  for (let i = 0; i < size; i++) {
    const x = Math.abs(values[i * step] as number);
    if (below ? x < threshold : x > threshold) count++;
    else if (Number.isNaN(x)) nan++;
  }
  return nan > 0 || count >= (below ? k : size - k);
}

/** "skipped-lines" for title rows above the header and "other-blocks" when the file holds several tables. */
export function layoutWarnings(data: Extracted, source: string): InputWarning[] {
  const warnings: InputWarning[] = [];
  if (data.titleRows > 0) warnings.push({ code: "skipped-lines", source, line: data.headerLine, count: data.titleRows });
  if (data.blocks > 1) warnings.push({ code: "other-blocks", source, used: data.block, blocks: data.blocks });
  return warnings;
}
