import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { solveRecordSchema } from "../../src/schema/solveOutput.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
/** The example with two more books: a copy of each with a small twist, and a constant column. */
const desk = monthly
  .trimEnd()
  .split("\n")
  .map((line, i) => {
    if (i === 0) return `${line},Calm Copy,Flat`;
    const low = Number(line.split(",")[1]);
    return `${line},${String(low * 0.9 + 0.0001)},0.001`;
  })
  .join("\n")
  .concat("\n");

async function runBatch(args: string[], files: Record<string, string> = { "desk.csv": desk, "m.csv": monthly }) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["solve", ...args], io);
  return { code, stdout: stdout(), stderr: stderr() };
}

const parseLines = (text: string) =>
  text
    .trim()
    .split("\n")
    .map((line) => JSON.parse(line));

describe("solve with several pairs and files", () => {
  it("writes one valid JSON Lines record per file and pair, each naming them", async () => {
    const { code, stdout } = await runBatch([
      "desk.csv",
      "m.csv",
      "--lows",
      "Stillwater Low Vol",
      "--highs",
      "Kestrel High Beta",
      "--format",
      "jsonl",
    ]);
    expect(code).toBe(exitCodes.ok);
    const records = parseLines(stdout);
    expect(records.map((r) => r.input.source)).toEqual(["desk.csv", "m.csv"]);
    for (const record of records) {
      expect(solveRecordSchema.safeParse(record).success).toBe(true);
      expect(record.input.lowColumn).toBe("Stillwater Low Vol");
      expect(record.status).toBe("ok");
    }
    // The same data in both files: the same numbers.
    expect(records[0].bounds).toEqual(records[1].bounds);
  });

  it("reports a failing pair in its record, carries on, and exits 5", async () => {
    const { code, stdout, stderr } = await runBatch([
      "desk.csv",
      "--pair",
      "Stillwater Low Vol:Kestrel High Beta",
      "--pair",
      "Flat:Kestrel High Beta",
      "--pair",
      "Stillwater Low Vol:No Such Column",
      "--format",
      "jsonl",
    ]);
    expect(code).toBe(exitCodes.partial);
    const records = parseLines(stdout);
    expect(records.map((r) => r.status)).toEqual(["ok", "failed", "failed"]);
    expect(records[1].errors.map((e: { code: string }) => e.code)).toEqual(["zero-variance"]);
    expect(records[2].errors[0].code).toBe("unknown-column");
    expect(records.every((r) => solveRecordSchema.safeParse(r).success)).toBe(true);
    expect(stderr).toContain("No Such Column");
  });

  it("gives every combination of --lows and --highs, in order", async () => {
    const { stdout } = await runBatch([
      "desk.csv",
      "--lows",
      "Stillwater Low Vol,Calm Copy",
      "--highs",
      "Kestrel High Beta",
      "--format",
      "jsonl",
    ]);
    expect(parseLines(stdout).map((r) => `${r.input.lowColumn}/${r.input.highColumn}`)).toEqual([
      "Stillwater Low Vol/Kestrel High Beta",
      "Calm Copy/Kestrel High Beta",
    ]);
  });

  it("produces shard outputs that concatenate into one valid stream", async () => {
    const first = await runBatch(["desk.csv", "--pair", "Stillwater Low Vol:Kestrel High Beta", "--format", "jsonl"]);
    const second = await runBatch(["desk.csv", "--pair", "Calm Copy:Kestrel High Beta", "--format", "jsonl"]);
    const records = parseLines(first.stdout + second.stdout);
    expect(records).toHaveLength(2);
    expect(records.every((r) => solveRecordSchema.safeParse(r).success)).toBe(true);
  });

  it("writes one CSV table with the file and pair in front of each row", async () => {
    const { code, stdout } = await runBatch([
      "desk.csv",
      "--lows",
      "Stillwater Low Vol,Calm Copy",
      "--highs",
      "Kestrel High Beta",
      "--format",
      "csv",
      "--steps",
      "3",
    ]);
    expect(code).toBe(exitCodes.ok);
    const lines = stdout.trim().split("\n");
    expect(lines[0]).toMatch(/^source,lowColumn,highColumn,point,lowBeta/);
    expect(lines.filter((l) => l.startsWith("desk.csv,Calm Copy,Kestrel High Beta,grid-"))).toHaveLength(3);
  });

  it("refuses --format json for several records and points to jsonl", async () => {
    const { code, stdout, stderr } = await runBatch([
      "desk.csv",
      "m.csv",
      "--low",
      "Stillwater Low Vol",
      "--high",
      "Kestrel High Beta",
      "--format",
      "json",
    ]);
    expect(code).toBe(exitCodes.usage);
    expect(stdout).toBe("");
    expect(stderr).toContain("--format jsonl");
  });

  it("asks for the books when no pair is named", async () => {
    const { code, stderr } = await runBatch(["desk.csv"]);
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("name the books");
  });
});
