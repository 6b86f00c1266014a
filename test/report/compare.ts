/** Exact structural comparison for the report tests: same keys, numbers equal to the last bit. */

import { expect } from "vitest";

/**
 * Asserts `actual` (e.g. parsed output) holds exactly the values of `expected` (the Solution):
 * same keys, same array lengths, numbers `===` (so +0 and -0 match, JSON has no -0), no NaN.
 */
export function expectSameValues(actual: unknown, expected: unknown, path = "$"): void {
  if (typeof expected === "number") {
    expect(typeof actual, `${path} type`).toBe("number");
    expect(actual === expected, `${path}: ${String(actual)} !== ${expected}`).toBe(true);
  } else if (Array.isArray(expected)) {
    expect(Array.isArray(actual), `${path} is an array`).toBe(true);
    const items = actual as unknown[];
    expect(items.length, `${path} length`).toBe(expected.length);
    expected.forEach((item, i) => expectSameValues(items[i], item, `${path}[${i}]`));
  } else if (expected !== null && typeof expected === "object") {
    expect(actual !== null && typeof actual === "object" && !Array.isArray(actual), `${path} is an object`).toBe(true);
    const object = actual as Record<string, unknown>;
    expect(Object.keys(object).sort(), `${path} keys`).toEqual(Object.keys(expected).sort());
    for (const [key, value] of Object.entries(expected)) expectSameValues(object[key], value, `${path}.${key}`);
  } else {
    expect(actual, path).toBe(expected);
  }
}

/** The value at a dotted path such as "moments.low.mean" or "grid.0.lowBeta"; undefined when absent. */
export function at(value: unknown, path: string): unknown {
  let current: unknown = value;
  for (const key of path.split(".")) {
    if (current === null || typeof current !== "object") return undefined;
    if (!Object.hasOwn(current, key)) return undefined;
    current = (current as Record<string, unknown>)[key];
  }
  return current;
}
