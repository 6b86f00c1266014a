import { describe, expect, it } from "vitest";
import { readReturns, readReturnsFromBytes } from "../../src/input/readReturns.js";

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

  it("reads the same file from its bytes faster still, with the same numbers", () => {
    const text = bigFile();
    const bytes = new TextEncoder().encode(text);
    const options = { source: "big.csv", columns: ["A", "B", "C", "D"] };
    const fromText = readReturns(text, options);
    readReturnsFromBytes(bytes, options);
    const started = performance.now();
    const result = readReturnsFromBytes(bytes, options);
    const elapsed = performance.now() - started;
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
    // Measured about 0.2 s on a slow shared machine.
    expect(elapsed).toBeLessThan(1000);
  });
});
