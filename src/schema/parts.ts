/**
 * Zod schemas of the Solution parts of the JSON output (moments, CAPM fits, the identified set,
 * candidates, landmarks, diagnostics). Strict objects: an unknown field is an error, so a change of
 * the core's types shows up as a failing schema test rather than as a silent contract change.
 */

import * as z from "zod";
import { doc } from "./registry.js";

const num = (description: string) => doc(z.number(), description);
const maybeNum = (description: string) => doc(z.number().nullable(), description);

export const seriesMomentsSchema = doc(
  z.strictObject({
    mean: num("arithmetic mean per period"),
    variance: num("sample variance, divisor n - 1"),
    stdev: num("square root of the variance"),
    sharpeRatio: maybeNum("mean / stdev per period; null when stdev is 0"),
  }),
  "moments of one excess-return series",
  "SeriesMoments",
);

const pairSchema = (what: string) =>
  z.strictObject({
    lowHigh: num(`${what} of low and high`),
    lowMarket: num(`${what} of low and the market proxy`),
    highMarket: num(`${what} of high and the market proxy`),
  });

export const momentsSchema = z.strictObject({
  low: seriesMomentsSchema,
  high: seriesMomentsSchema,
  market: seriesMomentsSchema,
  covariance: pairSchema("covariance (divisor n - 1)"),
  correlation: z.strictObject({
    lowHigh: maybeNum("correlation of low and high; null when either is constant (a rolling window)"),
    lowMarket: maybeNum("correlation of low and the market proxy; null when either is constant"),
    highMarket: maybeNum("correlation of high and the market proxy; null when either is constant"),
  }),
});

export const lineFitSchema = doc(
  z.strictObject({
    observations: z.int().positive(),
    alpha: num("intercept"),
    beta: num("slope on the market proxy"),
    alphaStdErr: num("classical standard error of alpha"),
    betaStdErr: num("classical standard error of beta"),
    alphaTStat: maybeNum("alpha / alphaStdErr; null when the standard error is 0"),
    betaTStat: maybeNum("beta / betaStdErr; null when the standard error is 0"),
    alphaPValue: maybeNum("two-sided p-value, Student's t with n - 2 degrees of freedom"),
    betaPValue: maybeNum("two-sided p-value, Student's t with n - 2 degrees of freedom"),
    rSquared: num("1 - SSR / Syy"),
    residualVariance: num("SSR / (n - 1)"),
    residualStdError: num("sqrt(SSR / (n - 2))"),
    residualSumOfSquares: num("SSR"),
  }),
  "least-squares fit of book = alpha + beta M + error",
  "LineFit",
);

export const intervalSchema = doc(z.strictObject({ min: z.number(), max: z.number() }), "closed interval", "Interval");

export const boundsSchema = doc(
  z.strictObject({ lowBeta: intervalSchema, highBeta: intervalSchema, factorVariance: intervalSchema }),
  "the identified set; null when the model is rejected",
  "IdentifiedBounds",
);

export const candidateSchema = doc(
  z.strictObject({
    lowBeta: num("structural beta of the low book"),
    highBeta: num("structural beta of the high book, (1 - w lowBeta) / (1 - w)"),
    factorVariance: num("variance of the latent factor"),
    lowNoiseVariance: num("noise variance of the low book"),
    highNoiseVariance: num("noise variance of the high book"),
    noiseShare: maybeNum("low noise / (low noise + high noise); null when both are 0"),
    lowFactorRSquared: num("share of the low book's variance the factor explains"),
    highFactorRSquared: num("share of the high book's variance the factor explains"),
    impliedCapm: z.strictObject({
      lowBeta: z.number(),
      highBeta: z.number(),
      lowResidualVariance: z.number(),
      highResidualVariance: z.number(),
    }),
    expectedLowAlpha: num("CAPM alpha this structure expects if only the factor is priced"),
    expectedHighAlpha: num("CAPM alpha this structure expects if only the factor is priced"),
    impliedLowSharpe: maybeNum("Sharpe ratio if only the factor is priced; null when the variance is 0"),
    impliedHighSharpe: maybeNum("Sharpe ratio if only the factor is priced; null when the variance is 0"),
    insideSet: doc(z.boolean(), "both noise variances are non-negative"),
  }),
  "one structure consistent with the sample moments",
  "Candidate",
);

export const landmarksSchema = doc(
  z.strictObject({
    lowNoiseFree: candidateSchema,
    highNoiseFree: candidateSchema,
    equalNoise: candidateSchema,
    capmConsistent: candidateSchema,
    returnImplied: candidateSchema.nullable(),
  }),
  "named points of the identified set; null when the model is rejected",
  "Landmarks",
);

export const diagnosticDetailSchema = z.discriminatedUnion("code", [
  z.strictObject({ code: z.literal("too-few-observations"), observations: z.int(), minimum: z.int() }),
  z.strictObject({ code: z.literal("zero-variance"), series: z.enum(["low", "high", "market", "x"]) }),
  z.strictObject({ code: z.literal("nonpositive-covariance"), covariance: z.number(), correlation: z.number() }),
  z.strictObject({ code: z.literal("perfect-correlation"), correlation: z.number() }),
  z.strictObject({ code: z.literal("low-beta-above-one"), upperBound: z.number() }),
  z.strictObject({ code: z.literal("books-swapped"), lowerBound: z.number(), upperBound: z.number() }),
  z.strictObject({ code: z.literal("market-mean-near-zero"), marketMean: z.number(), tStat: z.number(), criticalValue: z.number() }),
  z.strictObject({
    code: z.literal("return-implied-outside-set"),
    lowBeta: z.number(),
    min: z.number(),
    max: z.number(),
    pValue: z.number(),
    confidence: z.number(),
  }),
  z.strictObject({
    code: z.literal("return-implied-outside-not-significant"),
    lowBeta: z.number(),
    min: z.number(),
    max: z.number(),
    pValue: z.number().nullable(),
    confidence: z.number().nullable(),
  }),
  z.strictObject({ code: z.literal("degenerate-moments"), quantity: z.string() }),
  z.strictObject({ code: z.literal("uncertainty-unavailable"), observations: z.int(), minimum: z.int() }),
  z.strictObject({
    code: z.literal("cancellation"),
    quantity: z.enum(["low", "high", "market", "covariance"]),
    value: z.number(),
    roundingError: z.number(),
  }),
  z.strictObject({
    code: z.literal("magnitude-out-of-range"),
    series: z.enum(["low", "high"]),
    largest: z.number(),
    other: z.number().nullable(),
  }),
  // The library's checks of its arguments (never in an output of the command line, whose inputs are checked before).
  z.strictObject({ code: z.literal("invalid-number"), argument: z.string(), index: z.int(), value: z.string() }),
  z.strictObject({ code: z.literal("length-mismatch"), argument: z.string(), length: z.int(), expected: z.int() }),
  z.strictObject({ code: z.literal("invalid-argument"), argument: z.string(), value: z.string(), expected: z.string() }),
  // The model with an index and the correlated-noise sensitivity (index and sensitivity entries).
  z.strictObject({ code: z.literal("index-constant"), variance: z.number() }),
  z.strictObject({ code: z.literal("index-out-of-range"), largest: z.number() }),
  z.strictObject({
    code: z.literal("index-not-identified"),
    quantity: z.enum(["lowHigh", "lowIndex", "highIndex", "marketIndex"]),
    value: z.number(),
  }),
  z.strictObject({ code: z.literal("index-sign-condition"), lowHigh: z.number(), lowIndex: z.number(), highIndex: z.number() }),
  z.strictObject({ code: z.literal("index-heywood"), series: z.enum(["low", "high", "index"]), noiseVariance: z.number() }),
  z.strictObject({ code: z.literal("noise-correlation-not-an-interval"), noiseCorrelation: z.number(), correlation: z.number() }),
  z.strictObject({ code: z.literal("noise-correlation-no-set"), noiseCorrelation: z.number() }),
  // The k-portfolio factor model.
  z.strictObject({ code: z.literal("factor-too-few-portfolios"), count: z.int(), minimum: z.int() }),
  z.strictObject({ code: z.literal("factor-constant"), portfolio: z.string() }),
  z.strictObject({ code: z.literal("factor-singular-covariance"), observations: z.int(), portfolios: z.int() }),
  z.strictObject({ code: z.literal("factor-not-normalisable"), marketLoading: z.number() }),
  z.strictObject({ code: z.literal("factor-not-converged"), iterations: z.int() }),
  z.strictObject({ code: z.literal("factor-heywood"), portfolio: z.string(), noiseVariance: z.number() }),
  // Reading warnings (src/input/warningDiagnostics.ts): the file was read, but something in it needs a look.
  z.strictObject({ code: z.literal("skipped-lines"), source: z.string(), line: z.int(), count: z.int() }),
  z.strictObject({ code: z.literal("other-blocks"), source: z.string(), used: z.int(), blocks: z.int() }),
  z.strictObject({ code: z.literal("looks-like-percent"), source: z.string(), column: z.string(), medianAbs: z.number() }),
  z.strictObject({ code: z.literal("looks-like-decimal"), source: z.string(), column: z.string(), medianAbs: z.number() }),
]);

export const diagnosticCodes = diagnosticDetailSchema.options.map((option) => option.shape.code.value);

export const diagnosticSchema = doc(
  z
    .strictObject({
      code: z.enum(diagnosticCodes as [(typeof diagnosticCodes)[number], ...(typeof diagnosticCodes)[number][]]),
      severity: doc(z.enum(["error", "warning", "info"]), "error: no result; warning: needs attention; info: a fact"),
      message: z.string(),
      detail: diagnosticDetailSchema,
    })
    .refine((d) => d.code === d.detail.code, { message: "code and detail.code differ", path: ["detail", "code"] }),
  "something the core found about the sample, or a warning from reading the file; the code is stable, the message is for people",
  "Diagnostic",
);
