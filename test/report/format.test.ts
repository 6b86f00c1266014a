import { describe, expect, test } from "vitest";
import { largestCapmDiscrepancy, relativeDifference } from "../../src/report/check.js";
import { formatNumber, notAvailable } from "../../src/report/format.js";
import { fields, printable, styleFor, table, wrap } from "../../src/report/layout.js";
import { rejectedSolution, typicalSolution } from "./fixtures.js";

describe("formatNumber", () => {
  test.each([
    [0.714285714285, 5, "0.71429"],
    [1.2857142857, 5, "1.2857"],
    [-0.0028737, 5, "-0.0028737"],
    [0.001, 4, "0.001000"],
    [0.00099996, 4, "1.000e-3"],
    [1.23456e-5, 3, "1.23e-5"],
    [-2.763e-18, 4, "-2.763e-18"],
    [123456.7, 5, "1.2346e+5"],
    [99999.7, 5, "1.0000e+5"],
    [12345.6, 5, "12346"],
    [42, 3, "42.0"],
  ])("formats %s with %i digits as %s", (x, digits, expected) => {
    expect(formatNumber(x, digits)).toBe(expected);
  });

  test("zero of either sign is 0, null is n/a, and the default is 5 significant digits", () => {
    expect(formatNumber(0)).toBe("0");
    expect(formatNumber(-0)).toBe("0");
    expect(formatNumber(null)).toBe(notAvailable);
    expect(formatNumber(Math.PI)).toBe("3.1416");
  });

  test("never scales to percent: 0.05 stays 0.05", () => {
    expect(formatNumber(0.05, 3)).toBe("0.0500");
    expect(formatNumber(0.05, 3)).not.toContain("%");
  });
});

describe("layout", () => {
  test("tables left-align the first column, right-align the rest and bottom-align split headings", () => {
    const lines = table({
      header: ["", "a\nlong", "b"],
      rows: [
        ["x", "1", "22"],
        ["yy", "333", "4"],
      ],
    });
    expect(lines).toEqual(["         a", "      long   b", "  x      1  22", "  yy   333   4"]);
  });

  test("short rows are padded, trailing blanks trimmed", () => {
    expect(table({ header: ["k", "v"], rows: [["only"]] })).toEqual(["  k     v", "  only"]);
  });

  test("wrap keeps lines within the width and uses the continuation prefix", () => {
    const lines = wrap("one two three four five six seven", "> ", "  ", 12);
    expect(lines).toEqual(["> one two", "  three four", "  five six", "  seven"]);
    expect(lines.every((l) => l.length <= 12)).toBe(true);
    expect(wrap("", "- ", "  ")).toEqual(["- "]);
  });

  test("fields pad labels to a common width", () => {
    expect(
      fields([
        ["a", "1"],
        ["long", "2"],
      ]),
    ).toEqual(["  a     1", "  long  2"]);
  });

  test("printable escapes control characters and keeps everything else", () => {
    expect(printable("a\u001b[2Jb\u0007\u009b")).toBe("a\\u{1b}[2Jb\\u{7}\\u{9b}");
    expect(printable("Kestrel High Beta (€)")).toBe("Kestrel High Beta (€)");
  });

  test("style is the identity without colour and ANSI with it", () => {
    const off = styleFor({ colour: false });
    expect([off.heading("h"), off.warning("w"), off.error("e")]).toEqual(["h", "w", "e"]);
    const on = styleFor({ colour: true });
    expect([on.heading("h"), on.warning("w"), on.error("e")]).toEqual([
      "\u001b[1mh\u001b[0m",
      "\u001b[33mw\u001b[0m",
      "\u001b[31me\u001b[0m",
    ]);
  });
});

describe("the CAPM reproduction check", () => {
  test("relative difference is symmetric and 0 for two zeros", () => {
    expect(relativeDifference(0, 0)).toBe(0);
    expect(relativeDifference(1, 1.5)).toBeCloseTo(1 / 3, 15);
    expect(relativeDifference(1.5, 1)).toBe(relativeDifference(1, 1.5));
    expect(relativeDifference(-1e-300, 0)).toBe(1);
  });

  test("a real grid reproduces the observed CAPM fits to rounding, and an empty grid has no value", () => {
    const discrepancy = largestCapmDiscrepancy(typicalSolution());
    expect(discrepancy).not.toBeNull();
    expect(discrepancy!).toBeLessThan(1e-12);
    expect(largestCapmDiscrepancy(rejectedSolution())).toBeNull();
  });

  test("a candidate that implies another residual variance is found", () => {
    const solution = typicalSolution();
    const c = solution.grid[0]!;
    const off = { ...c, impliedCapm: { ...c.impliedCapm, highResidualVariance: c.impliedCapm.highResidualVariance * 2 } };
    expect(largestCapmDiscrepancy({ ...solution, grid: [...solution.grid, off] })).toBeCloseTo(0.5, 12);
  });
});
