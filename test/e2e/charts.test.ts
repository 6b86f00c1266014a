/** solve --chart / --report end to end, and the promise that plain runs never load the chart library. */
import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { XMLValidator } from "fast-xml-parser";
import { describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url).pathname;
const cli = join(root, "dist/cli.cjs");
const trace = join(root, "test/e2e/support/traceImports.mjs");
const monthly = join(root, "examples/harbourline-monthly.csv");
const books = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--rf", "0.002"];
const scratch = mkdtempSync(join(tmpdir(), "betabound-charts-"));

function tracedRun(args: string[]): { code: number | null; packages: string[] } {
  const traceFile = join(scratch, `trace-${Math.random().toString(36).slice(2)}.txt`);
  const result = spawnSync(process.execPath, ["--import", trace, cli, ...args], {
    encoding: "utf8",
    env: { ...process.env, BETABOUND_TRACE_FILE: traceFile },
  });
  const packages = existsSync(traceFile) ? readFileSync(traceFile, "utf8").trim().split("\n") : [];
  return { code: result.status, packages };
}

describe("charts from the command line", () => {
  it("does not load the chart library when no chart is asked for", () => {
    const plain = tracedRun(["solve", monthly, ...books, "--format", "json"]);
    expect(plain.code).toBe(0);
    expect(plain.packages.filter((p) => p.startsWith("vega"))).toEqual([]);
  });

  it("writes a well-formed SVG chart and a self-contained HTML report, loading vega only then", () => {
    const svg = join(scratch, "set.svg");
    const html = join(scratch, "report.html");
    const run = tracedRun(["solve", monthly, ...books, "--chart", svg, "--report", html, "--format", "json"]);
    expect(run.code).toBe(0);
    expect(run.packages).toContain("vega");
    const chart = readFileSync(svg, "utf8");
    expect(XMLValidator.validate(chart)).toBe(true);
    expect(chart).toContain("low structural beta (b_low)");
    const page = readFileSync(html, "utf8");
    expect(page.startsWith("<!DOCTYPE html>")).toBe(true);
    expect(page).toContain("<svg");
    expect(page).not.toMatch(/(src|href)=["']https?:/);
  });

  it("refuses --chart for several pairs", () => {
    const result = spawnSync(process.execPath, [cli, "solve", monthly, monthly, ...books, "--chart", join(scratch, "x.svg")], {
      encoding: "utf8",
    });
    expect(result.status).toBe(1);
    expect(result.stderr).toContain("--chart");
  });

  it("draws the roll band chart as well-formed SVG", () => {
    const svg = join(scratch, "band.svg");
    const result = spawnSync(
      process.execPath,
      [cli, "roll", monthly, ...books, "--window", "60", "--step", "6", "--uncertainty", "--format", "csv", "--chart", svg],
      { encoding: "utf8" },
    );
    expect(result.status).toBe(0);
    const chart = readFileSync(svg, "utf8");
    expect(XMLValidator.validate(chart)).toBe(true);
    expect(chart).toContain("rolling windows of 60 periods");
  });

  for (const [file, window, first] of [
    ["monthly-yyyymm.csv", "12", /1990|1991/],
    ["annual-yyyy.csv", "10", /1989|1990/],
  ] as const) {
    it(`draws the roll chart for dates written like ${file.split("-").slice(1).join("-")} (every form the reader accepts)`, () => {
      const svg = join(scratch, `${file}.svg`);
      const input = join(root, "test/fixtures/shapes", file);
      const result = spawnSync(
        process.execPath,
        [cli, "roll", input, "--low", "low", "--high", "high", "--window", window, "--chart", svg],
        {
          encoding: "utf8",
        },
      );
      expect(result.status, result.stderr).toBe(0);
      const chart = readFileSync(svg, "utf8");
      expect(XMLValidator.validate(chart)).toBe(true);
      expect(chart).toMatch(first);
    });
  }
});
