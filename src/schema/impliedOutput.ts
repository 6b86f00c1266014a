/**
 * Zod schema of `implied --format json`: the population view of a structure, with solve's field names.
 * Shared parts are used as they are: `doc()` on a shared schema would overwrite its metadata everywhere.
 */

import * as z from "zod";
import { boundsSchema, candidateSchema, diagnosticSchema, landmarksSchema, momentsSchema } from "./parts.js";
import type { Document } from "./document.js";
import { doc } from "./registry.js";
import { toolSchema } from "./solveOutput.js";

const populationFitSchema = z.strictObject({
  alpha: doc(z.number(), "expected CAPM alpha (b - beta) lambda when only the factor is priced"),
  beta: z.number(),
  rSquared: z.number(),
  residualVariance: z.number(),
});

export const impliedOutputSchema = doc(
  z.strictObject({
    schemaVersion: z.literal(3),
    tool: toolSchema,
    command: z.literal("implied"),
    structure: z.strictObject({
      lowBeta: z.number(),
      weight: z.number().gt(0).lt(1),
      factorVol: z.number(),
      factorMean: z.number(),
      lowNoiseVol: z.number(),
      highNoiseVol: z.number(),
    }),
    riskFree: doc(z.number(), "risk-free return per period"),
    expectedReturns: doc(
      z.strictObject({ low: z.number(), high: z.number(), market: z.number() }),
      "expected raw returns per period: rf + b * factorMean",
    ),
    truth: candidateSchema,
    weight: z.number().gt(0).lt(1),
    moments: momentsSchema,
    capm: z.strictObject({ low: populationFitSchema, high: populationFitSchema }),
    bounds: boundsSchema.nullable(),
    grid: z.array(candidateSchema),
    landmarks: landmarksSchema.nullable(),
    diagnostics: z.array(diagnosticSchema),
    conventions: z.strictObject({
      units: z.literal("decimal, per period"),
      moments: z.literal("population (no sampling error)"),
      marketProxy: z.literal("M = w low + (1 - w) high"),
      marketProxyWeight: z.number(),
      normalisation: z.literal("w b_low + (1 - w) b_high = 1"),
      assumptions: z.array(z.string()),
    }),
  }),
  "betabound implied output",
);

/** The JSON document of `implied --format json`. */
export type ImpliedOutputJson = Document<z.output<typeof impliedOutputSchema>>;
