import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { assessUncertainty as assessChecked } from "../../src/core/inference/uncertainty.js";

const assessUncertainty = (...args: Parameters<typeof assessChecked>) => {
  const result = assessChecked(...args);
  if (!result.ok) throw new Error(result.issues.map((d) => d.message).join("; "));
  return result.value;
};
import { solveOutputSchema } from "../../src/schema/solveOutput.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const rows = monthly
  .trim()
  .split("\n")
  .slice(1)
  .map((line) => line.split(","));
const low = Float64Array.from(rows, (r) => Number(r[1]));
const high = Float64Array.from(rows, (r) => Number(r[2]));
const books = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--rf", "0.002"];

async function solveJson(args: string[], files: Record<string, string> = { "m.csv": monthly }) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["solve", "m.csv", ...books, "--format", "json", ...args], io);
  return { code, json: stdout() === "" ? null : JSON.parse(stdout()), stderr: stderr() };
}

const get = (json: unknown, path: string): unknown =>
  path.split(".").reduce<unknown>((node, key) => (node as Record<string, unknown> | undefined)?.[key], json);

describe("solve reports the uncertainty of every headline number", () => {
  it("carries every JSON field of the contract, equal to the core's assessUncertainty", async () => {
    const { code, json } = await solveJson(["--bootstrap", "400", "--seed", "7"]);
    expect(code).toBe(exitCodes.ok);
    expect(solveOutputSchema.safeParse(json).success).toBe(true);
    for (const path of [
      "capm.low.hac.alphaStdErr",
      "capm.low.hac.betaStdErr",
      "capm.high.hac.alphaStdErr",
      "capm.high.hac.betaStdErr",
      "capm.hac.lags",
      "uncertainty.confidence",
      ...["lowBeta", "highBeta"].flatMap((b) =>
        ["min", "max"].flatMap((e) => ["stdError", "lower", "upper"].map((f) => `uncertainty.bounds.${b}.${e}.${f}`)),
      ),
      "uncertainty.lowBeta.interval.lower",
      "uncertainty.lowBeta.interval.upper",
      "uncertainty.highBeta.interval.lower",
      "uncertainty.bootstrap.replicates",
      "uncertainty.bootstrap.blockLength",
      "uncertainty.bootstrap.seed",
    ]) {
      expect(typeof get(json, path), path).toBe("number");
    }
    expect(get(json, "capm.hac.kernel")).toBe("bartlett");
    expect(get(json, "uncertainty.lowBeta.interval.method")).toBe("imbens-manski");
    const direct = assessUncertainty({ low, high, riskFree: 0.002 }, {});
    expect(json.capm.low.hac).toEqual(direct.capm.low.hac);
    expect(json.uncertainty.bounds).toEqual(direct.bounds);
    expect(json.uncertainty.lowBeta).toEqual(direct.lowBeta);
    expect(json.uncertainty.bootstrap.replicates).toBe(400);
    expect(json.uncertainty.bootstrap.seed).toBe(7);
  });

  it("passes the interval, long-run and HAC options through", async () => {
    const { json } = await solveJson(["--interval", "stoye", "--long-run", "iid", "--hac-lags", "6", "--confidence", "0.9"]);
    const direct = assessUncertainty(
      { low, high, riskFree: 0.002 },
      { interval: "stoye", longRun: "iid", hac: { lags: 6 }, confidence: 0.9 },
    );
    expect(json.uncertainty.confidence).toBe(0.9);
    expect(json.capm.hac.lags).toBe(6);
    expect(json.uncertainty.lowBeta).toEqual(direct.lowBeta);
    expect(json.uncertainty.lowBeta.interval.method).toBe("stoye");
  });

  it("gives the same bootstrap for the same seed and a different one for another seed", async () => {
    const a = await solveJson(["--bootstrap", "300", "--seed", "3"]);
    const b = await solveJson(["--bootstrap", "300", "--seed", "3"]);
    const c = await solveJson(["--bootstrap", "300", "--seed", "4"]);
    expect(a.json.uncertainty.bootstrap).toEqual(b.json.uncertainty.bootstrap);
    expect(a.json.uncertainty.bootstrap.intervals).not.toEqual(c.json.uncertainty.bootstrap.intervals);
  });

  it("omits the uncertainty with --no-uncertainty, and says why below 10 observations", async () => {
    const none = await solveJson(["--no-uncertainty"]);
    expect(none.json.uncertainty).toBeNull();
    expect(none.json.capm.low.hac).toBeNull();
    const short = [monthly.split("\n")[0], ...monthly.split("\n").slice(1, 8)].join("\n");
    const few = await solveJson([], { "m.csv": short });
    expect(few.json.uncertainty).toBeNull();
    expect(few.json.diagnostics.map((d: { code: string }) => d.code)).toContain("uncertainty-unavailable");
  });

  it("refuses bootstrap standard errors without a bootstrap", async () => {
    const { code, stderr } = await solveJson(["--interval-source", "bootstrap"]);
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("--interval-source");
  });

  it("shows a progress line only on a terminal and only after a second", async () => {
    let clock = 0;
    const terminal = fakeIo({ "m.csv": monthly }, { stderrIsTerminal: true, now: () => (clock += 400) });
    await run(["solve", "m.csv", ...books, "--bootstrap", "2000", "--format", "json"], terminal.io);
    expect(terminal.stderr()).toMatch(/\rbootstrap \[#+\.*\] +\d+%/);
    const quick = fakeIo({ "m.csv": monthly }, { stderrIsTerminal: true, now: () => 0 });
    await run(["solve", "m.csv", ...books, "--bootstrap", "2000", "--format", "json"], quick.io);
    expect(quick.stderr()).toBe("");
    const piped = fakeIo({ "m.csv": monthly }, { stderrIsTerminal: false, now: () => (clock += 400) });
    await run(["solve", "m.csv", ...books, "--bootstrap", "2000", "--format", "json"], piped.io);
    expect(piped.stderr()).toBe("");
  });

  it("puts the uncertainty beside the estimates in the text report", async () => {
    const { io, stdout } = fakeIo({ "m.csv": monthly });
    await run(["solve", "m.csv", ...books, "--bootstrap", "300"], io);
    const text = stdout();
    for (const heading of [
      "How precisely the set is known (95% confidence)",
      "Reading the uncertainty",
      "Sharpe ratios (excess returns)",
      "Stationary bootstrap (300 replicates",
    ]) {
      expect(text).toContain(heading);
    }
    expect(text).toMatch(/alpha HAC std\. error/);
    expect(text).toMatch(/low structural beta \(Imbens-Manski, 95%\)\s+0\.\d+ to 0\.\d+/);
  });
});
