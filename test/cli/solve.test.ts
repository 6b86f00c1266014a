import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import type { SolveOutputJson } from "../../src/schema/solveOutput.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const books = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

/** A small file in which low and high move in opposite directions: negative covariance. */
const opposite = "date,a,b\n2024-01-31,0.01,-0.02\n2024-02-29,-0.02,0.03\n2024-03-31,0.015,-0.01\n2024-04-30,-0.005,0.012\n";

async function solveJson(files: Record<string, string>, args: string[]) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["solve", ...args, "--format", "json"], io);
  return { code, json: JSON.parse(stdout()) as SolveOutputJson, stderr: stderr() };
}

describe("betabound solve (in process)", () => {
  it("prints the JSON report with exit code 0 for the bundled example", async () => {
    const { code, json } = await solveJson({ "m.csv": monthly }, ["m.csv", ...books, "--rf", "0.002"]);
    expect(code).toBe(exitCodes.ok);
    expect(json.status).toBe("ok");
    expect(json.observations).toBe(180);
    expect(json.bounds?.lowBeta.min).toBeLessThan(json.capm.low.beta);
    expect(json.bounds?.lowBeta.max).toBeGreaterThan(json.capm.low.beta);
    expect(json.grid).toHaveLength(11);
  });

  it("reads percent units as the same decimal returns", async () => {
    const percent = monthly
      .split("\n")
      .map((line, i) =>
        i === 0 || line === ""
          ? line
          : line
              .split(",")
              .map((f, j) => (j === 0 ? f : String(Number(f) * 100)))
              .join(","),
      )
      .join("\n");
    const decimal = await solveJson({ "m.csv": monthly }, ["m.csv", ...books, "--rf", "0.002"]);
    const fromPercent = await solveJson({ "p.csv": percent }, ["p.csv", ...books, "--rf", "0.2", "--units", "percent"]);
    // Multiplying by 100 and dividing back is not exact in binary floating point: 1e-12 relative.
    expect(fromPercent.json.bounds?.lowBeta.min).toBeCloseTo(decimal.json.bounds?.lowBeta.min ?? Number.NaN, 12);
    expect(fromPercent.json.capm.low.alpha).toBeCloseTo(decimal.json.capm.low.alpha, 14);
  });

  it("treats a risk-free column and the same constant alike", async () => {
    const withColumn = monthly
      .split("\n")
      .map((line, i) => (line === "" ? line : `${line},${i === 0 ? "Cash" : "0.002"}`))
      .join("\n");
    const constant = await solveJson({ "m.csv": monthly }, ["m.csv", ...books, "--rf", "0.002"]);
    const column = await solveJson({ "c.csv": withColumn }, ["c.csv", ...books, "--rf", "Cash"]);
    expect(column.json.input.riskFree).toEqual({ kind: "column", column: "Cash" });
    expect(column.json.moments).toEqual(constant.json.moments);
    expect(column.json.bounds).toEqual(constant.json.bounds);
  });

  it("exits 3 with the report and the reason when the covariance is not positive", async () => {
    const { code, json, stderr } = await solveJson({ "o.csv": opposite }, ["o.csv", "--low", "a", "--high", "b"]);
    expect(code).toBe(exitCodes.rejected);
    expect(json.bounds).toBeNull();
    expect(json.grid).toEqual([]);
    expect(json.diagnostics.map((d: { code: string }) => d.code)).toContain("nonpositive-covariance");
    expect(stderr).toMatch(/^error: o\.csv: the covariance of low and high is -/m);
    expect(json.status).toBe("rejected");
  });

  it("exits 2 and names the file when it cannot be read", async () => {
    const { io, stdout, stderr } = fakeIo();
    const code = await run(["solve", "missing.csv", ...books], io);
    expect(code).toBe(exitCodes.input);
    expect(stdout()).toBe("");
    expect(stderr()).toContain("cannot read 'missing.csv': no such file or directory");
  });

  it("exits 2 with the line, column and value of a non-numeric cell", async () => {
    const bad = monthly.replace("2011-03-31,", "2011-03-31,n/a#");
    const { io, stdout, stderr } = fakeIo({ "b.csv": bad });
    const code = await run(["solve", "b.csv", ...books], io);
    expect(code).toBe(exitCodes.input);
    expect(stdout()).toBe("");
    expect(stderr()).toMatch(/b\.csv.*line 4.*Stillwater Low Vol.*n\/a#/s);
  });

  it("exits 1 and suggests the near miss for an unknown option", async () => {
    const { io, stderr } = fakeIo({ "m.csv": monthly });
    const code = await run(["solve", "m.csv", ...books, "--wieght", "0.4"], io);
    expect(code).toBe(exitCodes.usage);
    expect(stderr()).toContain("unknown option '--wieght'");
    expect(stderr()).toContain("--weight");
  });

  it.each([
    [["--weight", "1.5"], "--weight", ">= 0.0001 and <= 0.9999"],
    [["--weight", "0.5x"], "--weight", ">= 0.0001 and <= 0.9999"],
    [["--steps", "1"], "--steps", "whole number from 2"],
    [["--steps", "2.5"], "--steps", "whole number from 2"],
    [["--format", "xml"], "--format", "must be one of text, json, csv"],
    [["--units", "basis-points"], "--units", "must be one of decimal, percent"],
  ])("exits 1 for the invalid option value %j", async (extra, option, expected) => {
    const { io, stdout, stderr } = fakeIo({ "m.csv": monthly });
    const code = await run(["solve", "m.csv", ...books, ...extra], io);
    expect(code).toBe(exitCodes.usage);
    expect(stdout()).toBe("");
    expect(stderr()).toContain(option);
    expect(stderr()).toContain(expected);
  });

  it("exits 1 for a fixed HAC lag truncation with a kernel other than Bartlett's (never 70)", async () => {
    const { io, stderr } = fakeIo({ "m.csv": monthly });
    const code = await run(["solve", "m.csv", ...books, "--hac-lags", "4", "--hac-kernel", "quadratic-spectral"], io);
    expect(code).toBe(exitCodes.usage);
    expect(stderr()).toMatch(/--hac-lags.*--hac-kernel bartlett/);
  });

  it("exits 1 for a risk-free number beyond a return's reach, as a column of it would be refused", async () => {
    for (const [rf, units, code] of [
      ["50", "decimal", exitCodes.usage],
      ["-10.5", "decimal", exitCodes.usage],
      ["50", "percent", exitCodes.ok],
      ["10", "decimal", exitCodes.ok],
    ] as const) {
      const { io, stderr } = fakeIo({ "m.csv": monthly });
      expect(await run(["solve", "m.csv", ...books, "--rf", rf, "--units", units, "--brief"], io), `${rf} ${units}`).toBe(code);
      if (code === exitCodes.usage) expect(stderr()).toMatch(/--rf.*1000%/);
    }
  });

  it("exits 2 when a fixed HAC lag truncation or bootstrap block is not below the sample's rows, naming the option and n", async () => {
    const twelve = monthly.split("\n").slice(0, 13).join("\n");
    for (const [flags, message] of [
      [["--hac-lags", "12"], /--hac-lags 12 is not below the sample's 12 rows: give at most 11/],
      [["--bootstrap", "50", "--block-length", "40"], /--block-length 40 is not below the sample's 12 rows/],
    ] as const) {
      const { io, stdout, stderr } = fakeIo({ "m.csv": twelve });
      expect(await run(["solve", "m.csv", ...books, ...flags], io)).toBe(exitCodes.input);
      expect(stderr()).toMatch(message);
      expect(stdout()).toBe("");
    }
    const { io } = fakeIo({ "m.csv": twelve });
    expect(await run(["solve", "m.csv", ...books, "--hac-lags", "11", "--brief"], io)).toBe(exitCodes.ok);
  });

  it("exits 1 when --low or --high is missing", async () => {
    const { io, stderr } = fakeIo({ "m.csv": monthly });
    expect(await run(["solve", "m.csv", "--low", "Stillwater Low Vol"], io)).toBe(exitCodes.usage);
    expect(stderr()).toContain("--high");
  });

  it("exits 1 without input when standard input is a terminal", async () => {
    const { io, stderr } = fakeIo({}, { stdinIsTerminal: true });
    expect(await run(["solve", ...books], io)).toBe(exitCodes.usage);
    expect(stderr()).toContain("no input");
  });

  it("writes to --output and nothing to stdout; exits 4 when the output cannot be written", async () => {
    const ok = fakeIo({ "m.csv": monthly });
    expect(await run(["solve", "m.csv", ...books, "--format", "csv", "--output", "grid.csv"], ok.io)).toBe(exitCodes.ok);
    expect(ok.stdout()).toBe("");
    expect(ok.written.get("grid.csv")?.split("\n")[0]).toMatch(/^point,lowBeta,highBeta/);
    const failing = fakeIo({ "m.csv": monthly });
    expect(await run(["solve", "m.csv", ...books, "--output", "/unwritable/r.txt"], failing.io)).toBe(exitCodes.output);
    expect(failing.stderr()).toContain("cannot write '/unwritable/r.txt': permission denied");
  });

  it("colours the text report only on a terminal without NO_COLOR", async () => {
    const ansiEscape = "\u001b[";
    const terminal = fakeIo({ "m.csv": monthly }, { stdoutIsTerminal: true });
    await run(["solve", "m.csv", ...books], terminal.io);
    expect(terminal.stdout()).toContain(ansiEscape);
    const noColour = fakeIo({ "m.csv": monthly }, { stdoutIsTerminal: true, env: { NO_COLOR: "1" } });
    await run(["solve", "m.csv", ...books], noColour.io);
    expect(noColour.stdout()).not.toContain(ansiEscape);
    const piped = fakeIo({ "m.csv": monthly });
    await run(["solve", "m.csv", ...books], piped.io);
    expect(piped.stdout()).not.toContain(ansiEscape);
  });
});
