/** Zod schemas of the uncertainty parts of the solve output: HAC, bound standard errors, intervals, bootstrap. */

import * as z from "zod";
import { bootstrapQuantities } from "../core/inference/bootstrap/statistics.js";
import { automaticBandwidths, hacKernels, intervalMethods, intervalSources, longRunMethods } from "../core/inference/options.js";
import { doc } from "./registry.js";

export const capmHacSchema = doc(
  z.strictObject({ alphaStdErr: z.number().nonnegative(), betaStdErr: z.number().nonnegative() }),
  "HAC standard errors of the CAPM alpha and beta",
  "CapmHac",
);

export const hacSettingsSchema = doc(
  z.strictObject({
    lags: doc(z.int().nonnegative().nullable(), "Bartlett lag truncation; null for other kernels"),
    kernel: z.enum(hacKernels),
    bandwidth: z.number().nonnegative(),
    prewhite: z.boolean(),
    adjust: doc(z.boolean(), "small-sample factor T/(T - k) applied"),
  }),
  "settings of the CAPM HAC covariances (the same for both books)",
  "HacSettings",
);

export const pointwiseSchema = doc(
  z.strictObject({ estimate: z.number(), stdError: z.number().nonnegative(), lower: z.number(), upper: z.number() }),
  "a bound of the identified set with its standard error and pointwise confidence limits",
  "PointwiseBound",
);

export const betaIntervalSchema = doc(
  z.strictObject({
    interval: z.strictObject({
      lower: z.number(),
      upper: z.number(),
      method: z.enum(intervalMethods),
      criticalValue: z.strictObject({ lower: z.number(), upper: z.number() }),
    }),
  }),
  "confidence interval that covers the true structural beta (a point of the set) with the stated probability",
  "BetaInterval",
);

const sharpeSchema = doc(
  z.strictObject({
    estimate: z.number(),
    iidStdErr: doc(z.number().nonnegative(), "iid normal returns (Lo 2002)"),
    mertensStdErr: doc(z.number().nonnegative(), "iid returns with the sample's skewness and kurtosis (Mertens 2002)"),
    hacStdErr: z.number().nonnegative(),
  }),
  "per-period Sharpe ratio of the excess returns with Lo (2002) iid and HAC standard errors",
  "SharpeRatio",
);

const byQuantity = <T extends z.ZodType>(schema: T) =>
  z.strictObject(Object.fromEntries(bootstrapQuantities.map((q) => [q, schema])) as Record<(typeof bootstrapQuantities)[number], T>);

const bootstrapSchema = doc(
  z.strictObject({
    replicates: z.int().positive(),
    blockLength: doc(z.number().gte(1), "mean block length of the stationary bootstrap"),
    seed: z.int().nonnegative(),
    confidence: z.number().gt(0).lt(1),
    intervals: byQuantity(z.strictObject({ lower: z.number(), upper: z.number() }).nullable()),
    stdErrors: byQuantity(z.number().nullable()),
    validReplicates: byQuantity(z.int().nonnegative()),
    boundsCorrelation: z.number().nullable(),
  }),
  "stationary bootstrap (Politis-Romano) percentile intervals and standard errors",
  "Bootstrap",
);

export const uncertaintySchema = doc(
  z.strictObject({
    confidence: z.number().gt(0).lt(1),
    method: z.strictObject({
      longRun: z.enum(longRunMethods),
      kernel: z.enum(hacKernels).nullable(),
      bandwidth: z.number().nullable(),
      lags: z.int().nonnegative().nullable(),
      intervalSource: z.enum(intervalSources),
    }),
    bounds: z
      .strictObject({
        lowBeta: z.strictObject({ min: pointwiseSchema, max: pointwiseSchema }),
        highBeta: z.strictObject({ min: pointwiseSchema, max: pointwiseSchema }),
        correlation: z.number(),
      })
      .nullable(),
    lowBeta: betaIntervalSchema.nullable(),
    highBeta: betaIntervalSchema.nullable(),
    sharpe: z.strictObject({ low: sharpeSchema, high: sharpeSchema, market: sharpeSchema }),
    bootstrap: bootstrapSchema.nullable(),
  }),
  "sampling uncertainty of the headline numbers; null when not computed",
  "Uncertainty",
);

export { automaticBandwidths };
