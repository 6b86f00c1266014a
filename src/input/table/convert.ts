/**
 * Conversion of file values to decimal simple returns, with the extreme-value check.
 * returns: x (or x / 100 in percent); log-returns: expm1(x) (after / 100 in percent);
 * prices: P_t / P_{t-1} - 1, so the first row has no return and is consumed, and a missing
 * price makes both returns that use it missing.
 */
import { AREA_ROWS, columnKernel } from "../../core/numerics/seriesKernel.js";
import { cellPlace, type Extracted } from "./extracted.js";
import { isIdentity } from "./arrays.js";
import type { IssueList } from "../issueList.js";
import type { ReadOptions } from "../options.js";

/** |return| above this (decimal) is an error unless allowExtreme. */
export const EXTREME_LIMIT = 10;

/**
 * The first k >= from with |values[k]| > EXTREME_LIMIT, or -1 (one tight loop: most columns have none);
 * the first search of a column in the column kernel (WebAssembly, core/numerics/seriesKernel.ts) when it
 * holds the column (the later ones, after an extreme value, search on from it here: no copy each time).
 */
export function nextExtreme(values: Float64Array, from: number, useKernel = true): number {
  const kernel = useKernel && from === 0 && values.length <= AREA_ROWS ? columnKernel() : null;
  if (kernel !== null) {
    kernel.area.set(values);
    return kernel.firstBeyond(values.length, EXTREME_LIMIT);
  }
  for (let k = from; k < values.length; k++) if (Math.abs(values[k] as number) > EXTREME_LIMIT) return k;
  return -1;
}

/** Returns in date order. */
export interface Converted {
  /** Extracted row index of each return, in date order. */
  readonly rows: Int32Array;
  readonly values: readonly Float64Array[];
}

/**
 * Convert `data` (rows taken in `order`) to decimal simple returns per options.input and units;
 * NaN stays NaN (missing). Adds "non-positive-price" and "extreme-value" issues.
 */
export function toReturns(data: Extracted, order: Int32Array, options: ReadOptions, issues: IssueList): Converted {
  const input = options.input ?? "returns";
  const scale = options.units === "percent" ? 100 : 1;
  const { source } = options;
  const rows = input === "prices" ? order.subarray(Math.min(1, order.length)) : order;
  const inOrder = isIdentity(order);
  const checkExtremes = (out: Float64Array, c: number): Float64Array => {
    if (options.allowExtreme === true) return out;
    for (let k = nextExtreme(out, 0); k >= 0; k = nextExtreme(out, k + 1)) {
      const value = out[k] as number;
      const row = rows[k] as number;
      issues.add({
        code: "extreme-value",
        source,
        ...cellPlace(data, c, row),
        value: data.rawText(c, row),
        decimalValue: value,
        limit: EXTREME_LIMIT,
      });
    }
    return out;
  };
  const values = data.values.map((column, c) => {
    if (input === "returns" && scale === 1 && inOrder) return checkExtremes(column, c);
    const out = new Float64Array(rows.length);
    let checked = true;
    if (input === "prices") {
      for (const row of order) {
        const price = column[row] as number;
        if (price <= 0) checked = false;
        if (price <= 0) issues.add({ code: "non-positive-price", source, ...cellPlace(data, c, row), value: data.rawText(c, row) });
      }
      for (let k = 0; k < rows.length; k++)
        out[k] = (column[order[k + 1] as number] as number) / (column[order[k] as number] as number) - 1;
    } else if (input === "log-returns") {
      for (let k = 0; k < rows.length; k++) out[k] = Math.expm1((column[rows[k] as number] as number) / scale);
    } else if (scale === 1) {
      for (let k = 0; k < rows.length; k++) out[k] = column[rows[k] as number] as number;
    } else {
      for (let k = 0; k < rows.length; k++) out[k] = (column[rows[k] as number] as number) / scale;
    }
    return checked ? checkExtremes(out, c) : out;
  });
  return { rows, values };
}
