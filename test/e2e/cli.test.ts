/**
 * End-to-end: the built executable (dist/cli.cjs, made by `npm run build`, which `npm test` runs first),
 * as a user runs it, in a scratch folder.
 */
import { execFileSync, spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url).pathname;
const cli = join(root, "dist/cli.cjs");
const monthly = join(root, "examples/harbourline-monthly.csv");
const books = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

function betabound(args: string[], input?: string) {
  const result = spawnSync(process.execPath, [cli, ...args], {
    input,
    encoding: "utf8",
    env: { ...process.env, NO_COLOR: "1" },
  });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

let scratch = "";
beforeAll(() => {
  expect(existsSync(cli), "dist/cli.cjs is missing: run npm run build").toBe(true);
  scratch = mkdtempSync(join(tmpdir(), "betabound-e2e-"));
});

describe("the betabound executable", () => {
  it("prints every contract field of solve --format json for the bundled example", () => {
    const { code, stdout } = betabound(["solve", monthly, ...books, "--rf", "0.002", "--format", "json"]);
    expect(code).toBe(0);
    const json = JSON.parse(stdout);
    const paths = [
      "observations",
      "moments.low.mean",
      "moments.low.variance",
      "moments.low.stdev",
      "moments.high.mean",
      "moments.high.variance",
      "moments.high.stdev",
      "moments.market.mean",
      "moments.market.variance",
      "moments.market.stdev",
      "moments.covariance.lowHigh",
      "moments.covariance.lowMarket",
      "moments.covariance.highMarket",
      "moments.correlation.lowHigh",
      ...["low", "high"].flatMap((book) =>
        ["alpha", "beta", "alphaStdErr", "betaStdErr", "rSquared", "residualVariance"].map((f) => `capm.${book}.${f}`),
      ),
      "bounds.lowBeta.min",
      "bounds.lowBeta.max",
      "bounds.highBeta.min",
      "bounds.highBeta.max",
    ];
    for (const path of paths) {
      const value = path.split(".").reduce<unknown>((node, key) => (node as Record<string, unknown> | undefined)?.[key], json);
      expect(typeof value, path).toBe("number");
    }
    const candidateFields = [
      "lowBeta",
      "highBeta",
      "factorVariance",
      "lowNoiseVariance",
      "highNoiseVariance",
      "noiseShare",
      "expectedLowAlpha",
      "expectedHighAlpha",
    ];
    expect(json.grid).toHaveLength(11);
    for (const candidate of [...json.grid, ...Object.values(json.landmarks)]) {
      for (const field of candidateFields) expect(candidate, field).toHaveProperty(field);
    }
    expect(Object.keys(json.landmarks).sort()).toEqual(["capmConsistent", "equalNoise", "highNoiseFree", "lowNoiseFree", "returnImplied"]);
    expect(Array.isArray(json.diagnostics)).toBe(true);
  });

  it("shows an example for each command in --help and the version with --version", () => {
    expect(betabound(["solve", "--help"]).stdout).toContain("$ betabound solve");
    expect(betabound(["simulate", "--help"]).stdout).toContain("$ betabound simulate");
    const version = JSON.parse(readFileSync(join(root, "package.json"), "utf8")).version;
    expect(betabound(["--version"]).stdout.trim()).toBe(version);
  });

  it("regenerates the bundled example byte for byte from its documented command and seed", () => {
    const { code, stdout } = betabound([
      "simulate",
      "--low-beta",
      "0.72",
      "--factor-vol",
      "0.045",
      "--factor-mean",
      "0.006",
      "--low-noise-vol",
      "0.014",
      "--high-noise-vol",
      "0.022",
      "--rf",
      "0.002",
      "--periods",
      "180",
      "--start",
      "2011-01-01",
      "--seed",
      "8",
      "--digits",
      "6",
      "--names",
      "Month End,Stillwater Low Vol,Kestrel High Beta",
    ]);
    expect(code).toBe(0);
    expect(stdout).toBe(readFileSync(monthly, "utf8"));
  });

  it("works as a pipeline: simulate | solve -", () => {
    const sample = execFileSync(
      process.execPath,
      [
        cli,
        "simulate",
        "--low-beta",
        "0.8",
        "--factor-vol",
        "0.01",
        "--low-noise-vol",
        "0.003",
        "--high-noise-vol",
        "0.004",
        "--periods",
        "2520",
        "--frequency",
        "daily",
        "--seed",
        "3",
      ],
      { encoding: "utf8" },
    );
    const { code, stdout } = betabound(["solve", "-", "--low", "low", "--high", "high", "--format", "json"], sample);
    expect(code).toBe(0);
    const json = JSON.parse(stdout);
    expect(json.observations).toBe(2520);
    expect(json.input.frequency.name).toBe("daily");
    expect(json.bounds.lowBeta.min).toBeLessThan(0.8);
    expect(json.bounds.lowBeta.max).toBeGreaterThan(0.8);
  });

  it("fails on a missing file with exit 2, one clear line and no stack trace", () => {
    const { code, stdout, stderr } = betabound(["solve", join(scratch, "nope.csv"), ...books]);
    expect(code).toBe(2);
    expect(stdout).toBe("");
    expect(stderr).toMatch(/^error: cannot read '.*nope\.csv': no such file or directory/);
    expect(stderr).not.toMatch(/\n\s+at /);
  });

  it("leaves an existing output file untouched when the run fails, and replaces it when it succeeds", () => {
    const target = join(scratch, "report.json");
    writeFileSync(target, "previous contents\n");
    const bad = join(scratch, "bad.csv");
    writeFileSync(bad, "date,Stillwater Low Vol,Kestrel High Beta\n2024-01-31,0.01,x\n");
    expect(betabound(["solve", bad, ...books, "--output", target]).code).toBe(2);
    expect(readFileSync(target, "utf8")).toBe("previous contents\n");
    expect(betabound(["solve", monthly, ...books, "--format", "json", "--output", target]).code).toBe(0);
    expect(JSON.parse(readFileSync(target, "utf8")).observations).toBe(180);
    expect(readdirSync(scratch).filter((name) => name.endsWith(".tmp"))).toEqual([]);
  });

  it("exits 4 when the output folder does not exist, writing nothing", () => {
    const { code, stdout, stderr } = betabound(["solve", monthly, ...books, "--output", join(scratch, "no/such/dir/r.txt")]);
    expect(code).toBe(4);
    expect(stdout).toBe("");
    expect(stderr).toMatch(/^error: cannot write '.*r\.txt': no such file or directory/);
  });

  it("gives the same bootstrap bit for bit with 1 and 2 worker threads", () => {
    const args = ["solve", monthly, ...books, "--rf", "0.002", "--format", "json", "--bootstrap", "3000", "--seed", "11"];
    const one = betabound([...args, "--threads", "1"]);
    const two = betabound([...args, "--threads", "2"]);
    expect(one.code).toBe(0);
    expect(two.code).toBe(0);
    expect(JSON.parse(two.stdout).uncertainty.bootstrap.replicates).toBe(3000);
    expect(two.stdout).toBe(one.stdout);
  });
});
