/**
 * A simulated sample as a file: CSV that `solve` reads as it is (date, low, high), or JSON Lines (one
 * object a date). Numbers are written at full precision (the shortest text that reads back to the
 * same double) unless a number of decimals is asked for (a realistic export).
 */
import { csvText } from "./csv.js";

export interface SampleColumns {
  readonly dates: readonly string[];
  readonly low: Float64Array;
  readonly high: Float64Array;
  /** Names of the date, low and high columns. */
  readonly names: readonly [string, string, string];
}

/** Fixed decimals when asked (e.g. 6), else the shortest exact form; never "-0". */
function formatter(digits: number | undefined): (x: number) => string {
  if (digits === undefined) return (x) => String(x);
  return (x) => {
    const text = x.toFixed(digits);
    return /^-0\.?0*$/.test(text) ? text.slice(1) : text;
  };
}

export function sampleCsv(sample: SampleColumns, digits?: number): string {
  const format = formatter(digits);
  const lines = [sample.names.map(csvText).join(",")];
  for (let t = 0; t < sample.dates.length; t++) lines.push(`${sample.dates[t]},${format(sample.low[t]!)},${format(sample.high[t]!)}`);
  return `${lines.join("\n")}\n`;
}

export function sampleJsonLines(sample: SampleColumns, digits?: number): string {
  const format = formatter(digits);
  const [dateName, lowName, highName] = sample.names.map((name) => JSON.stringify(name));
  let text = "";
  for (let t = 0; t < sample.dates.length; t++) {
    text += `{${dateName}:${JSON.stringify(sample.dates[t])},${lowName}:${format(sample.low[t]!)},${highName}:${format(sample.high[t]!)}}\n`;
  }
  return text;
}
