import { describe, expect, test } from "vitest";
import { landmarkNames, type Solution } from "../../src/core/types.js";
import { modelAssumptions } from "../../src/report/conventions.js";
import { assertJsonSafe, renderJson } from "../../src/report/json.js";
import { at, expectSameValues } from "./compare.js";
import { input, rejectedSolution, reportOf, solvedFixtures, typicalSolution } from "./fixtures.js";

const plain = { colour: false };
const parse = (solution: Solution, overrides = {}): Record<string, unknown> =>
  JSON.parse(renderJson(reportOf(solution, overrides), plain)) as Record<string, unknown>;

const seriesFields = ["mean", "variance", "stdev"];
const fitFields = ["alpha", "beta", "alphaStdErr", "betaStdErr", "rSquared", "residualVariance"];
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
/** The JSON paths the brief fixes as the contract (grid and landmark fields are checked per candidate). */
const contractPaths = [
  "observations",
  "weight",
  ...["low", "high", "market"].flatMap((s) => seriesFields.map((f) => `moments.${s}.${f}`)),
  "moments.covariance.lowHigh",
  "moments.covariance.lowMarket",
  "moments.covariance.highMarket",
  "moments.correlation.lowHigh",
  ...["low", "high"].flatMap((b) => fitFields.map((f) => `capm.${b}.${f}`)),
  "bounds.lowBeta.min",
  "bounds.lowBeta.max",
  "bounds.highBeta.min",
  "bounds.highBeta.max",
];

describe("renderJson", () => {
  test("every contract path is present and holds the Solution's value exactly", () => {
    const solution = typicalSolution();
    expect(solution.landmarks?.returnImplied, "the fixture has every landmark").toBeTruthy();
    const json = parse(solution);
    for (const path of contractPaths) {
      expect(at(json, path), path).toBeTypeOf("number");
      expect(at(json, path) === at(solution, path), path).toBe(true);
    }
    expect((json.grid as unknown[]).length).toBe(solution.grid.length);
    solution.grid.forEach((candidate, i) => {
      for (const field of candidateFields) {
        expect(at(json, `grid.${i}.${field}`) === at(candidate, field), `grid.${i}.${field}`).toBe(true);
      }
    });
    for (const name of landmarkNames) {
      for (const field of candidateFields) {
        expect(at(json, `landmarks.${name}.${field}`) === at(solution, `landmarks.${name}.${field}`), `${name}.${field}`).toBe(true);
      }
    }
    const diagnostics = json.diagnostics as Record<string, unknown>[];
    expect(diagnostics.map((d) => Object.keys(d))).toEqual(solution.diagnostics.map(() => ["code", "severity", "message", "detail"]));
  });

  test.each(Object.entries(solvedFixtures()))("the Solution fields round-trip to the last bit (%s)", (_, solution) => {
    const json = parse(solution);
    const { observations, weight, moments, capm, bounds, grid, landmarks, diagnostics } = solution;
    const solutionPart = Object.fromEntries(
      Object.entries(json).filter(
        ([key]) =>
          ![
            "schemaVersion",
            "tool",
            "status",
            "input",
            "uncertainty",
            "pricing",
            "index",
            "sensitivity",
            "factorModel",
            "conventions",
          ].includes(key),
      ),
    );
    // Without uncertainty the CAPM fits carry hac: null (the HAC part is tested with uncertainty below).
    const capmWithoutHac = { low: { ...capm.low, hac: null }, high: { ...capm.high, hac: null }, hac: null };
    expectSameValues(solutionPart, { observations, weight, moments, capm: capmWithoutHac, bounds, grid, landmarks, diagnostics });
  });

  test("the top level has exactly the contract's fields, in order", () => {
    expect(Object.keys(parse(typicalSolution()))).toEqual([
      "schemaVersion",
      "tool",
      "status",
      "input",
      "observations",
      "weight",
      "moments",
      "capm",
      "bounds",
      "grid",
      "landmarks",
      "diagnostics",
      "uncertainty",
      "pricing",
      "index",
      "sensitivity",
      "factorModel",
      "conventions",
    ]);
    // The extensions are null unless asked for (--index, --noise-correlation).
    expect(parse(typicalSolution())).toMatchObject({ index: null, sensitivity: null, factorModel: null });
  });

  test("schemaVersion, tool and input are written as given", () => {
    const json = parse(typicalSolution());
    expect(json.schemaVersion).toBe(2);
    expect(json.tool).toEqual({ name: "betabound", version: "0.1.0-test" });
    expect(json.input).toEqual({ ...input, rowsRead: typicalSolution().observations + input.rowsDropped });
  });

  test("conventions state units, divisor, excess basis, weight and the assumptions", () => {
    const solution = solvedFixtures().negativePremium!;
    const conventions = parse(solution, { riskFree: { kind: "column", column: "RF" } }).conventions as Record<string, unknown>;
    expect(conventions.units).toBe("decimal, per period");
    expect(conventions.divisor).toBe("n - 1");
    expect(conventions.excessReturns).toContain('"RF"');
    expect(conventions.marketProxyWeight).toBe(solution.weight);
    expect(conventions.assumptions).toEqual([...modelAssumptions]);
    const none = parse(solution, { riskFree: { kind: "none" } }).conventions as Record<string, unknown>;
    expect(none.excessReturns).toMatch(/raw returns/);
  });

  test("a rejected model has bounds null, an empty grid, landmarks null and the error diagnostic", () => {
    const json = parse(rejectedSolution());
    expect(json.bounds).toBeNull();
    expect(json.grid).toEqual([]);
    expect(json.landmarks).toBeNull();
    const diagnostics = json.diagnostics as { code: string; severity: string; detail: { code: string } }[];
    expect(diagnostics).toHaveLength(1);
    expect(diagnostics[0]).toMatchObject({ code: "nonpositive-covariance", severity: "error", detail: { code: "nonpositive-covariance" } });
    expect(at(json, "moments.covariance.lowHigh")).toBeLessThan(0);
  });

  test("output is pretty-printed with 2 spaces and ends with one newline", () => {
    const text = renderJson(reportOf(typicalSolution()), plain);
    expect(text.startsWith('{\n  "schemaVersion": 2,\n')).toBe(true);
    expect(text.endsWith("}\n")).toBe(true);
    expect(text.endsWith("\n\n")).toBe(false);
  });

  test("output is deterministic and independent of the input object's key order", () => {
    const solution = typicalSolution();
    const shuffled = Object.fromEntries(Object.entries(reportOf(solution).input).reverse()) as typeof input;
    const first = renderJson(reportOf(solution), plain);
    expect(renderJson(reportOf(typicalSolution()), plain)).toBe(first);
    expect(renderJson({ ...reportOf(solution), input: shuffled }, { colour: true })).toBe(first);
  });

  test("a NaN or an infinity anywhere is refused, naming its path, instead of being written as null", () => {
    const solution = typicalSolution();
    const broken = { ...solution, moments: { ...solution.moments, low: { ...solution.moments.low, mean: Number.NaN } } };
    expect(() => renderJson(reportOf(broken), plain)).toThrow(/\$\.moments\.low\.mean is NaN/);
    const infinite = { ...solution, grid: [{ ...solution.grid[0]!, factorVariance: Infinity }] };
    expect(() => renderJson(reportOf(infinite), plain)).toThrow(/\$\.grid\[0\]\.factorVariance is Infinity/);
    expect(() => assertJsonSafe({ a: [1, undefined] })).toThrow(/\$\.a\[1\] is a undefined/);
    expect(() => assertJsonSafe({ a: [1, null, "x", true, { b: -0 }] })).not.toThrow();
    // The first bad value in document order, with the full path below a given root.
    expect(() => assertJsonSafe({ a: [{}, { b: [0, -Infinity] }], c: Number.NaN })).toThrow(
      /^renderJson: \$\.a\[1\]\.b\[1\] is -Infinity; /,
    );
    expect(() => assertJsonSafe([{ f: () => 1 }], "$.pairs")).toThrow(
      /^renderJson: \$\.pairs\[0\]\.f is a function, which JSON cannot represent$/,
    );
    expect(() => assertJsonSafe(10n)).toThrow(/^renderJson: \$ is a bigint/);
    // A hole in a sparse array is not a value (JSON.stringify writes null); an undefined element is.
    // biome-ignore lint/suspicious/noSparseArray: the hole is the case
    expect(() => assertJsonSafe({ a: [1, , 2] })).not.toThrow();
    expect(() => assertJsonSafe({ a: [1, undefined, 2] })).toThrow(/\$\.a\[1\] is a undefined/);
  });

  test("no NaN, Infinity or undefined text appears in any fixture's output", () => {
    for (const solution of [...Object.values(solvedFixtures()), rejectedSolution()]) {
      expect(renderJson(reportOf(solution), plain)).not.toMatch(/NaN|Infinity|undefined/);
    }
  });
});
