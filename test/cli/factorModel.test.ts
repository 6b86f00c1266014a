/**
 * solve --portfolios in process: the k-portfolio factor model's JSON and text section on the data set
 * of test/fixtures/factor-model (checked against its scipy fit), the columns read like the books', and
 * typed outcomes for degenerate data and refused options (never exit 70).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import type { SolveOutputJson } from "../../src/schema/solveOutput.js";
import { expectClose } from "../support/close.js";
import { fakeIo } from "./fakeIo.js";

const fixture = JSON.parse(readFileSync(new URL("../fixtures/factor-model/factor_expected.json", import.meta.url), "utf8")) as {
  weights: number[];
  columns: number[][];
  loadings: number[];
  statistic: number;
  pValue: number;
};
const names = ["P1", "P2", "P3", "P4", "P5"];
const dataset = readFileSync(new URL("../fixtures/factor-model/factor_dataset.csv", import.meta.url), "utf8").trimEnd();

async function solve(files: Record<string, string>, args: string[]) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["solve", ...args], io);
  return { code, stdout: stdout(), stderr: stderr() };
}
const books = ["--low", "P1", "--high", "P5"];

describe("solve --portfolios", () => {
  it("writes the scipy fit's loadings and statistic (test/fixtures/factor-model/generate_factor.py)", async () => {
    const { code, stdout } = await solve({ "d.csv": dataset }, [
      "d.csv",
      ...books,
      "--portfolios",
      names.join(","),
      "--market-weights",
      fixture.weights.join(","),
      "--no-uncertainty",
      "--format",
      "json",
    ]);
    expect(code).toBe(exitCodes.ok);
    const model = (JSON.parse(stdout) as SolveOutputJson).factorModel!;
    model.portfolios.forEach((p, i) => expectClose(p.loading, fixture.loadings[i]!, { rel: 1e-6 }));
    expectClose(model.fit?.statistic, fixture.statistic, { rel: 1e-8 });
    expectClose(model.fit?.pValue, fixture.pValue, { rel: 1e-7 });
    expect(model.adjacentPairs.map((p) => `${p.low}/${p.high}`)).toEqual(["P1/P2", "P2/P3", "P3/P4", "P4/P5"]);
  });

  it("is null unless asked for, and prints a section of loadings beside CAPM betas in the text report", async () => {
    const plain = await solve({ "d.csv": dataset }, ["d.csv", ...books, "--no-uncertainty", "--format", "json"]);
    expect((JSON.parse(plain.stdout) as SolveOutputJson).factorModel).toBeNull();
    const text = await solve({ "d.csv": dataset }, ["d.csv", ...books, "--portfolios", names.join(","), "--no-uncertainty"]);
    expect(text.code).toBe(exitCodes.ok);
    expect(text.stdout).toContain("One-factor model on the portfolios");
    expect(text.stdout).toMatch(/CAPM beta/);
    expect(text.stdout).toMatch(/fit of one factor\s+chi-square/);
  });

  it("answers degenerate data with diagnostics, not an internal error", async () => {
    // Flat: a constant column; Twice: exactly 2 x P2 (perfectly correlated with it).
    const lines = dataset.split("\n");
    const extended = lines
      .map((line, t) => (t === 0 ? `${line},Flat,Twice` : `${line},0.001,${2 * fixture.columns[1]![t - 1]!}`))
      .join("\n");
    const cases = [
      ["P1,P2", "factor-too-few-portfolios"],
      ["P1,P2,Flat", "factor-constant"],
      ["P1,P2,Twice", "factor-singular-covariance"],
    ] as const;
    for (const [list, diagnostic] of cases) {
      const { code, stdout, stderr } = await solve({ "d.csv": extended }, [
        "d.csv",
        ...books,
        "--portfolios",
        list,
        "--no-uncertainty",
        "--format",
        "json",
      ]);
      expect(code, stderr).toBe(exitCodes.ok);
      const model = (JSON.parse(stdout) as SolveOutputJson).factorModel!;
      expect(model.fit).toBeNull();
      expect(model.diagnostics.map((d) => d.code)).toEqual([diagnostic]);
      expect(stderr).toMatch(/warning: .*(factor model|zero variance)/);
    }
  });

  it("leaves a column named twice to the input layer's refusal (exit 2, naming it)", async () => {
    const { code, stdout, stderr } = await solve({ "d.csv": dataset }, ["d.csv", ...books, "--portfolios", "P1,P2,P2", "--no-uncertainty"]);
    expect(code).toBe(exitCodes.input);
    expect(stderr).toContain('the column "P2" is asked for twice');
    expect(stdout).toBe("");
  });

  it("refuses market weights that do not match the portfolios, and a missing column, with their exit codes", async () => {
    const weights = await solve({ "d.csv": dataset }, ["d.csv", ...books, "--portfolios", "P1,P2,P3", "--market-weights", "1,2"]);
    expect(weights.code).toBe(exitCodes.usage);
    expect(weights.stderr).toContain("one market weight per --portfolios column");
    expect(weights.stdout).toBe("");
    const missing = await solve({ "d.csv": dataset }, ["d.csv", ...books, "--portfolios", "P1,P2,P9"]);
    expect(missing.code).toBe(exitCodes.input);
    expect(missing.stderr).toContain("P9");
    expect(missing.stdout).toBe("");
  });
});
