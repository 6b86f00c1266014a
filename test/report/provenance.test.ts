/**
 * The input description says how the table was read: its layout, what the numbers were (--input),
 * which table of the file, and the rows read, used, dropped and consumed, which add up for a wide file.
 */
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { run } from "../../src/cli/program.js";
import { inputSchema } from "../../src/schema/solveOutput.js";
import { fakeIo } from "../cli/fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const [header = "", ...body] = monthly.trim().split("\n");
const pair = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

/** The example's returns compounded into prices from 100, with a row for the month before and two gaps. */
function pricesCsv(): string {
  let low = 100;
  let high = 100;
  const lines = [header, "2010-12-31,100,100"];
  for (const [i, line] of body.entries()) {
    const [date, a, b] = line.split(",");
    low *= 1 + Number(a);
    high *= 1 + Number(b);
    lines.push(i === 3 ? `${date},,${high}` : i === 50 ? `${date},${low},` : `${date},${low},${high}`);
  }
  return `${lines.join("\n")}\n`;
}

async function solve(csv: string, extra: string[]) {
  const text = fakeIo({ "f.csv": csv });
  expect(await run(["solve", "f.csv", ...extra], text.io)).toBe(0);
  const json = fakeIo({ "f.csv": csv });
  expect(await run(["solve", "f.csv", ...extra, "--format", "json"], json.io)).toBe(0);
  return { text: text.stdout(), input: JSON.parse(json.stdout()).input };
}

describe("the input's provenance", () => {
  test("prices: each missing price drops two returns, the first row is consumed, and the rows add up", async () => {
    const { text, input } = await solve(pricesCsv(), [...pair, "--input", "prices"]);
    expect(inputSchema.safeParse(input).success).toBe(true);
    // 181 rows: 180 months and the month before; a missing price leaves its own and the next return undefined.
    expect(input).toMatchObject({ layout: "wide", inputKind: "prices", block: 1, rowsRead: 181, rowsDropped: 4, rowsConsumed: 1 });
    expect(input.rowsUsed + input.rowsDropped + input.rowsConsumed).toBe(input.rowsRead);
    expect(text).toMatch(/\n {2}Numbers +prices: each return is a price over the one before less 1/);
    expect(text).toContain(`Observations   ${input.rowsUsed} used of 181 rows read: 4 dropped, 1 first price (no return)\n`);
    expect(text).toContain("\nSample moments (returns, per period)\n");
  });

  test("returns in the second table of a file: the block read is named, nothing is consumed", async () => {
    const csv = `Note,Value\nfund,Harbourline\n\n${monthly}`;
    const { text, input } = await solve(csv, [...pair, "--block", "2", "--rf", "0.002"]);
    expect(input).toMatchObject({
      layout: "wide",
      inputKind: "returns",
      block: 2,
      rowsRead: 180,
      rowsUsed: 180,
      rowsDropped: 0,
      rowsConsumed: 0,
    });
    expect(text).toContain("Table read     wide layout (a column per series), table 2 of the file\n");
    expect(text).toContain("Observations   180 used of 180 rows read\n");
  });

  test("a long file: a row per series and date", async () => {
    const rows = body.flatMap((line) => {
      const [date, a, b] = line.split(",");
      return [`${date},LOW,${a}`, `${date},HIGH,${b}`];
    });
    const csv = `Date,Fund,Return\n${rows.join("\n")}\n`;
    const { text, input } = await solve(csv, ["--low", "LOW", "--high", "HIGH", "--id-column", "Fund", "--value-column", "Return"]);
    expect(input).toMatchObject({ layout: "long", rowsRead: 360, rowsUsed: 180, rowsConsumed: 0 });
    expect(text).toContain("long layout (an id and a value column), table 1 of the file");
    expect(text).toContain("180 used of 360 rows read (a row per series and date)");
  });
});
