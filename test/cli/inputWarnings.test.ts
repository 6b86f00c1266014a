import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { describeInputWarning } from "../../src/input/index.js";
import { rollRecordSchema } from "../../src/schema/rollOutput.js";
import { solveOutputSchema, solveRecordSchema } from "../../src/schema/solveOutput.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");

/**
 * The bundled example with a title line above the header and a third book (the high book's returns
 * halved): reading it with --units percent, every column's median |return| (about 2e-4 as decimal)
 * looks like decimal data.
 */
const titled = `Harbourline export\n${monthly
  .trim()
  .split("\n")
  .map((line, i) => {
    const cells = line.split(",");
    return `${line},${i === 0 ? "Half Beta" : String(Number(cells[2]) / 2)}`;
  })
  .join("\n")}\n`;
const files = { "t.csv": titled };
const percent = ["--units", "percent"];

const skipped = describeInputWarning({ code: "skipped-lines", source: "t.csv", line: 2, count: 1 });

function count(text: string, part: string): number {
  return text.split(part).length - 1;
}

describe("reading warnings as diagnostics", () => {
  it("lists each reading warning in the JSON diagnostics with its code, severity, message and detail", async () => {
    const { io, stdout, stderr } = fakeIo(files);
    const code = await run(
      ["solve", "t.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", ...percent, "--format", "json"],
      io,
    );
    expect(code).toBe(exitCodes.ok);
    const json = solveOutputSchema.parse(JSON.parse(stdout()));
    const codes = json.diagnostics.map((d) => d.code);
    // The title line, then one unit warning per book read (the two books of the pair).
    expect(codes.slice(0, 3)).toEqual(["skipped-lines", "looks-like-decimal", "looks-like-decimal"]);
    const first = json.diagnostics[0]!;
    expect(first.severity).toBe("warning");
    expect(first.detail).toEqual({ code: "skipped-lines", source: "t.csv", line: 2, count: 1 });
    expect(first.message).toBe(skipped);
    expect(first.message).toContain("remove the lines above the header");
    const units = json.diagnostics[1]!;
    expect(units.message).toContain("pass --units decimal");
    expect(units.detail.code === "looks-like-decimal" && units.detail.medianAbs).toBeLessThan(0.0005);
    // Piped output: each warning also once on stderr.
    expect(count(stderr(), skipped)).toBe(1);
  });

  it("writes a warning shared by several pairs of one file once on stderr, and in every pair's record", async () => {
    const { io, stdout, stderr } = fakeIo(files);
    const args = [
      "solve",
      "t.csv",
      "--lows",
      "Stillwater Low Vol",
      "--highs",
      "Kestrel High Beta,Half Beta",
      ...percent,
      "--format",
      "jsonl",
    ];
    expect(await run(args, io)).toBe(exitCodes.ok);
    const records = stdout()
      .trim()
      .split("\n")
      .map((line) => solveRecordSchema.parse(JSON.parse(line)));
    expect(records).toHaveLength(2);
    for (const record of records) {
      expect("diagnostics" in record && record.diagnostics.filter((d) => d.code === "skipped-lines")).toHaveLength(1);
    }
    expect(count(stderr(), skipped)).toBe(1);
    const lowUnits = describeInputWarning({
      code: "looks-like-decimal",
      source: "t.csv",
      column: "Stillwater Low Vol",
      medianAbs: 0,
    }).split(", the median")[0]!;
    expect(count(stderr(), lowUnits)).toBe(1);
    expect(count(stderr(), '"Half Beta"')).toBe(1);
  });

  it("writes an error shared by several pairs of one file once on stderr, and in every pair's record", async () => {
    // A risk-free column that is not there: every one of the 2 x 2 pairs fails alike (and "Nowhere" only).
    const { io, stdout, stderr } = fakeIo(files);
    const lows = ["--lows", "Stillwater Low Vol,Half Beta", "--highs", "Kestrel High Beta,Nowhere"];
    const args = ["solve", "t.csv", ...lows, "--rf", "T-Bill", ...percent, "--format", "jsonl"];
    expect(await run(args, io)).toBe(exitCodes.input);
    expect(stdout()).toBe("");
    const lines = stderr().trim().split("\n");
    expect(lines.filter((line) => line.includes('"T-Bill"'))).toHaveLength(1);
    expect(lines.filter((line) => line.includes('"Nowhere"'))).toHaveLength(1);
    expect(lines.every((line) => line.startsWith("error: "))).toBe(true);
    // With a file that reads, the failed pairs keep their errors in their records, once each.
    const partial = fakeIo(files);
    const some = [
      "solve",
      "t.csv",
      "--lows",
      "Stillwater Low Vol,Half Beta",
      "--highs",
      "Kestrel High Beta,Nowhere",
      ...percent,
      "--format",
      "jsonl",
    ];
    expect(await run(some, partial.io)).toBe(exitCodes.partial);
    const records = partial
      .stdout()
      .trim()
      .split("\n")
      .map((line) => solveRecordSchema.parse(JSON.parse(line)));
    const failed = records.filter((r) => r.status === "failed");
    expect(failed.map((r) => r.input.highColumn)).toEqual(["Nowhere", "Nowhere"]);
    for (const record of failed) expect("errors" in record && record.errors.filter((e) => e.message.includes('"Nowhere"'))).toHaveLength(1);
    expect(
      partial
        .stderr()
        .split("\n")
        .filter((line) => line.startsWith("error: ") && line.includes('"Nowhere"')),
    ).toHaveLength(1);
  });

  it("writes roll's error shared by several pairs of one file once on stderr", async () => {
    const { io, stderr } = fakeIo(files);
    const args = [
      "roll",
      "t.csv",
      "--lows",
      "Stillwater Low Vol,Half Beta",
      "--highs",
      "Kestrel High Beta",
      "--rf",
      "T-Bill",
      "--window",
      "24",
    ];
    expect(await run([...args, ...percent, "--format", "jsonl"], io)).toBe(exitCodes.input);
    expect(
      stderr()
        .split("\n")
        .filter((line) => line.startsWith("error: ") && line.includes('"T-Bill"')),
    ).toHaveLength(1);
  });

  it("shows reading warnings on stderr when the text report is on the terminal, and lists them under Diagnostics", async () => {
    const { io, stdout, stderr } = fakeIo(files, { stdoutIsTerminal: true, env: { NO_COLOR: "1" } });
    expect(await run(["solve", "t.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", ...percent], io)).toBe(exitCodes.ok);
    expect(count(stderr(), skipped)).toBe(1);
    const diagnostics = stdout().slice(stdout().lastIndexOf("Diagnostics"));
    expect(diagnostics.replace(/\s+/g, " ")).toContain("read as its title, was skipped");
    // The core's own diagnostics stay in the report only.
    expect(
      stderr()
        .split("\n")
        .filter((line) => line !== "" && !line.includes("t.csv:") && !line.includes("t.csv,")),
    ).toEqual([]);
  });

  it("lists reading warnings in the HTML report's Diagnostics", async () => {
    const { io, written } = fakeIo(files);
    const args = ["solve", "t.csv", "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", ...percent, "--report", "r.html"];
    expect(await run(args, io)).toBe(exitCodes.ok);
    const html = written.get("r.html") ?? "";
    const diagnostics = html.slice(html.indexOf('id="diagnostics"'));
    expect(diagnostics).toContain(skipped);
  });

  it("lists reading warnings first in every roll record, and once on stderr", async () => {
    const { io, stdout, stderr } = fakeIo(files);
    const args = [
      "roll",
      "t.csv",
      "--low",
      "Stillwater Low Vol",
      "--high",
      "Kestrel High Beta",
      ...percent,
      "--window",
      "60",
      "--step",
      "60",
    ];
    expect(await run([...args, "--format", "jsonl"], io)).toBe(exitCodes.ok);
    const records = stdout()
      .trim()
      .split("\n")
      .map((line) => rollRecordSchema.parse(JSON.parse(line)));
    expect(records.length).toBeGreaterThan(1);
    for (const record of records) {
      expect("diagnostics" in record && record.diagnostics.slice(0, 3).map((d) => d.code)).toEqual([
        "skipped-lines",
        "looks-like-decimal",
        "looks-like-decimal",
      ]);
    }
    expect(count(stderr(), skipped)).toBe(1);
  });
});
