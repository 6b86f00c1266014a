/**
 * A file of 250,000 rows (a date and four numeric columns; sixteen chunks of the row kernel's 16,384
 * rows) reads whole and the same from its text and its bytes. How fast is the benchmark's business (npm run bench), never a test's.
 */
import { describe, expect, it } from "vitest";
import { readReturns, readReturnsFromBytes } from "../../src/input/readReturns.js";

const ROWS = 250_000;
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

describe("a 250,000-row file", () => {
  it("reads whole, a date and four numeric columns, with its frequency", () => {
    const text = bigFile();
    const options = { source: "big.csv", columns: ["A", "B", "C", "D"] };
    const result = readReturns(text, options);
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.value.dates).toHaveLength(ROWS);
      expect(result.value.columns.get("D")?.length).toBe(ROWS);
      expect(result.value.frequency?.name).toBe("daily");
    }
  });

  it("reads the same from its bytes as from its text", () => {
    const text = bigFile();
    const bytes = new TextEncoder().encode(text);
    const options = { source: "big.csv", columns: ["A", "B", "C", "D"] };
    const fromText = readReturns(text, options);
    const result = readReturnsFromBytes(bytes, options);
    if (!result.ok || !fromText.ok) expect.fail("expected both reads to succeed");
    expect(result.value.firstDate).toBe("1800-01-01");
    expect(result.value.lastDate).toBe(fromText.value.lastDate);
    for (const name of options.columns) {
      const a = result.value.columns.get(name) as Float64Array;
      const b = fromText.value.columns.get(name) as Float64Array;
      let differing = a.length === b.length ? 0 : 1;
      for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) differing++;
      expect(differing).toBe(0);
    }
  });
});
