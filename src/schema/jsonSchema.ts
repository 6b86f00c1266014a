/**
 * The JSON Schema (draft 2020-12) of the solve output, generated from the zod schema so that the two
 * can never disagree.
 */

import { outputJsonSchema } from "./outputs.js";

/** JSON Schema of what `renderJson` writes, with shared parts under $defs. A fresh object per call. */
export function solveOutputJsonSchema(): Record<string, unknown> {
  return outputJsonSchema("solve");
}
