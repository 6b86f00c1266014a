import { describe, expect, test } from "vitest";
import { landmarkNames } from "../../src/core/types.js";
import { landmarkWords, modelAssumptions } from "../../src/report/conventions.js";
import { formatNumber, tableDigits } from "../../src/report/format.js";
import { renderText } from "../../src/report/text/text.js";
import { cautionLine } from "../../src/report/text/textNotes.js";
import { landmarkDescriptions } from "../../src/report/text/textSet.js";
import { labelFlipSolution, rejectedSolution, reportOf, solvedFixtures, typicalSolution, zeroMeanSolution } from "./fixtures.js";

const plain = { colour: false };
const ESC = "\u001b";

const sectionHeadings = [
  "Input",
  "Sample moments (excess returns, per period)",
  "CAPM regressions on the market proxy",
  "The identified set",
  "Landmarks",
  "Candidate grid",
  "Diagnostics",
  "Assumptions",
];

/** Line indexes of the headings (lines equal to the heading), in the order found. */
function headingOrder(text: string, headings: readonly string[]): number[] {
  const lines = text.split("\n");
  return headings.map((h) => lines.indexOf(h));
}

describe("renderText", () => {
  test("has a title line and every section heading, in the documented order", () => {
    const text = renderText(reportOf(typicalSolution()), plain);
    expect(text.split("\n")[0]).toMatch(/^betabound 0\.1\.0-test: /);
    const positions = headingOrder(text, sectionHeadings);
    expect(
      positions.every((p) => p > 0),
      `missing heading: ${sectionHeadings[positions.indexOf(-1)]}`,
    ).toBe(true);
    expect([...positions].sort((a, b) => a - b)).toEqual(positions);
    expect(text.indexOf(cautionLine)).toBeGreaterThan(text.indexOf("\nAssumptions\n"));
    expect(text.indexOf("Conventions: decimal units per period")).toBeGreaterThan(text.indexOf(cautionLine));
  });

  test("shows the bounds of both betas and of the factor variance as formatted", () => {
    const solution = typicalSolution();
    const text = renderText(reportOf(solution), plain);
    const b = solution.bounds!;
    for (const [label, interval] of [
      ["low structural beta", b.lowBeta],
      ["high structural beta", b.highBeta],
      ["factor variance", b.factorVariance],
    ] as const) {
      expect(text).toMatch(new RegExp(`${label} +${formatNumber(interval.min)} to ${formatNumber(interval.max)}\n`));
    }
    expect(text).toContain("fits the data equally well");
    expect(text).toMatch(/between the common factor\s+and its own noise/);
  });

  test("lists every landmark by name with its plain-language description", () => {
    const text = renderText(reportOf(typicalSolution()), plain);
    for (const name of landmarkNames) {
      expect(text).toMatch(new RegExp(`\n  ${landmarkWords[name]} +-?\\d`));
      expect(text).not.toContain(name);
      expect(text).toContain(landmarkDescriptions[name].split(" ").slice(0, 4).join(" "));
    }
    expect(landmarkDescriptions.highNoiseFree).toMatch(/^high book has no noise/);
    expect(typicalSolution().landmarks?.returnImplied?.insideSet).toBe(false);
    expect(text.replace(/\s+/g, " ")).toContain(
      "(outside the identified set by the point estimates; the pricing section tests whether significantly)",
    );
  });

  test("shows the moments, the CAPM estimates and the grid with the solution's values", () => {
    const solution = typicalSolution();
    const text = renderText(reportOf(solution), plain);
    const m = solution.moments;
    expect(text).toMatch(new RegExp(`\n  low +${formatNumber(m.low.mean)} +${formatNumber(m.low.stdev)} `));
    expect(text).toContain(`correlation of low and high  ${formatNumber(m.correlation.lowHigh)}`);
    expect(text).toMatch(new RegExp(`\n  beta +${formatNumber(solution.capm.low.beta)} +${formatNumber(solution.capm.high.beta)}\n`));
    expect(text).toMatch(/\n {2}alpha p-value +\S+ +\S+\n/);
    const gridRows = text.split("\n").filter((line) => /^ {2}\d+ +-?\d/.test(line));
    expect(gridRows).toHaveLength(solution.grid.length);
    expect(gridRows[0]).toMatch(new RegExp(`^  1 +${formatNumber(solution.grid[0]!.lowBeta, tableDigits)} `));
  });

  test("says every candidate reproduces the observed CAPM fits, with the largest relative difference", () => {
    const text = renderText(reportOf(typicalSolution()), plain);
    expect(text).toMatch(
      /Check: every candidate reproduces the observed CAPM betas and residual variances \(largest\s+relative difference across the grid: (\d\.\de-\d+|0)\)/,
    );
  });

  test("flags a grid that does not reproduce the CAPM fits", () => {
    const solution = typicalSolution();
    const c = solution.grid[2]!;
    const tampered = { ...solution, grid: [c, { ...c, impliedCapm: { ...c.impliedCapm, lowBeta: c.impliedCapm.lowBeta * 1.01 } }] };
    expect(renderText(reportOf(tampered), plain)).toContain("Check FAILED");
  });

  test("lists the diagnostics with their severity, and 'none' when there are none", () => {
    const solution = typicalSolution();
    const text = renderText(reportOf(solution), plain);
    for (const d of solution.diagnostics) expect(text).toContain(`  ${d.severity}  ${d.message.split(" ").slice(0, 5).join(" ")}`);
    const clean = renderText(reportOf({ ...solution, diagnostics: [] }), plain);
    expect(clean).toContain("Diagnostics\n  none\n");
  });

  test("states the assumptions and closes with the caution", () => {
    const text = renderText(reportOf(typicalSolution()), plain);
    for (const a of modelAssumptions) expect(text.replace(/\s+/g, " ")).toContain(a.split(" ").slice(0, 6).join(" "));
    expect(text).toContain(cautionLine);
    expect(cautionLine).toMatch(/statistical estimates .* not investment advice/);
  });

  test("a landmark the core did not compute shows n/a and says why", () => {
    const text = renderText(reportOf(zeroMeanSolution()), plain);
    expect(text).toMatch(/\n {2}return-implied( +n\/a){8}\n/);
    expect(text.replace(/\s+/g, " ")).toContain("if only the factor is priced (not reported: see Diagnostics)");
  });

  test("the input section names the file, columns, risk-free, units, dates, frequency and dropped rows", () => {
    const report = reportOf(typicalSolution(), { droppedDates: ["d1", "d2", "d3", "d4", "d5", "d6"], rowsDropped: 9 });
    const text = renderText(report, plain);
    for (const piece of [
      "examples/books.csv",
      '"Low Vol"',
      '"High Beta"',
      '"Date"',
      "0.001 per period",
      "percent",
      "2019-01-31 to 2023-12-31",
      "monthly (12 periods per year)",
    ]) {
      expect(text).toContain(piece);
    }
    expect(text).toContain("9 with a missing value; first: d1, d2, d3, d4, d5, and 4 more");
    const none = renderText(
      reportOf(typicalSolution(), { rowsDropped: 0, droppedDates: [], frequency: null, riskFree: { kind: "none" } }),
      plain,
    );
    expect(none).toMatch(/Dropped rows +none\n/);
    expect(none).toContain("could not be told from the dates");
    expect(none).toContain("returns are raw");
  });

  test("contains no escape character without colour, even when the input names contain one", () => {
    const report = reportOf(typicalSolution(), { lowColumn: "Low\u001b[31m", source: "a\u0007b.csv" });
    for (const solution of [...Object.values(solvedFixtures()), rejectedSolution()]) {
      expect(renderText({ ...report, solution }, plain)).not.toContain(ESC);
    }
    expect(renderText(report, plain)).toContain("Low\\u{1b}[31m");
  });

  test("with colour, headings are bold, warnings yellow and errors red", () => {
    const text = renderText(reportOf(typicalSolution()), { colour: true });
    expect(text).toContain(`${ESC}[1mLandmarks${ESC}[0m`);
    // The label-flip sample carries a warning (its set's upper end exceeds 1).
    expect(renderText(reportOf(labelFlipSolution()), { colour: true })).toContain(`${ESC}[33mwarning${ESC}[0m`);
    expect(renderText(reportOf(rejectedSolution()), { colour: true })).toContain(`${ESC}[31merror${ESC}[0m`);
  });

  test.each([...Object.entries(solvedFixtures()), ["rejected", rejectedSolution()] as const])(
    "keeps every line under 100 columns and ends with one newline (%s)",
    (_, solution) => {
      const text = renderText(reportOf(solution), plain);
      const long = text.split("\n").filter((line) => line.length >= 100);
      expect(long).toEqual([]);
      expect(text.endsWith("\n") && !text.endsWith("\n\n")).toBe(true);
    },
  );
});

describe("renderText for a rejected model", () => {
  const solution = rejectedSolution();
  const text = renderText(reportOf(solution), plain);

  test("still shows the input, the moments and the CAPM regressions", () => {
    expect(headingOrder(text, sectionHeadings.slice(0, 3)).every((p) => p > 0)).toBe(true);
    expect(text).toContain(formatNumber(solution.moments.covariance.lowHigh));
    expect(text).toMatch(new RegExp(`\n  beta +${formatNumber(solution.capm.low.beta)} `));
  });

  test("says plainly that no structure fits, and why", () => {
    expect(text).toMatch(/The identified set\n {2}None: no one-factor structure fits these data/);
    const error = solution.diagnostics.find((d) => d.severity === "error")!;
    expect(error.code).toBe("nonpositive-covariance");
    expect(text.replace(/\s+/g, " ")).toContain(`Why: ${error.message}.`);
  });

  test("omits the set sections but keeps diagnostics, assumptions and the caution", () => {
    expect(text).not.toContain("\nLandmarks\n");
    expect(text).not.toContain("\nCandidate grid\n");
    expect(text).not.toContain("low structural beta");
    expect(text).toContain("\nDiagnostics\n  error  the covariance of low and high is");
    expect(text).toContain("\nAssumptions\n");
    expect(text).toContain(cautionLine);
  });
});
