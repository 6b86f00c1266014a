import { parse } from "csv-parse/sync";
import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { solve } from "../../src/core/solve.js";
import { landmarkNames, type Candidate, type Solution } from "../../src/core/types.js";
import { candidateColumns, csvField, csvHeader, exactNumber, renderCsv } from "../../src/report/csv.js";
import { rejectedSolution, reportOf, solvedFixtures, typicalSolution, zeroMeanSolution } from "./fixtures.js";

const plain = { colour: false };
const records = (text: string): string[][] => parse(text, { relaxColumnCount: false }) as string[][];

/** The candidate's fields flattened as the CSV names them (impliedCapm.lowBeta -> impliedCapmLowBeta). */
function flatten(candidate: Candidate): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(candidate)) {
    if (value !== null && typeof value === "object") {
      for (const [inner, x] of Object.entries(value)) out[key + inner[0]!.toUpperCase() + inner.slice(1)] = x;
    } else {
      out[key] = value;
    }
  }
  return out;
}

/** The structures the CSV should hold, in order, with their point names. */
function expectedRows(solution: Solution): [string, Candidate][] {
  const rows: [string, Candidate][] = solution.grid.map((c, i) => [`grid-${i + 1}`, c]);
  for (const name of landmarkNames) {
    const c = solution.landmarks?.[name];
    if (c) rows.push([name, c]);
  }
  return rows;
}

/** Asserts every cell parses back to the candidate's value bit for bit (Object.is: -0 stays -0). */
function expectExactCells(solution: Solution, text: string): void {
  const [header, ...body] = records(text);
  const wanted = expectedRows(solution);
  expect(body.map((r) => r[0])).toEqual(wanted.map(([point]) => point));
  body.forEach((row, r) => {
    const values = flatten(wanted[r]![1]);
    header!.slice(1).forEach((name, k) => {
      const cell = row[k + 1]!;
      const value = values[name];
      if (value === null) expect(cell, `${row[0]} ${name}`).toBe("");
      else if (typeof value === "boolean") expect(cell, `${row[0]} ${name}`).toBe(String(value));
      else expect(Object.is(Number(cell), value), `${row[0]} ${name}: ${cell} vs ${String(value)}`).toBe(true);
    });
  });
}

describe("renderCsv", () => {
  test("the header is point then every candidate field in camelCase, impliedCapm flattened", () => {
    const candidate = typicalSolution().grid[0]!;
    expect(csvHeader).toEqual(["point", ...Object.keys(flatten(candidate))]);
    expect(csvHeader).toContain("impliedCapmLowResidualVariance");
    expect(renderCsv(reportOf(typicalSolution()), plain).split("\n")[0]).toBe(csvHeader.join(","));
  });

  test("there is one row per grid step, then one per landmark, named in the point column", () => {
    const solution = typicalSolution();
    const points = records(renderCsv(reportOf(solution), plain))
      .slice(1)
      .map((r) => r[0]);
    expect(points).toEqual([...solution.grid.map((_, i) => `grid-${i + 1}`), ...landmarkNames]);
    expect(points).toHaveLength(11 + 5);
  });

  test("a landmark the core did not compute has no row", () => {
    const solution = zeroMeanSolution();
    expect(solution.landmarks?.returnImplied).toBeNull();
    const points = records(renderCsv(reportOf(solution), plain)).map((r) => r[0]);
    expect(points).not.toContain("returnImplied");
    expect(points).toHaveLength(1 + 3 + 4);
  });

  test.each(Object.entries(solvedFixtures()))("numbers parse back to the exact Solution values (%s)", (_, solution) => {
    expectExactCells(solution, renderCsv(reportOf(solution), plain));
  });

  test("null is an empty field and booleans are true/false", () => {
    const csv = renderCsv(reportOf(typicalSolution()), plain);
    const returnImplied = records(csv).find((r) => r[0] === "returnImplied")!;
    expect(returnImplied[csvHeader.indexOf("noiseShare")]).toBe("");
    expect(returnImplied[csvHeader.indexOf("insideSet")]).toBe("false");
  });

  test("with no identified set the output is the header alone", () => {
    expect(renderCsv(reportOf(rejectedSolution()), plain)).toBe(`${csvHeader.join(",")}\n`);
  });

  test("lines end in LF, never CRLF, with one trailing newline", () => {
    const csv = renderCsv(reportOf(typicalSolution()), plain);
    expect(csv).not.toContain("\r");
    expect(csv.endsWith("\n")).toBe(true);
    expect(csv.split("\n").filter((l) => l === "")).toHaveLength(1);
  });

  test("fields are quoted only when RFC 4180 needs it", () => {
    expect(csvField("grid-1")).toBe("grid-1");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
    expect(records(`${csvField('x,"y"')},z\n`)).toEqual([['x,"y"', "z"]]);
  });

  test("exactNumber keeps the sign of zero and refuses non-finite numbers", () => {
    expect(exactNumber(-0)).toBe("-0");
    expect(Object.is(Number(exactNumber(-0)), -0)).toBe(true);
    expect(exactNumber(0.1 + 0.2)).toBe("0.30000000000000004");
    expect(exactNumber(1.2345e-21)).toBe("1.2345e-21");
    expect(() => exactNumber(Number.NaN)).toThrow(RangeError);
    expect(() => exactNumber(-Infinity)).toThrow(RangeError);
  });

  test("a non-finite number in a candidate is refused, not printed", () => {
    const solution = typicalSolution();
    const broken = { ...solution, grid: [{ ...solution.grid[0]!, factorVariance: Infinity }] };
    expect(() => renderCsv(reportOf(broken), plain)).toThrow(/non-finite number Infinity/);
  });

  test("every column accessor reads the field its name says", () => {
    const candidate = typicalSolution().grid[3]!;
    const values = flatten(candidate);
    for (const [name, value] of candidateColumns) expect(value(candidate), name).toBe(values[name]);
  });
});

describe("invariant: every number printed in the CSV round-trips to the Solution's value bit for bit", () => {
  // Returns on a 0.0001 (one basis point) lattice, as exported series are. Unrestricted doubles reach
  // subnormal-scale variances where the core overflows to Infinity (reported to the core's owner);
  // the renderers refuse such numbers, which the tests of exactNumber and renderCsv check.
  const returns = fc.integer({ min: -5000, max: 5000 }).map((k) => k / 1e4);
  const samples = fc
    .integer({ min: 3, max: 40 })
    .chain((n) =>
      fc.tuple(
        fc.array(fc.tuple(returns, returns), { minLength: n, maxLength: n }),
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        fc.integer({ min: 2, max: 12 }),
      ),
    );

  test("for arbitrary samples, weights and grid sizes", () => {
    let withSet = 0;
    fc.assert(
      fc.property(samples, ([pairs, weight, steps]) => {
        const result = solve({ low: pairs.map((p) => p[0]), high: pairs.map((p) => p[1]) }, { weight, steps });
        if (!result.ok) return;
        const csv = renderCsv(reportOf(result.value), plain);
        if (result.value.bounds === null) expect(csv).toBe(`${csvHeader.join(",")}\n`);
        else {
          expectExactCells(result.value, csv);
          withSet++;
        }
      }),
      { numRuns: 300, seed: 20240601 },
    );
    expect(withSet, "samples with an identified set").toBeGreaterThan(50);
  });

  test("for samples drawn from the one-factor model itself", () => {
    let checked = 0;
    const draw = (bp: number) => fc.integer({ min: -bp, max: bp }).map((k) => k / 1e4);
    const factorSample = fc.array(fc.tuple(draw(1000), draw(200), draw(200)), { minLength: 5, maxLength: 60 });
    fc.assert(
      fc.property(factorSample, (rows) => {
        const result = solve({ low: rows.map(([f, e]) => 0.7 * f + e), high: rows.map(([f, , e]) => 1.3 * f + e) });
        if (!result.ok || result.value.bounds === null) return;
        expectExactCells(result.value, renderCsv(reportOf(result.value), plain));
        checked++;
      }),
      { numRuns: 200, seed: 7 },
    );
    expect(checked, "samples with an identified set").toBeGreaterThan(100);
  });
});
