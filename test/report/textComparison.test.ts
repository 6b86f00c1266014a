/**
 * The comparison table that opens a text report of several pairs: one row a pair, in the order of the
 * detailed reports, whose figures are the JSON Lines documents' of the same run; failed pairs keep
 * their row with their error codes; a single pair has no table.
 */
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { run } from "../../src/cli/program.js";
import { formatNumber } from "../../src/report/format.js";
import { fakeIo } from "../cli/fakeIo.js";

const read = (name: string) => readFileSync(new URL(`../../examples/${name}`, import.meta.url), "utf8");
const monthly = read("harbourline-monthly.csv");
// The same data under short column names.
const short = monthly.replace("Month End,Stillwater Low Vol,Kestrel High Beta", "date,lo,hi");
const files = { "m.csv": monthly, "d.csv": read("harbourline-daily.csv"), "s.csv": short };
const pair = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

async function solve(args: string[]) {
  const { io, stdout } = fakeIo(files);
  const code = await run(["solve", ...args], io);
  return { code, stdout: stdout() };
}

/** The table's body rows: from the header's second line to the first paragraph line. */
function tableRows(text: string): string[][] {
  const lines = text.split("\n");
  const header = lines.findIndex((l) => /^\s+pair\s+n\s/.test(l) || /^\s+low \/ high\s+n\s/.test(l));
  const rows: string[][] = [];
  for (let i = header + 1; /^\s+\d/.test(lines[i] ?? "") || /^ {2}\S.*\s{2}/.test(lines[i] ?? ""); i++) {
    if (lines[i]!.startsWith("  One row")) break;
    rows.push(lines[i]!.trim().split(/\s{2,}/));
  }
  return rows;
}

describe("the comparison table of several pairs", () => {
  test("one row a file, with the figures of the JSON documents, before the detailed reports", async () => {
    const text = (await solve(["m.csv", "d.csv", ...pair])).stdout;
    const docs = (await solve(["m.csv", "d.csv", ...pair, "--format", "jsonl"])).stdout
      .trim()
      .split("\n")
      .map((l) => JSON.parse(l));
    expect(text.startsWith("Comparison of 2 pairs\n")).toBe(true);
    expect(text.indexOf("Comparison of")).toBeLessThan(text.indexOf("Summary"));
    // The long labels are numbered and listed above the table, in the order of the reports.
    expect(text).toContain("  - 1: m.csv: Stillwater Low Vol / Kestrel High Beta\n  - 2: d.csv: Stillwater Low Vol / Kestrel High Beta");
    const rows = tableRows(text);
    expect(rows).toHaveLength(2);
    rows.forEach((row, i) => {
      const doc = docs[i];
      const ppy = doc.input.frequency.periodsPerYear;
      const pct = (x: number) => `${formatNumber(100 * ppy * x, 3)}%`;
      const b = doc.bounds.lowBeta;
      const iv = doc.uncertainty.lowBeta.interval;
      const a = doc.pricing.alpha.low;
      expect(row).toEqual([
        String(i + 1),
        String(doc.observations),
        `${formatNumber(b.min, 4)} to ${formatNumber(b.max, 4)}`,
        `${formatNumber(iv.lower, 4)} to ${formatNumber(iv.upper, 4)}`,
        formatNumber(doc.capm.low.beta, 4),
        pct(doc.capm.low.alpha),
        `${pct(a.observedLower)} to ${pct(a.observedUpper)}`,
        { "not explained": "no", explained: "yes", undetermined: "undetermined" }[doc.pricing.test.verdict as string],
        doc.diagnostics.some((d: { severity: string }) => d.severity !== "info") ? expect.any(String) : "none",
      ]);
    });
  });

  test("a failed pair keeps its row and its error code; short labels stay in the table", async () => {
    const { stdout } = await solve(["s.csv", "--lows", "lo", "--highs", "hi,absent"]);
    expect(stdout).not.toContain("  - 1:");
    const rows = tableRows(stdout);
    expect(rows[0]![0]).toBe("lo / hi");
    expect(rows[1]).toEqual(["lo / absent", "not solved", "unknown-column"]);
    const long = (await solve(["m.csv", "--lows", "Stillwater Low Vol", "--highs", "Kestrel High Beta,Absent"])).stdout;
    expect(long).toContain("  - 2: Stillwater Low Vol / Absent\n");
    expect(tableRows(long)[1]).toEqual(["2", "not solved", "unknown-column"]);
  });

  test("a single pair and --format csv have no comparison table", async () => {
    expect((await solve(["m.csv", ...pair])).stdout).not.toContain("Comparison of");
    expect((await solve(["m.csv", "d.csv", ...pair, "--format", "csv"])).stdout).not.toContain("Comparison of");
  });
});
