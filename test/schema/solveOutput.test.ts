import fc from "fast-check";
import { describe, expect, expectTypeOf, test } from "vitest";
import { solve } from "../../src/core/solve.js";
import type { Solution } from "../../src/core/types.js";
import type * as z from "zod";
import { renderJson, type SolveOutput, toSolveOutput } from "../../src/report/json.js";
import type { Document } from "../../src/schema/document.js";
import { solveOutputSchema, type SolveOutputJson } from "../../src/schema/solveOutput.js";
import { rejectedSolution, reportOf, solvedFixtures } from "../report/fixtures.js";

const rendered = (solution: Solution): unknown => JSON.parse(renderJson(reportOf(solution), { colour: false }));
const fixtures: [string, Solution][] = [...Object.entries(solvedFixtures()), ["rejected", rejectedSolution()]];

describe("solveOutputSchema", () => {
  test("describes exactly the type renderJson produces", () => {
    // The renderer's document type is the schema's output type: toSolveOutput compiles only if every
    // field it builds from the core's values has the schema's type.
    expectTypeOf(toSolveOutput).returns.toEqualTypeOf<SolveOutputJson>();
    expectTypeOf<SolveOutput>().toEqualTypeOf<Document<z.output<typeof solveOutputSchema>>>();
  });

  test.each(fixtures)("validates the rendered JSON of a real solution (%s)", (_, solution) => {
    const result = solveOutputSchema.safeParse(rendered(solution));
    expect(result.error?.issues ?? []).toEqual([]);
  });

  test("validates the rendered JSON for arbitrary samples", () => {
    const returns = fc.integer({ min: -3000, max: 3000 }).map((k) => k / 1e4);
    const sample = fc.array(fc.tuple(returns, returns), { minLength: 3, maxLength: 30 });
    fc.assert(
      fc.property(sample, fc.integer({ min: 2, max: 6 }), (pairs, steps) => {
        const result = solve({ low: pairs.map((p) => p[0]), high: pairs.map((p) => p[1]) }, { steps });
        if (!result.ok) return;
        expect(solveOutputSchema.safeParse(rendered(result.value)).error?.issues ?? []).toEqual([]);
      }),
      { numRuns: 100, seed: 42 },
    );
  });

  const valid = (): Record<string, unknown> => rendered(solvedFixtures().typical!) as Record<string, unknown>;

  test("rejects an unknown field at the top level and inside a candidate", () => {
    expect(solveOutputSchema.safeParse({ ...valid(), extra: 1 }).success).toBe(false);
    const json = valid();
    const grid = json.grid as Record<string, unknown>[];
    grid[0] = { ...grid[0], surprise: true };
    expect(solveOutputSchema.safeParse(json).success).toBe(false);
  });

  test("rejects a missing contract field, a null where a number is required, and another schemaVersion", () => {
    const { weight: _, ...withoutWeight } = valid();
    expect(solveOutputSchema.safeParse(withoutWeight).success).toBe(false);
    const json = valid();
    (json.moments as { low: { mean: unknown } }).low.mean = null;
    expect(solveOutputSchema.safeParse(json).success).toBe(false);
    expect(solveOutputSchema.safeParse({ ...valid(), schemaVersion: 2 }).success).toBe(false);
  });

  test("rejects a diagnostic whose detail has another code", () => {
    const json = valid();
    const diagnostics = json.diagnostics as { code: string }[];
    expect(diagnostics.length).toBeGreaterThan(0);
    diagnostics[0]!.code = "perfect-correlation";
    const result = solveOutputSchema.safeParse(json);
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.message)).toContain("code and detail.code differ");
  });
});
