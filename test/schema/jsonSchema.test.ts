import { describe, expect, test } from "vitest";
import type { Solution } from "../../src/core/types.js";
import { renderJson } from "../../src/report/json.js";
import { solveOutputJsonSchema } from "../../src/schema/jsonSchema.js";
import { rejectedSolution, reportOf, solvedFixtures } from "../report/fixtures.js";
import { validate } from "./miniValidator.js";

const rendered = (solution: Solution): unknown => JSON.parse(renderJson(reportOf(solution), { colour: false }));

/** Every object schema (type "object") in the JSON Schema, with its location. */
function objectSchemas(node: unknown, path = "#"): [string, Record<string, unknown>][] {
  if (node === null || typeof node !== "object") return [];
  const here: [string, Record<string, unknown>][] =
    !Array.isArray(node) && (node as Record<string, unknown>).type === "object" ? [[path, node as Record<string, unknown>]] : [];
  return [...here, ...Object.entries(node).flatMap(([key, child]) => objectSchemas(child, `${path}/${key}`))];
}

describe("solveOutputJsonSchema", () => {
  test("matches the committed snapshot (a failing snapshot is a contract change: bump schemaVersion or revert)", async () => {
    await expect(`${JSON.stringify(solveOutputJsonSchema(), null, 2)}\n`).toMatchFileSnapshot("./__snapshots__/solve.schema.json");
  });

  test("is draft 2020-12 with the shared parts under $defs", () => {
    const schema = solveOutputJsonSchema();
    expect(schema.$schema).toBe("https://json-schema.org/draft/2020-12/schema");
    expect(Object.keys(schema.$defs as object).sort()).toEqual(
      [
        "AlphaDecomposition",
        "BetaInterval",
        "Bootstrap",
        "Candidate",
        "CapmFit",
        "CapmHac",
        "Diagnostic",
        "FactorModel",
        "HacSettings",
        "IdentifiedBounds",
        "IndexModel",
        "Input",
        "Interval",
        "Landmarks",
        "NoiseSensitivity",
        "PointwiseBound",
        "Pricing",
        "SeriesMoments",
        "SharpeRatio",
        "Uncertainty",
      ].sort(),
    );
  });

  test("every object is closed and requires all of its properties", () => {
    const objects = objectSchemas(solveOutputJsonSchema());
    expect(objects.length).toBeGreaterThan(15);
    for (const [path, schema] of objects) {
      expect(schema.additionalProperties, path).toBe(false);
      expect([...((schema.required as string[]) ?? [])].sort(), path).toEqual(Object.keys(schema.properties as object).sort());
    }
  });

  test.each([...Object.entries(solvedFixtures()), ["rejected", rejectedSolution()] as const])(
    "the rendered JSON validates against the JSON Schema itself (%s)",
    (_, solution) => {
      expect(validate(solveOutputJsonSchema(), rendered(solution))).toEqual([]);
    },
  );

  test("the JSON Schema rejects what the contract forbids", () => {
    const schema = solveOutputJsonSchema();
    const json = rendered(solvedFixtures().typical!) as Record<string, unknown>;
    expect(validate(schema, { ...json, extra: 1 })).toEqual(["$: unexpected property extra"]);
    expect(validate(schema, { ...json, observations: 1.5 })).toEqual(["$.observations: expected integer, got number"]);
    expect(validate(schema, { ...json, bounds: { lowBeta: null } }).length).toBeGreaterThan(0);
  });

  test("returns a fresh object on every call", () => {
    const first = solveOutputJsonSchema();
    first.$schema = "changed";
    expect(solveOutputJsonSchema().$schema).toBe("https://json-schema.org/draft/2020-12/schema");
  });
});
