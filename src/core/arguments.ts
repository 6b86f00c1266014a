/**
 * The library's checks of its arguments: the core's entry points (solve, implied, fitLine, the
 * moments functions, simulateSample) return these as diagnostics rather than computing with a NaN,
 * an infinity, a hole in an array or a parameter outside its rule (core/parameters.ts).
 */

import { largestValues, type LargestValues } from "./cancellation.js";
import { diagnose, type Diagnostic } from "./diagnostics.js";
import { type ParameterName, parameters } from "./parameters.js";
import { failure, type Result, success } from "./result.js";
import type { ReturnSample } from "./types.js";

/** How a value that is not a finite number is named in a message: NaN, Infinity, a hole, undefined, a string "x". */
export function describeValue(values: ArrayLike<unknown>, index: number): string {
  const value = values[index];
  if (typeof value === "number") return String(value);
  if (value === undefined) return Array.isArray(values) && !(index in values) ? "a hole (no value)" : "undefined";
  if (value === null) return "null";
  if (typeof value === "string") return `the string ${JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}...` : value)}`;
  return `a ${typeof value}`;
}

/** The first entry of `values` that is not a finite number, as an "invalid-number" diagnostic; null if all are. */
export function firstInvalidNumber(argument: string, values: ArrayLike<number>): Diagnostic | null {
  if (values === null || typeof values !== "object" || typeof values.length !== "number") {
    return diagnose({ code: "invalid-argument", argument, value: String(values), expected: "an array of numbers" });
  }
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (typeof v !== "number" || !Number.isFinite(v))
      return diagnose({ code: "invalid-number", argument, index: i, value: describeValue(values, i) });
  }
  return null;
}

/** A "length-mismatch" diagnostic when `values` does not have `expected` entries. */
export function lengthMismatch(argument: string, values: ArrayLike<number>, expected: number): Diagnostic | null {
  return values.length === expected ? null : diagnose({ code: "length-mismatch", argument, length: values.length, expected });
}

/** An "invalid-argument" diagnostic when `value` breaks the rule of parameter `name`; null when it follows it. */
export function parameterIssue(argument: string, name: ParameterName, value: unknown): Diagnostic | null {
  const rule = parameters[name];
  if (typeof value === "number" && rule.accept(value)) return null;
  return diagnose({ code: "invalid-argument", argument, value: describeScalar(value), expected: rule.expected });
}

/** A scalar as a message shows it. */
export function describeScalar(value: unknown): string {
  if (typeof value === "number") return String(value);
  if (typeof value === "string") return JSON.stringify(value);
  return value === null ? "null" : value === undefined ? "undefined" : `a ${typeof value}`;
}

/** Arguments that are not finite numbers, holes, or series of different lengths. */
export function sampleIssues(sample: ReturnSample): Diagnostic[] {
  if (sample === null || typeof sample !== "object") {
    return [
      diagnose({ code: "invalid-argument", argument: "sample", value: String(sample), expected: "an object { low, high, riskFree? }" }),
    ];
  }
  const found = issues(firstInvalidNumber("low", sample.low), firstInvalidNumber("high", sample.high));
  if (found.length > 0) return found;
  found.push(...issues(lengthMismatch("high", sample.high, sample.low.length)));
  const rf = sample.riskFree;
  if (typeof rf === "number") {
    if (!Number.isFinite(rf))
      found.push(diagnose({ code: "invalid-argument", argument: "riskFree", value: String(rf), expected: "a finite number" }));
  } else if (rf !== undefined) {
    found.push(...issues(firstInvalidNumber("riskFree", rf)));
    if (found.length === 0) found.push(...issues(lengthMismatch("riskFree", rf, sample.low.length)));
  }
  return found;
}

/**
 * `sampleIssues` as a Result: the sample's largest values (largestValues, which the steps after the
 * check need) when there is nothing to report. Rows held in Float64Arrays of one length (the risk-free
 * rate absent, a number or a Float64Array) take one pass: when their largest values are finite every
 * value is (a NaN or an infinity carries through |x - r| and max). Any other sample, or one with a
 * value that is not finite, is checked by sampleIssues first, as before.
 */
export function checkedSample(sample: ReturnSample): Result<LargestValues, Diagnostic[]> {
  if (sample !== null && typeof sample === "object") {
    const { low, high, riskFree } = sample;
    // Absent, a number or a Float64Array: anything else (null included) is sampleIssues' to judge.
    const plain =
      low instanceof Float64Array &&
      high instanceof Float64Array &&
      high.length === low.length &&
      (riskFree === undefined || typeof riskFree === "number" || (riskFree instanceof Float64Array && riskFree.length === low.length));
    if (plain) {
      const extent = largestValues(low, high, riskFree ?? 0);
      if (Number.isFinite(extent.low) && Number.isFinite(extent.high) && Number.isFinite(extent.riskFree)) return success(extent);
    }
  }
  const found = sampleIssues(sample);
  return found.length > 0 ? failure(found) : success(largestValues(sample.low, sample.high, sample.riskFree ?? 0));
}

/** The diagnostics that are not null, in order. */
export const issues = (...found: (Diagnostic | null)[]): Diagnostic[] => found.filter((d): d is Diagnostic => d !== null);
