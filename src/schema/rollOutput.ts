/** Zod schema of one `roll --format jsonl` record: solve's field names per window, plus the window. */

import * as z from "zod";
import { windowAlignments } from "../core/rolling/index.js";
import { unitChoices } from "../input/index.js";
import { boundsSchema, diagnosticSchema, landmarksSchema, momentsSchema } from "./parts.js";
import type { Document } from "./document.js";
import { doc } from "./registry.js";
import { riskFreeSchema, solveFailureSchema, toolSchema } from "./solveOutput.js";
import { betaIntervalSchema, pointwiseSchema } from "./uncertainty.js";

const capmLineSchema = z.strictObject({
  alpha: z.number(),
  beta: z.number(),
  alphaStdErr: z.number().nonnegative(),
  betaStdErr: z.number().nonnegative(),
  rSquared: z.number(),
  residualVariance: z.number().nonnegative(),
});

export const rollOutputSchema = doc(
  z.strictObject({
    schemaVersion: z.literal(3),
    tool: toolSchema,
    command: z.literal("roll"),
    status: z.enum(["ok", "rejected"]),
    input: z.strictObject({
      source: z.string(),
      lowColumn: z.string(),
      highColumn: z.string(),
      dateColumn: z.string(),
      riskFree: riskFreeSchema,
      units: z.enum(unitChoices),
      frequency: z.strictObject({ name: z.string(), periodsPerYear: z.number().positive() }).nullable(),
    }),
    window: z.discriminatedUnion("kind", [
      z.strictObject({
        kind: z.literal("window"),
        size: z.int().min(3),
        step: z.int().positive(),
        align: doc(z.enum(windowAlignments), "end: the newest window ends on the last row; start: the first starts on row 0"),
      }),
      z.strictObject({
        kind: z.literal("expanding"),
        minPeriods: z.int().min(3),
        step: z.int().positive(),
        align: z.enum(windowAlignments),
      }),
    ]),
    start: doc(z.string(), "first date of the window"),
    end: doc(z.string(), "last date of the window"),
    observations: z.int().positive(),
    weight: z.number().gt(0).lt(1),
    moments: momentsSchema,
    capm: z.strictObject({ low: capmLineSchema, high: capmLineSchema }).nullable(),
    bounds: boundsSchema.nullable(),
    landmarks: landmarksSchema.nullable(),
    diagnostics: z.array(diagnosticSchema),
    uncertainty: z
      .strictObject({
        confidence: z.number().gt(0).lt(1),
        bounds: z.strictObject({
          lowBeta: z.strictObject({ min: pointwiseSchema, max: pointwiseSchema }),
          highBeta: z.strictObject({ min: pointwiseSchema, max: pointwiseSchema }),
          correlation: z.number(),
        }),
        lowBeta: betaIntervalSchema,
        pricing: doc(
          z
            .strictObject({
              returnImpliedLowBeta: z.strictObject({
                estimate: z.number().nullable(),
                stdError: z.number().nonnegative().nullable(),
                lower: doc(z.number().nullable(), "Fieller's lower limit; null when the set is unbounded"),
                upper: z.number().nullable(),
                bounded: doc(z.boolean(), "false: the market mean is not distinguishable from 0 in this window"),
              }),
              pValue: doc(z.number().min(0).max(1).nullable(), "p-value of 'noise explains the alpha' (methods §30)"),
              explainedPValue: z.number().min(0).max(1).nullable(),
              verdict: z.enum(["explained", "not explained", "undetermined"]).nullable(),
            })
            .nullable(),
          "the window's pricing test, as solve's pricing section",
        ),
      })
      .nullable(),
  }),
  "betabound roll record (one window)",
);

/** One line of `roll --format jsonl`: a window record or a failure record for a pair. */
export const rollRecordSchema = z.union([rollOutputSchema, solveFailureSchema]);

/** One `roll --format jsonl` record of a window. */
export type RollOutputJson = Document<z.output<typeof rollOutputSchema>>;
