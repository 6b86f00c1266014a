import { describe, expect, test } from "vitest";
import { implied } from "../../src/core/forward/implied.js";
import { run } from "../../src/cli/program.js";
import { impliedOutput } from "../../src/report/impliedReport.js";
import { impliedOutputSchema } from "../../src/schema/impliedOutput.js";
import { outputJsonSchema, outputNames } from "../../src/schema/outputs.js";
import { fakeIo } from "../cli/fakeIo.js";
import { validate } from "./miniValidator.js";

const structure = { lowBeta: 0.72, weight: 0.5, factorVol: 0.045, factorMean: 0.006, lowNoiseVol: 0.014, highNoiseVol: 0.022 };

describe("output schemas", () => {
  test.each(outputNames)("the JSON Schema of %s matches its committed snapshot (a change is a contract change)", async (name) => {
    await expect(`${JSON.stringify(outputJsonSchema(name), null, 2)}\n`).toMatchFileSnapshot(`./__snapshots__/${name}.schema.json`);
  });

  test("implied JSON validates against its zod schema and its generated JSON Schema", () => {
    const computed = implied(structure, 5);
    if (!computed.ok) throw new Error(computed.issues[0]?.message);
    const output = JSON.parse(JSON.stringify(impliedOutput({ tool: { name: "betabound", version: "test" }, solution: computed.value })));
    expect(impliedOutputSchema.safeParse(output).success).toBe(true);
    expect(validate(outputJsonSchema("implied"), output)).toEqual([]);
    const broken = { ...output, truth: { ...output.truth, lowBeta: "0.72" } };
    expect(impliedOutputSchema.safeParse(broken).success).toBe(false);
  });

  test("betabound schema prints the same JSON Schema, and refuses an unknown name", async () => {
    const ok = fakeIo();
    expect(await run(["schema", "solve-record"], ok.io)).toBe(0);
    expect(JSON.parse(ok.stdout())).toEqual(outputJsonSchema("solve-record"));
    const bad = fakeIo();
    expect(await run(["schema", "solv"], bad.io)).toBe(1);
    expect(bad.stderr()).toContain("Allowed choices are solve, solve-record, implied, roll-record");
  });
});
