import { expect } from "vitest";
import { stampIso } from "../../src/input/values/dateStamps.js";
import type { Result } from "../../src/core/result.js";
import { decodeText } from "../../src/input/decodeText.js";
import type { InputIssue } from "../../src/input/issues.js";
import { readReturns, readReturnsWith, type ReadOptions, type ReturnTable } from "../../src/input/readReturns.js";

export const LOW = "Low Fund";
export const HIGH = "High Fund";

/** Options for the usual two-column read, with overrides. */
export function optionsFor(overrides: Partial<ReadOptions> = {}): ReadOptions {
  return { source: "returns.csv", columns: [LOW, HIGH], ...overrides };
}

/** Read and expect success. */
export function readOk(text: string, overrides: Partial<ReadOptions> = {}): ReturnTable {
  const result = readReturns(text, optionsFor(overrides));
  if (!result.ok) expect.fail(`expected success, got ${JSON.stringify(result.issues)}`);
  return result.value;
}

/** Read and expect failure. */
export function readIssues(text: string, overrides: Partial<ReadOptions> = {}): InputIssue[] {
  const result = readReturns(text, optionsFor(overrides));
  if (result.ok) expect.fail("expected issues, the file was read");
  return result.issues;
}

export const column = (table: ReturnTable, name: string): number[] => [...(table.columns.get(name) ?? expect.fail(`no column ${name}`))];

/** A small monthly file in the default layout. */
export const MONTHLY = [
  "Date,Low Fund,High Fund,Comment",
  "2020-01-31,0.01,0.02,first",
  "2020-02-29,-0.005,0.031,",
  '2020-03-31,0.002,-0.04,"quoted, text"',
  "2020-04-30,0.012,0.05,x",
  "",
].join("\n");

/** decodeText, then readReturns on the text: what reading the bytes must give. */
export function throughText(
  bytes: Uint8Array,
  options: ReadOptions,
  engine: "auto" | "general" = "auto",
): Result<ReturnTable, InputIssue[]> {
  const text = decodeText(bytes, options.source);
  return text.ok ? readReturnsWith(text.value, options, engine) : text;
}

/** The same outcome of two reads, with every value compared bit for bit (Object.is). */
export function expectSameRead(actual: Result<ReturnTable, InputIssue[]>, expected: Result<ReturnTable, InputIssue[]>): void {
  expect(actual.ok).toBe(expected.ok);
  if (actual.ok && expected.ok) {
    // Stamps (the dates' keys, a reader's shortcut) must give the dates; the rest must be equal.
    for (const table of [actual.value, expected.value]) if (table.stamps !== undefined) expectStampsGiveDates(table);
    const { columns: a, stamps: _a, ...restA } = actual.value;
    const { columns: b, stamps: _b, ...restB } = expected.value;
    expect(restA).toEqual(restB);
    expect([...a.keys()]).toEqual([...b.keys()]);
    for (const [name, values] of a) {
      const other = b.get(name) as Float64Array;
      expect(values.length).toBe(other.length);
      values.forEach((v, i) => expect(Object.is(v, other[i]), `${name}[${i}]`).toBe(true));
    }
  } else expect(actual).toEqual(expected);
}

/** A table's stamps, written as ISO text, are its dates. */
export function expectStampsGiveDates(table: ReturnTable): void {
  const { keys, form } = table.stamps as NonNullable<ReturnTable["stamps"]>;
  expect(keys.length).toBe(table.dates.length);
  keys.forEach((key, i) => expect(stampIso(key, form), `date ${i}`).toBe(table.dates[i]));
}
