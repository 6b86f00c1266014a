import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const rows = monthly
  .trim()
  .split("\n")
  .slice(1)
  .map((line) => line.split(","));
const books = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

async function solveJson(files: Record<string, string>, args: string[]) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["solve", ...args, "--format", "json"], io);
  return { code, json: code <= exitCodes.rejected && stdout() !== "" ? JSON.parse(stdout()) : null, stderr: stderr() };
}

/** The parts of solve's JSON that must not depend on how the same data were written. */
const numbers = (json: Record<string, unknown>) => ({
  moments: json.moments,
  capm: json.capm,
  bounds: json.bounds,
  grid: json.grid,
  landmarks: json.landmarks,
});

describe("solve reads the same data in other layouts identically", () => {
  const reference = solveJson({ "m.csv": monthly }, ["m.csv", ...books]);

  it("from two files joined on date (--low PATH:COLUMN --high PATH:COLUMN), saying how many dates matched", async () => {
    // The high file lacks the first two months and has an extra month: 178 dates match.
    const low = ["Month End,Return", ...rows.map((r) => `${r[0]},${r[1]}`)].join("\n");
    const high = ["Month End,Return", ...rows.slice(2).map((r) => `${r[0]},${r[2]}`), "2026-01-31,0.01"].join("\n");
    const { code, json } = await solveJson({ "calm.csv": low, "bold.csv": high }, [
      "--low",
      "calm.csv:Return",
      "--high",
      "bold.csv:Return",
    ]);
    expect(code).toBe(exitCodes.ok);
    expect(json.observations).toBe(178);
    expect(json.input.source).toBe("calm.csv + bold.csv");
    expect(json.input.join).toEqual({
      sides: [
        { source: "calm.csv", column: "Return", dates: 180, unmatched: 2 },
        { source: "bold.csv", column: "Return", dates: 179, unmatched: 1 },
      ],
      matched: 178,
    });
    const trimmed = ["Month End,Stillwater Low Vol,Kestrel High Beta", ...rows.slice(2).map((r) => r.join(","))].join("\n");
    const direct = await solveJson({ "t.csv": trimmed }, ["t.csv", ...books]);
    expect(numbers(json)).toEqual(numbers(direct.json));
  });

  it("semicolons with a title line, and the long layout", async () => {
    const semicolons = [
      "Harbourline Capital monthly export",
      "",
      ["Month End", "Stillwater Low Vol", "Kestrel High Beta"].join(";"),
      ...rows.map((r) => r.join(";")),
    ].join("\n");
    const long = [
      "date,book,ret",
      ...rows.flatMap((r) => [`${r[0]},Stillwater Low Vol,${r[1]}`, `${r[0]},Kestrel High Beta,${r[2]}`]),
    ].join("\n");
    const ref = (await reference).json;
    const a = await solveJson({ "s.csv": semicolons }, ["s.csv", ...books]);
    expect(a.code).toBe(exitCodes.ok);
    expect(numbers(a.json)).toEqual(numbers(ref));
    const b = await solveJson({ "l.csv": long }, ["l.csv", ...books, "--id-column", "book", "--value-column", "ret"]);
    expect(b.code).toBe(exitCodes.ok);
    expect(numbers(b.json)).toEqual(numbers(ref));
  });

  it("prices give the returns they imply (--input prices)", async () => {
    let lowLevel = 100;
    let highLevel = 100;
    const levels = [`Month End,Stillwater Low Vol,Kestrel High Beta`, `2010-12-31,100,100`];
    for (const r of rows) {
      lowLevel *= 1 + Number(r[1]);
      highLevel *= 1 + Number(r[2]);
      levels.push(`${r[0]},${lowLevel},${highLevel}`);
    }
    const { code, json } = await solveJson({ "p.csv": levels.join("\n") }, ["p.csv", ...books, "--input", "prices"]);
    expect(code).toBe(exitCodes.ok);
    expect(json.observations).toBe(180);
    // Compounding then differencing is exact to about 1e-13 relative per return.
    expect(json.bounds.lowBeta.min).toBeCloseTo((await reference).json.bounds.lowBeta.min, 10);
  });

  it("drops sentinel rows given with --missing, or refuses them with --on-missing error", async () => {
    const withSentinel = monthly.replace(/^(2011-03-31),[^,]+,/m, "$1,-99.99,");
    const dropped = await solveJson({ "x.csv": withSentinel }, ["x.csv", ...books, "--missing", "-99.99"]);
    expect(dropped.code).toBe(exitCodes.ok);
    expect(dropped.json.input.rowsDropped).toBe(1);
    expect(dropped.json.input.droppedDates).toEqual(["2011-03-31"]);
    const refused = await solveJson({ "x.csv": withSentinel }, ["x.csv", ...books, "--missing", "-99.99", "--on-missing", "error"]);
    expect(refused.code).toBe(exitCodes.input);
    expect(refused.stderr).toContain("line 4");
  });

  it("reads day-first dates with --date-format and reports ambiguous ones without it", async () => {
    const dayFirst = monthly.replace(/^(\d{4})-(\d{2})-(\d{2})/gm, "$3/$2/$1");
    const read = await solveJson({ "d.csv": dayFirst }, ["d.csv", ...books, "--date-format", "DD/MM/YYYY"]);
    expect(read.code).toBe(exitCodes.ok);
    expect(read.json.input.firstDate).toBe("2011-01-31");
    const ambiguous = "date,a,b\n01/02/2024,0.01,0.02\n01/03/2024,-0.01,-0.015\n01/04/2024,0.02,0.03\n01/05/2024,0.0,0.004\n";
    const refused = await solveJson({ "a.csv": ambiguous }, ["a.csv", "--low", "a", "--high", "b"]);
    expect(refused.code).toBe(exitCodes.input);
    expect(refused.stderr).toContain("2024-02-01");
    expect(refused.stderr).toContain("2024-01-02");
  });
});
