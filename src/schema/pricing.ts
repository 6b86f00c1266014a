/** Zod schema of the pricing section of the solve output: can noise explain the alpha? (docs/methods.md §30) */

import * as z from "zod";
import type { Document } from "./document.js";
import { doc } from "./registry.js";

const alphaFields = {
  observed: doc(z.number(), "the CAPM alpha (intercept of the book on the market proxy)"),
  observedLower: doc(z.number().nullable(), "the observed alpha less z times its HAC standard error; null without standard errors"),
  observedUpper: doc(z.number().nullable(), "the observed alpha plus z times its HAC standard error; null without standard errors"),
  explainableMin: doc(
    z.number(),
    "the least expected alpha of a structure in the identified set, (b - CAPM beta) times the mean market return",
  ),
  explainableMax: doc(z.number(), "the greatest expected alpha of a structure in the identified set"),
  explainableMinStdError: doc(
    z.number().nonnegative().nullable(),
    "delta-method standard error of explainableMin; null without standard errors",
  ),
  explainableMaxStdError: doc(
    z.number().nonnegative().nullable(),
    "delta-method standard error of explainableMax; null without standard errors",
  ),
  unexplained: doc(z.number(), "observed less the nearest explainable alpha: 0 when noise in the betas can explain it"),
};

const alphaSchema = doc(
  z.strictObject({
    ...alphaFields,
    annualised: doc(
      z.strictObject(alphaFields).nullable(),
      "the same figures per year (times the periods per year); null when the frequency is unknown",
    ),
  }),
  "a book's CAPM alpha, the range of alphas noise in the betas can explain, and the rest; per period",
  "AlphaDecomposition",
);

export const pricingSchema = doc(
  z.strictObject({
    excessReturns: doc(
      z.boolean(),
      "true when a risk-free rate was given; false: raw mean returns were used and the test assumes a zero risk-free rate",
    ),
    confidence: z.number(),
    returnImpliedLowBeta: doc(
      z.strictObject({
        estimate: doc(z.number().nullable(), "mean excess low / mean excess market; null when the market mean is exactly 0"),
        stdError: doc(z.number().nonnegative().nullable(), "delta-method (HAC) standard error; null without standard errors"),
        lower: doc(z.number().nullable(), "Fieller's lower limit; null when the set is unbounded or not computed"),
        upper: doc(z.number().nullable(), "Fieller's upper limit; null when the set is unbounded or not computed"),
        shape: doc(
          z.enum(["bounded", "two-rays", "whole-line"]).nullable(),
          "Fieller's set: an interval, everything outside (outsideOf), or every value (the market mean is not distinguishable from 0); null without standard errors",
        ),
        outsideOf: doc(
          z.tuple([z.number(), z.number()]).nullable(),
          "for two-rays: the set is every value at or below the first and at or above the second",
        ),
        method: z.literal("fieller"),
        bootstrapLower: doc(z.number().nullable(), "percentile interval of the replicated ratio, with --bootstrap"),
        bootstrapUpper: z.number().nullable(),
      }),
      "the return-implied low structural beta and its uncertainty",
    ),
    test: doc(
      z
        .strictObject({
          statistic: doc(z.number(), "the smallest studentised violation of the moment inequalities (positive: outside)"),
          pValue: doc(z.number().min(0).max(1), "p-value of H0: some structure in the identified set explains the mean returns"),
          explainedPValue: doc(z.number().min(0).max(1), "p-value of the intersection-union test that noise does explain them"),
          method: z.string(),
          verdict: doc(
            z.enum(["explained", "not explained", "undetermined"]),
            "not explained: pValue below 1 - confidence; explained: explainedPValue below it; else undetermined",
          ),
        })
        .nullable(),
      "the test of 'noise explains the alpha'; null without standard errors or when the statistics have none (an exact fit)",
    ),
    alpha: z.strictObject({ low: alphaSchema, high: alphaSchema }),
  }),
  "can noise in the measured betas explain the CAPM alphas? (methods §30)",
  "Pricing",
);

export type PricingJson = Document<z.output<typeof pricingSchema>>;
