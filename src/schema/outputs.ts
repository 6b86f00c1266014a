/** Every machine-readable output, by the name `betabound schema NAME` prints it under. */

import * as z from "zod";
import { impliedOutputSchema } from "./impliedOutput.js";
import { outputNames } from "./outputNames.js";
import { outputRegistry } from "./registry.js";
import { rollRecordSchema } from "./rollOutput.js";
import { solveOutputSchema, solveRecordSchema } from "./solveOutput.js";

export const outputSchemas = {
  solve: solveOutputSchema,
  "solve-record": solveRecordSchema,
  implied: impliedOutputSchema,
  "roll-record": rollRecordSchema,
} as const satisfies Record<(typeof outputNames)[number], z.ZodType>; // the names the CLI lists (outputNames.ts, zod-free)

export type OutputName = (typeof outputNames)[number];
export { outputNames };

/** The JSON Schema (draft 2020-12) generated from the zod schema of `name`. A fresh object per call. */
export function outputJsonSchema(name: OutputName): Record<string, unknown> {
  return z.toJSONSchema(outputSchemas[name], { target: "draft-2020-12", metadata: outputRegistry, io: "output" });
}
