/**
 * Price and log-return input against numpy (test/fixtures/prices/generate_prices.py writes the
 * files and the expected simple returns; numpy 2.4).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { readReturns } from "../../src/input/readReturns.js";

const fixture = (name: string) => readFileSync(new URL(`../fixtures/prices/${name}`, import.meta.url), "utf8");
const expected = JSON.parse(fixture("expected.json")) as {
  dates: string[];
  simpleFromPrices: Record<string, number[]>;
  simpleFromLogReturns: Record<string, number[]>;
};
const columns = ["Calm Index", "Bold Index"];

describe("returns from prices and log returns match numpy", () => {
  it("turns price levels into P_t / P_{t-1} - 1, bit for bit as numpy, the first date consumed", () => {
    const table = readReturns(fixture("prices.csv"), { source: "prices.csv", columns, input: "prices" });
    expect(table.ok).toBe(true);
    if (!table.ok) return;
    expect(table.value.dates).toEqual(expected.dates);
    for (const name of columns) expect(Array.from(table.value.columns.get(name)!)).toEqual(expected.simpleFromPrices[name]);
  });

  it("turns log returns into expm1(l), within 1 ulp of numpy's expm1", () => {
    const table = readReturns(fixture("log-returns.csv"), { source: "log-returns.csv", columns, input: "log-returns" });
    expect(table.ok).toBe(true);
    if (!table.ok) return;
    for (const name of columns) {
      const ours = table.value.columns.get(name)!;
      expected.simpleFromLogReturns[name]!.forEach((value, i) => {
        // JavaScript's Math.expm1 and numpy's (the C library's) may differ in the last bit.
        expect(Math.abs(ours[i]! - value)).toBeLessThanOrEqual(Math.abs(value) * 2.3e-16);
      });
    }
  });
});
