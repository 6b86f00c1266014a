import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { summaryColumns } from "../../src/report/summaryCsv.js";
import { solveRecordSchema } from "../../src/schema/solveOutput.js";
import { fakeIo } from "../cli/fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const low = "Stillwater Low Vol";
const high = "Kestrel High Beta";

/** RFC 4180 fields of one line (quoted fields with doubled quotes). */
function fields(line: string): string[] {
  const out: string[] = [];
  const pattern = /("(?:[^"]|"")*"|[^,]*)(,|$)/g;
  for (const match of line.matchAll(pattern)) {
    const field = match[1] ?? "";
    out.push(field.startsWith('"') ? field.slice(1, -1).replaceAll('""', '"') : field);
    if (match[2] === "") break;
  }
  return out;
}

async function solve(files: Record<string, string>, args: string[]) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["solve", ...args], io);
  return { code, stdout: stdout(), stderr: stderr() };
}

/** The row of `csv` as a record keyed by column name. */
function rows(csv: string): Record<string, string>[] {
  const [header, ...lines] = csv.trim().split("\n");
  expect(fields(header!)).toEqual(summaryColumns);
  return lines.map((line) => Object.fromEntries(fields(line).map((v, i) => [summaryColumns[i], v])));
}

describe("solve --format summary-csv", () => {
  it("writes one row per pair with the same numbers as the JSON Lines records", async () => {
    const files = { "m.csv": monthly };
    const pairs = ["--pair", `${low}:${high}`, "--pair", `${high}:${low}`, "--pair", `${low}:Missing`, "--rf", "0.002"];
    const summary = await solve(files, ["m.csv", ...pairs, "--format", "summary-csv"]);
    const lines = await solve(files, ["m.csv", ...pairs, "--format", "jsonl"]);
    expect(summary.code).toBe(exitCodes.partial);
    const records = lines.stdout
      .trim()
      .split("\n")
      .map((line) => solveRecordSchema.parse(JSON.parse(line)));
    const table = rows(summary.stdout);
    expect(table).toHaveLength(3);
    for (const [i, row] of table.entries()) {
      const record = records[i]!;
      expect([row.source, row.low, row.high, row.status]).toEqual([
        record.input.source,
        record.input.lowColumn,
        record.input.highColumn,
        record.status,
      ]);
      if (record.status === "failed") {
        expect(row.diagnostics).toBe(record.errors.map((e) => e.code).join(";"));
        expect(row.n).toBe("");
        continue;
      }
      expect(Number(row.n)).toBe(record.observations);
      expect(row.firstDate).toBe(record.input.firstDate);
      expect(Number(row.lowBetaMin)).toBe(record.bounds!.lowBeta.min);
      expect(Number(row.lowBetaMax)).toBe(record.bounds!.lowBeta.max);
      expect(Number(row.lowBetaLower)).toBe(record.uncertainty!.lowBeta!.interval.lower);
      expect(Number(row.capmHighBeta)).toBe(record.capm.high.beta);
      expect(Number(row.lowAlpha)).toBe(record.capm.low.alpha);
      expect(Number(row.highAlphaUpper)).toBe(record.pricing!.alpha.high.observedUpper);
      expect(Number(row.lowAlphaAnnualised)).toBe(record.pricing!.alpha.low.annualised!.observed);
      expect(row.verdict).toBe(record.pricing!.test!.verdict);
      expect(Number(row.pValue)).toBe(record.pricing!.test!.pValue);
      expect(row.diagnostics).toBe(record.diagnostics.map((d) => d.code).join(";"));
    }
    // The interval holds the CAPM alpha; the swapped pair says so.
    expect(Number(table[0]!.lowAlphaLower)).toBeLessThan(Number(table[0]!.lowAlpha));
    expect(table[1]!.diagnostics?.split(";")).toContain("books-swapped");
  });

  it("writes names from the data as text a spreadsheet does not run", async () => {
    const file = monthly.replace(low, "=HYPERLINK(1)").replace(high, '"-Kestrel, High"');
    const { code, stdout } = await solve({ "m.csv": file }, [
      "m.csv",
      "--low",
      "=HYPERLINK(1)",
      "--high",
      "-Kestrel, High",
      "--format",
      "summary-csv",
    ]);
    expect(code).toBe(exitCodes.ok);
    const line = stdout.trim().split("\n")[1]!;
    expect(line.startsWith(`m.csv,"'=HYPERLINK(1)","'-Kestrel, High",ok,`)).toBe(true);
  });
});
