/**
 * The "auto" block length of the bootstrap (docs/methods.md §7.2): 3 sqrt(n), at most n/3, at least 1,
 * whatever the data (closed forms).
 */

import { describe, expect, test } from "vitest";
import { autoBlockLength, resolveBlockLength } from "../../../../src/core/inference/bootstrap/replicates.js";
import { expectClose } from "../../../support/close.js";

describe('the "auto" block length', () => {
  test("3 sqrt(n) on 2,520 rows", () => {
    expectClose(autoBlockLength(2520), 3 * Math.sqrt(2520), { rel: 1e-15 });
  });
  test("below 81 rows n/3 is the smaller; never below 1", () => {
    expect(autoBlockLength(30)).toBe(10);
    expect(autoBlockLength(81)).toBe(27);
    expect(autoBlockLength(2)).toBe(1);
  });
  test("resolveBlockLength takes it for 'auto' and keeps a given length", () => {
    const data = {
      low: new Float64Array(400).map((_, t) => Math.sin(t)),
      high: new Float64Array(400).map((_, t) => Math.cos(t)),
      weight: 0.5,
    };
    expect(resolveBlockLength(data, "auto")).toBe(60);
    expect(resolveBlockLength(data, 7.5)).toBe(7.5);
  });
});
