import { describe, expect, it } from "vitest";
import { readReturns } from "../../src/input/readReturns.js";

const ROWS = 1_000_000;
const DAY_MS = 86_400_000;

function bigFile(): string {
  const parts = ["Date,A,B,C,D\n"];
  let seed = 12345;
  const next = (): string => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return ((seed / 2147483648) * 0.04 - 0.02).toFixed(6);
  };
  for (let i = 0; i < ROWS; i++) {
    parts.push(`${new Date(Date.UTC(1800, 0, 1) + i * DAY_MS).toISOString().slice(0, 10)},${next()},${next()},${next()},${next()}\n`);
  }
  return parts.join("");
}

describe("speed", () => {
  it("reads a 1,000,000-row file with a date and four numeric columns in well under a second", () => {
    const text = bigFile();
    const options = { source: "big.csv", columns: ["A", "B", "C", "D"] };
    readReturns(text, options);
    const started = performance.now();
    const result = readReturns(text, options);
    const elapsed = performance.now() - started;
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.value.dates).toHaveLength(ROWS);
      expect(result.value.columns.get("D")?.length).toBe(ROWS);
      expect(result.value.frequency?.name).toBe("daily");
    }
    // Measured about 0.5 s on a slow shared machine; the bound leaves room for loaded CI runners.
    expect(elapsed).toBeLessThan(1500);
  });
});
