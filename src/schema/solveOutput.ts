/**
 * Zod 4 schema of the JSON document `renderJson` writes (schemaVersion 3). This is the contract for
 * anyone reading the output: every object is strict, numbers are finite, absent values are null.
 */

import * as z from "zod";
import { unitChoices } from "../input/index.js";
import { boundsSchema, candidateSchema, diagnosticSchema, landmarksSchema, lineFitSchema, momentsSchema } from "./parts.js";
import type { Document } from "./document.js";
import { indexOutputSchema, sensitivityEntrySchema } from "./models.js";
import { doc } from "./registry.js";
import { pricingSchema } from "./pricing.js";
import { capmHacSchema, hacSettingsSchema, uncertaintySchema } from "./uncertainty.js";

const capmFitSchema = doc(
  z.strictObject({ ...lineFitSchema.shape, hac: capmHacSchema.nullable() }),
  "OLS of a book's excess return on the market's, classical and HAC standard errors",
  "CapmFit",
);

export const capmOutputSchema = z.strictObject({ low: capmFitSchema, high: capmFitSchema, hac: hacSettingsSchema.nullable() });

export const riskFreeSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("none") }),
  z.strictObject({ kind: z.literal("constant"), rate: doc(z.number(), "risk-free return per period, decimal") }),
  z.strictObject({ kind: z.literal("column"), column: z.string() }),
]);

export const inputSchema = doc(
  z.strictObject({
    source: doc(z.string(), 'file name as given, or "<stdin>"'),
    dateColumn: z.string(),
    lowColumn: z.string(),
    highColumn: z.string(),
    riskFree: riskFreeSchema,
    units: doc(z.enum(unitChoices), "units of the file's numbers; the output is always decimal"),
    firstDate: z.string(),
    lastDate: z.string(),
    rowsRead: z.int().nonnegative(),
    rowsDropped: z.int().nonnegative(),
    droppedDates: z.array(z.string()),
    frequency: z.strictObject({ name: z.string(), periodsPerYear: z.number().positive() }).nullable(),
    join: doc(
      z
        .strictObject({
          sides: z.array(
            z.strictObject({ source: z.string(), column: z.string(), dates: z.int().nonnegative(), unmatched: z.int().nonnegative() }),
          ),
          matched: z.int().nonnegative(),
        })
        .nullable(),
      "when low and high came from two files joined on date: each side and how many dates matched",
    ),
  }),
  "where the numbers came from",
  "Input",
);

export const conventionsSchema = z.strictObject({
  units: z.literal("decimal, per period"),
  divisor: z.literal("n - 1"),
  excessReturns: doc(z.string(), "what the returns are in excess of"),
  marketProxy: z.literal("M = w low + (1 - w) high"),
  marketProxyWeight: doc(z.number().gt(0).lt(1), "w, the weight of the low book in the market proxy"),
  normalisation: z.literal("w b_low + (1 - w) b_high = 1"),
  assumptions: doc(z.array(z.string()), "the model's maintained assumptions"),
});

export const toolSchema = z.strictObject({ name: z.literal("betabound"), version: z.string() });

export const solveOutputSchema = doc(
  z.strictObject({
    schemaVersion: z.literal(3),
    tool: toolSchema,
    status: doc(z.enum(["ok", "rejected"]), "rejected: the data were read but no identified set can be reported"),
    input: inputSchema,
    observations: doc(z.int().positive(), "aligned observations used"),
    weight: doc(z.number().gt(0).lt(1), "w, the weight of the low book in the market proxy"),
    moments: doc(momentsSchema, "sample moments of the excess returns, per period"),
    capm: doc(capmOutputSchema, "CAPM regressions of each book on the market proxy, classical and HAC standard errors"),
    bounds: boundsSchema.nullable(),
    grid: doc(z.array(candidateSchema), "candidates evenly spaced in lowBeta over the set; empty when rejected"),
    landmarks: landmarksSchema.nullable(),
    diagnostics: z.array(diagnosticSchema),
    uncertainty: uncertaintySchema.nullable(),
    pricing: pricingSchema.nullable(),
    index: doc(indexOutputSchema.nullable(), "the model with an independent index (--index); null when not asked for"),
    sensitivity: doc(
      z.array(sensitivityEntrySchema).nullable(),
      "the identified set under each assumed noise correlation (--noise-correlation); null when not asked for",
    ),
    conventions: conventionsSchema,
  }),
  "betabound solve output",
);

/** The JSON document of `solve --format json`. */
export type SolveOutputJson = Document<z.output<typeof solveOutputSchema>>;

/** A JSON Lines record for a (file, pair) that could not be solved: what was asked and why it failed. */
export const solveFailureSchema = doc(
  z.strictObject({
    schemaVersion: z.literal(3),
    tool: toolSchema,
    status: z.literal("failed"),
    input: z.strictObject({ source: z.string(), lowColumn: z.string(), highColumn: z.string() }),
    errors: doc(
      z.array(z.strictObject({ code: z.string(), message: z.string() })).min(1),
      "the input issues or diagnostics that stopped this pair; codes are stable",
    ),
  }),
  "betabound solve record for a pair that failed",
);

/** One line of `solve --format jsonl`: a full solve document or a failure record. */
export const solveRecordSchema = z.union([solveOutputSchema, solveFailureSchema]);

/** The JSON record of a (file, pair) that failed. */
export type SolveFailureJson = Document<z.output<typeof solveFailureSchema>>;
