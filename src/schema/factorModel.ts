/** Zod schema of solve's `factorModel` (docs/methods.md §31): the one-factor model on k portfolios. */

import * as z from "zod";
import { diagnosticSchema } from "./parts.js";
import { doc } from "./registry.js";

const interval = z.strictObject({ min: z.number(), max: z.number() });

export const factorModelSchema = doc(
  z.strictObject({
    observations: doc(z.int(), "rows the model was fitted on"),
    portfolios: z.array(
      z.strictObject({
        name: doc(z.string(), "the column"),
        weight: doc(z.number(), "its weight in the market proxy (the weights given, scaled to sum to 1)"),
        loading: doc(z.number().nullable(), "structural beta b_i, scaled so that the weighted loadings sum to 1; null when not fitted"),
        noiseVariance: doc(z.number().nullable(), "ML noise variance; 0 (a floor of 1e-10 of the series' variance) in a Heywood case"),
        loadingStdError: doc(
          z.number().nullable(),
          "from the inverse information matrix, by the delta method through the scaling; null in a Heywood case",
        ),
        capmBeta: doc(z.number().nullable(), "Cov(r_i, M) / Var(M) with M the weighted sum of the portfolios"),
      }),
    ),
    factorVariance: doc(z.number().nullable(), "variance of the factor on the scale of the loadings"),
    fit: doc(
      z
        .strictObject({
          statistic: doc(z.number(), "Bartlett-corrected likelihood ratio (n - 1 - (2k + 5)/6 - 2/3) F"),
          degreesOfFreedom: doc(z.int(), "k(k + 1)/2 - 2k = k(k - 3)/2"),
          pValue: doc(z.number().nullable(), "chi-square upper tail; null with 0 degrees of freedom (k = 3 fits exactly)"),
        })
        .nullable(),
      "goodness of fit of one factor against an unrestricted covariance; null when not fitted",
    ),
    heywood: doc(z.array(z.string()), "portfolios whose noise variance is at 0 (Heywood cases)"),
    adjacentPairs: z.array(
      z.strictObject({
        low: z.string(),
        high: z.string(),
        weight: doc(z.number(), "the low portfolio's weight in the pair's own market proxy, w_low / (w_low + w_high)"),
        bounds: doc(
          z.strictObject({ lowBeta: interval, highBeta: interval }).nullable(),
          "the pair's two-book identified set; null when its covariance is not positive",
        ),
        factorLowBeta: doc(z.number().nullable(), "the factor model's beta of the low portfolio in the pair's normalisation"),
        factorHighBeta: doc(z.number().nullable(), "the same for the high portfolio"),
        insideSet: doc(z.boolean().nullable(), "factorLowBeta lies within the pair's set"),
      }),
    ),
    diagnostics: z.array(diagnosticSchema),
  }),
  "the one-factor model fitted to k beta-sorted portfolios by maximum likelihood",
  "FactorModel",
);
