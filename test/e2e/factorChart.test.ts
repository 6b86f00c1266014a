/** solve --portfolios --chart end to end: the built executable draws the loadings against the CAPM betas. */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { XMLValidator } from "fast-xml-parser";
import { describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url).pathname;
const cli = join(root, "dist/cli.cjs");
const dataset = join(root, "test/fixtures/factor-model/factor_dataset.csv");
const scratch = mkdtempSync(join(tmpdir(), "betabound-factor-chart-"));

describe("the k-portfolio chart from the command line", () => {
  it("writes the chart with every portfolio labelled and the report with it inline; the JSON on stdout is unchanged", () => {
    const svg = join(scratch, "loadings.svg");
    const html = join(scratch, "report.html");
    const common = ["solve", dataset, "--low", "P1", "--high", "P5", "--portfolios", "P1,P2,P3,P4,P5", "--format", "json"];
    const drawn = spawnSync(process.execPath, [cli, ...common, "--chart", svg, "--report", html], { encoding: "utf8" });
    expect(drawn.status).toBe(0);
    const plain = spawnSync(process.execPath, [cli, ...common], { encoding: "utf8" });
    expect(drawn.stdout).toBe(plain.stdout);
    const chart = readFileSync(svg, "utf8");
    expect(XMLValidator.validate(chart)).toBe(true);
    expect(chart).toContain("Structural loadings against CAPM betas");
    for (const name of ["P1", "P2", "P3", "P4", "P5"]) expect(chart).toContain(`>${name}</text>`);
    expect(chart).toContain("loading = CAPM beta");
    const page = readFileSync(html, "utf8");
    expect(page).toContain("Structural loadings against CAPM betas");
    expect(page.match(/<svg/g)).toHaveLength(2);
  });

  it("adds the sets under correlated noise to the identified set's chart", () => {
    const svg = join(scratch, "set.svg");
    const args = ["solve", dataset, "--low", "P1", "--high", "P5", "--noise-correlation", "0,0.5", "--chart", svg];
    const result = spawnSync(process.execPath, [cli, ...args], { encoding: "utf8" });
    expect(result.status).toBe(0);
    const chart = readFileSync(svg, "utf8");
    expect(XMLValidator.validate(chart)).toBe(true);
    expect(chart).toContain(">rho = 0.5");
    expect(chart).toContain(">rho = 0 (as uncorrelated)</text>");
  });
});
