import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { type SolveOutputJson, solveOutputSchema, solveRecordSchema } from "../../src/schema/solveOutput.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");

/** The bundled example with a third book: the high book's returns halved plus the low book's (a beta between the two). */
const three = `${monthly
  .trim()
  .split("\n")
  .map((line, i) => {
    const cells = line.split(",");
    return `${line},${i === 0 ? "Blend" : String(Number(cells[2]) / 2 + Number(cells[1]) / 2)}`;
  })
  .join("\n")}\n`;
const files = { "m.csv": three };
const low = "Stillwater Low Vol";
const high = "Kestrel High Beta";

async function solve(args: string[]) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["solve", "m.csv", ...args], io);
  return { code, stdout: stdout(), stderr: stderr() };
}

async function single(lowColumn: string, highColumn: string): Promise<SolveOutputJson> {
  const { stdout } = await solve(["--low", lowColumn, "--high", highColumn, "--format", "json"]);
  return solveOutputSchema.parse(JSON.parse(stdout));
}

describe("solve --all-pairs", () => {
  it("solves every unordered pair once, each with the lower CAPM beta as low, as solve gives that pair", async () => {
    const { code, stdout } = await solve(["--all-pairs", `${high},${low},Blend,${low}`, "--format", "jsonl"]);
    expect(code).toBe(exitCodes.ok);
    const records = stdout
      .trim()
      .split("\n")
      .map((line) => solveOutputSchema.parse(JSON.parse(line)));
    const pairs = records.map((r) => [r.input.lowColumn, r.input.highColumn]);
    // Three columns (one named twice): three pairs, no column with itself.
    expect(pairs).toHaveLength(3);
    expect(new Set(pairs.map((p) => [...p].sort().join("|"))).size).toBe(3);
    for (const [a, b] of pairs) expect(a).not.toBe(b);
    for (const record of records) {
      expect(record.capm.low.beta).toBeLessThan(record.capm.high.beta);
      expect(record.diagnostics.map((d) => d.code)).not.toContain("books-swapped");
      // The same document as solving the pair in that order by name.
      expect(record).toEqual(await single(record.input.lowColumn, record.input.highColumn));
    }
    // Named high first, the high-beta book is still the high book.
    expect(pairs).toContainEqual([low, high]);
  });

  it("refuses --all-pairs beside other ways of naming the books, and with fewer than two columns", async () => {
    for (const args of [
      ["--all-pairs", `${low},${high}`, "--low", low, "--high", high],
      ["--all-pairs", `${low},${high}`, "--pair", `${low}:${high}`],
      ["--all-pairs", `${low},${low}`],
    ]) {
      const { code, stdout, stderr } = await solve(args);
      expect(code).toBe(exitCodes.usage);
      expect(stdout).toBe("");
      expect(stderr).toMatch(/^error: .*--all-pairs/);
    }
  });
});

describe("books that look swapped", () => {
  it("says so plainly when the whole set of the low beta is above 1, instead of the partial warning", async () => {
    const swapped = await single(high, low);
    // The whole identified set of the low beta above 1 (the condition of the diagnostic).
    expect(swapped.bounds!.lowBeta.min).toBeGreaterThan(1);
    const codes = swapped.diagnostics.map((d) => d.code);
    expect(codes).toContain("books-swapped");
    expect(codes).not.toContain("low-beta-above-one");
    const diagnostic = swapped.diagnostics.find((d) => d.code === "books-swapped")!;
    expect(diagnostic.message).toContain("exchange --low and --high");
    expect(diagnostic.detail).toEqual({
      code: "books-swapped",
      lowerBound: swapped.bounds!.lowBeta.min,
      upperBound: swapped.bounds!.lowBeta.max,
    });
    // In the right order, neither.
    const right = await single(low, high);
    expect(right.diagnostics.map((d) => d.code)).not.toContain("books-swapped");
  });

  it("is a record-level diagnostic in JSON Lines too", async () => {
    const { stdout } = await solve(["--pair", `${high}:${low}`, "--pair", `${low}:${high}`, "--format", "jsonl"]);
    const records = stdout
      .trim()
      .split("\n")
      .map((line) => solveRecordSchema.parse(JSON.parse(line)));
    const codes = records.map((r) => ("diagnostics" in r ? r.diagnostics.map((d) => d.code) : []));
    expect(codes[0]).toContain("books-swapped");
    expect(codes[1]).not.toContain("books-swapped");
  });
});
