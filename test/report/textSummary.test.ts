/**
 * The summary block at the top of the text report, and solve --brief: its facts agree with the JSON
 * document of the same run, the annualised alpha and its HAC interval are the per-period ones times
 * the periods per year, and the diagnostics appear by code.
 */
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { formatNumber } from "../../src/report/format.js";
import { renderText } from "../../src/report/text/text.js";
import { briefCautionLine, cautionLine } from "../../src/report/text/textNotes.js";
import { diagnosticsSummary, summaryFields } from "../../src/report/text/textSummary.js";
import { fakeIo } from "../cli/fakeIo.js";
import { labelFlipSolution, rejectedSolution, reportOf, typicalSolution } from "./fixtures.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const pair = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--rf", "0.002"];

async function solve(extra: string[]) {
  const { io, stdout, stderr } = fakeIo({ "m.csv": monthly });
  const code = await run(["solve", "m.csv", ...pair, ...extra], io);
  return { code, stdout: stdout(), stderr: stderr() };
}

/** The summary's lines: from the "Summary" heading to the blank line after it. */
function summaryOf(text: string): string[] {
  const lines = text.split("\n");
  const start = lines.indexOf("Summary");
  return lines.slice(start, lines.indexOf("", start));
}

// scipy.stats.norm.ppf(0.975), the two-sided 95% normal critical value.
const z95 = 1.959963984540054;

describe("the summary block", () => {
  test("follows the title and states what the JSON of the same run holds", async () => {
    const text = (await solve([])).stdout;
    const json = JSON.parse((await solve(["--format", "json"])).stdout);
    const lines = text.split("\n");
    expect(lines[2]).toBe("Summary");
    const summary = summaryOf(text);
    expect(summary.length).toBeGreaterThanOrEqual(8);
    expect(summary.length).toBeLessThanOrEqual(12);
    const flat = summary.join(" ").replace(/\s+/g, " ");
    expect(flat).toContain(`${json.observations} monthly observations, ${json.input.firstDate} to ${json.input.lastDate}`);
    const b = json.bounds.lowBeta;
    const i = json.uncertainty.lowBeta.interval;
    expect(flat).toContain(
      `identified set ${formatNumber(b.min)} to ${formatNumber(b.max)}; 95% interval ${formatNumber(i.lower)} to ${formatNumber(i.upper)}`,
    );
    expect(flat).toContain(`Low book CAPM beta ${formatNumber(json.capm.low.beta)}`);
    // The annualised alpha and its HAC interval: 12 times the per-period alpha +/- z times the HAC error.
    const alpha = json.capm.low.alpha;
    const se = json.capm.low.hac.alphaStdErr;
    const pct = (x: number) => `${formatNumber(100 * 12 * x, 3)}%`;
    expect(flat).toContain(`Low book CAPM alpha ${pct(alpha)} a year (${formatNumber(alpha)} a period)`);
    expect(flat).toContain(`95% HAC interval ${pct(alpha - z95 * se)} to ${pct(alpha + z95 * se)}`);
    expect(flat).toMatch(/Noise explains it\? Undetermined at 95%: the low book's CAPM alpha/);
    expect(flat).toContain("Diagnostics no warnings or errors");
  });

  test("--brief prints the title, the summary and the caution alone; other formats refuse it", async () => {
    const full = await solve([]);
    const brief = await solve(["--brief"]);
    expect(brief.code).toBe(exitCodes.ok);
    const lines = brief.stdout.split("\n");
    expect(brief.stdout.startsWith(full.stdout.split("\n")[0]!)).toBe(true);
    expect(summaryOf(brief.stdout)).toEqual(summaryOf(full.stdout));
    // The caution says where the assumptions are: "above" only where an Assumptions section is above.
    const flat = (text: string) => text.replace(/\s+/g, " ");
    expect(flat(brief.stdout)).toContain(briefCautionLine);
    expect(brief.stdout).not.toContain("\nAssumptions\n");
    expect(flat(brief.stdout)).not.toContain("assumptions above");
    expect(full.stdout.indexOf(cautionLine)).toBeGreaterThan(full.stdout.indexOf("\nAssumptions\n"));
    expect(full.stdout.indexOf("\nAssumptions\n")).toBeGreaterThan(0);
    expect(brief.stdout).not.toContain("\nInput\n");
    expect(lines.every((line) => line.length < 100)).toBe(true);
    const json = await solve(["--brief", "--format", "json"]);
    expect(json.code).toBe(exitCodes.usage);
    expect(json.stdout).toBe("");
    expect(json.stderr).toContain("--brief");
  });

  test("names the warnings and errors by code, and says so when the model is rejected", () => {
    const flip = labelFlipSolution();
    const warnings = flip.diagnostics.filter((d) => d.severity === "warning").map((d) => d.code);
    expect(warnings.length).toBeGreaterThan(0);
    const flat = summaryFields(reportOf(flip))
      .map(([label, value]) => `${label}: ${value}`)
      .join("\n");
    expect(flat).toContain(`warning${warnings.length === 1 ? "" : "s"} (${warnings.join(", ")})`);

    const rejected = rejectedSolution();
    const fields = new Map(summaryFields(reportOf(rejected)));
    expect(fields.get("Low structural beta")).toMatch(/^none: no one-factor structure fits/);
    const errors = rejected.diagnostics.filter((d) => d.severity === "error").map((d) => d.code);
    expect(fields.get("Diagnostics")).toContain(`error${errors.length === 1 ? "" : "s"} (${errors.join(", ")})`);
    expect(fields.has("Noise explains it?")).toBe(false);
    expect(diagnosticsSummary([])).toBe("no warnings or errors");
  });

  test("without uncertainty it says no standard error was computed, and with an unknown frequency stays per period", () => {
    const report = reportOf(typicalSolution(), { frequency: null });
    const alpha = new Map(summaryFields(report)).get("Low book CAPM alpha");
    expect(alpha).toBe(`${formatNumber(report.solution.capm.low.alpha)} a period; no standard error computed`);
    const brief = renderText(report, { colour: false, brief: true });
    expect(brief).toMatch(new RegExp(`\\n  Sample +${report.solution.observations} observations, `));
  });
});
