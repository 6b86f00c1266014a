/**
 * Zod schemas of the extensions of solve's output (docs/methods.md §2, §3): `index`, the model with an
 * independent index, and `sensitivity`, the identified set under assumed noise correlations.
 */

import * as z from "zod";
import { diagnosticSchema } from "./parts.js";
import { doc } from "./registry.js";

const value = (description: string) => doc(z.number().nullable(), `${description}; null when not identified (see diagnostics)`);

const indexValuesShape = {
  lowBeta: value("structural beta of the low book, Cov(low, I) / Cov(M, I)"),
  highBeta: value("structural beta of the high book, Cov(high, I) / Cov(M, I)"),
  indexLoading: value("loading of the index on the factor, in index units per unit of the factor"),
  factorVariance: value("variance of the latent factor"),
  lowNoiseVariance: value("noise variance of the low book; negative in a Heywood case, never set to 0"),
  highNoiseVariance: value("noise variance of the high book; negative in a Heywood case, never set to 0"),
  indexNoiseVariance: value("noise variance of the index, in its units squared; negative in a Heywood case"),
};

const stdErrorsSchema = (what: string) =>
  doc(z.strictObject(indexValuesShape), `${what} standard errors of the estimates (same keys)`, undefined).nullable();

export const indexOutputSchema = doc(
  z.strictObject({
    column: doc(z.string(), "the index column"),
    ...indexValuesShape,
    signCondition: doc(z.boolean().nullable(), "Cov(low, high) Cov(low, I) Cov(high, I) > 0, which a one-factor model needs"),
    admissible: doc(z.boolean().nullable(), "the sign condition holds and no noise variance is negative"),
    insideSet: doc(z.boolean().nullable(), "lowBeta lies within the two-book identified set; null when there is no set"),
    stdErrors: stdErrorsSchema("delta-method (long-run covariance as for the bounds);"),
    bootstrapStdErrors: stdErrorsSchema("stationary-bootstrap (with --bootstrap);"),
    diagnostics: z.array(diagnosticSchema),
  }),
  "the model with an independent market index: three indicators of one factor, point identified",
  "IndexModel",
);

const optionalInterval = z.strictObject({ min: z.number().nullable(), max: z.number().nullable() });

export const sensitivityEntrySchema = doc(
  z.strictObject({
    noiseCorrelation: doc(z.number().gte(-1).lte(1), "the assumed correlation of the books' noises"),
    kind: doc(
      z.enum(["unchanged", "wider", "not-an-interval", "no-set"]),
      "unchanged (rho <= 0: the same bounds), wider (0 < rho < corr), not-an-interval (rho >= corr), no-set (no two-book set)",
    ),
    bounds: doc(
      z.strictObject({ lowBeta: optionalInterval, highBeta: optionalInterval }),
      "the set of structural betas; null ends when it is not an interval",
    ),
    diagnostics: z.array(diagnosticSchema),
  }),
  "the identified set when the books' noises have the given correlation",
  "NoiseSensitivity",
);
