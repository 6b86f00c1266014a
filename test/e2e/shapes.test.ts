/**
 * Real exports' shapes end to end (committed fixtures in test/fixtures/shapes, invented numbers): a
 * file with title lines and several tables reads table 1 with its reading warnings in the report's
 * diagnostics and once on stderr, `--block` picks another table, and every pair of its five sorted
 * books compares in one run with the warnings printed once for the file.
 */
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { betabound, root } from "./support/run.js";

const titled = join(root, "test/fixtures/shapes/titled-tables.csv");
const books = ["--low", "Lo 20", "--high", "Hi 20", "--units", "percent"];

function occurrences(text: string, part: string): number {
  return text.split(part).length - 1;
}

describe("a file with title lines and several tables", () => {
  it("reads table 1 and reports the skipped title and the other tables as diagnostics, once on stderr", () => {
    const run = betabound(["solve", titled, ...books, "--format", "json"]);
    expect(run.code, run.stderr).toBe(0);
    const doc = JSON.parse(run.stdout);
    // Table 1: 120 months, 2010-01 to 2019-12 (generate_titled_tables.py).
    expect([doc.observations, doc.input.firstDate, doc.input.lastDate]).toEqual([120, "2010-01", "2019-12"]);
    const reading = doc.diagnostics.filter((d: { code: string }) => ["skipped-lines", "other-blocks"].includes(d.code));
    expect(reading.map((d: { code: string; severity: string }) => [d.code, d.severity])).toEqual([
      ["skipped-lines", "warning"],
      ["other-blocks", "warning"],
    ]);
    for (const d of reading) expect(occurrences(run.stderr, d.message)).toBe(1);
    // The header is line 5; line 4 ("  Monthly returns") is its title; lines 1-3 are text above the tables.
    expect(reading[0].message).toContain("the header is on line 5; line 4 above it, read as its title, was skipped");
    expect(reading[1].message).toContain("holds 3 tables; table 1 was read; pass --block N");
  });

  it("counts the reading warnings in the summary block, as the Diagnostics section lists them", () => {
    const run = betabound(["solve", titled, ...books, "--brief"]);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toMatch(/Diagnostics +2 warnings \(skipped-lines, other-blocks\)/);
  });

  it("reads the annual table with --block 2 and refuses a table the file does not hold", () => {
    const annual = betabound(["solve", titled, ...books, "--block", "2", "--format", "json"]);
    expect(annual.code, annual.stderr).toBe(0);
    const doc = JSON.parse(annual.stdout);
    expect([doc.observations, doc.input.firstDate, doc.input.lastDate, doc.input.frequency.name]).toEqual([30, "1990", "2019", "annual"]);
    const missing = betabound(["solve", titled, ...books, "--block", "4"]);
    expect(missing.code).toBe(2);
    expect(missing.stdout).toBe("");
    expect(missing.stderr).toContain("table 4 was asked for but the file has 3; use --block 1 to 3");
  });

  it("compares every pair of the five books in one run: ten pairs, warnings once for the file", () => {
    const run = betabound(["solve", titled, "--all-pairs", "Lo 20,Qnt 2,Qnt 3,Qnt 4,Hi 20", "--units", "percent"]);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout.startsWith("Comparison of 10 pairs\n")).toBe(true);
    expect(occurrences(run.stderr, "the file holds 3 tables")).toBe(1);
    expect(occurrences(run.stdout, "\nSummary\n")).toBe(10);
  });
});
