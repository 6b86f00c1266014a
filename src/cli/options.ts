/**
 * The options of `solve`: one set of constants feeds commander's choices and defaults, the zod schema
 * that validates the merged options, and the TypeScript types.
 */
import * as z from "zod";
import { frequencies } from "../core/calendar.js";
import { chartYChoices } from "./charts.js";
import { defaultSteps, defaultWeight } from "../core/solve.js";
import {
  automaticBandwidths,
  defaultConfidence,
  defaultHac,
  defaultIntervalMethod,
  defaultIntervalSource,
  defaultLongRun,
  hacKernels,
  intervalMethods,
  intervalSources,
  longRunMethods,
} from "../core/inference/options.js";
import { reportFormats } from "../report/types.js";

export const unitChoices = ["decimal", "percent"] as const;
export type Units = (typeof unitChoices)[number];
export { reportFormats };

export const solveDefaults = {
  weight: defaultWeight,
  steps: defaultSteps,
  format: "text",
  units: "decimal",
} as const satisfies { weight: number; steps: number; format: (typeof reportFormats)[number]; units: Units };

export { automaticBandwidths, hacKernels, intervalMethods, intervalSources, longRunMethods };

/** Uncertainty defaults (the core's) and the CLI's bootstrap settings. */
export const uncertaintyDefaults = {
  confidence: defaultConfidence,
  longRun: defaultLongRun,
  hacKernel: defaultHac.kernel,
  hacBandwidth: defaultHac.bandwidth,
  interval: defaultIntervalMethod,
  intervalSource: defaultIntervalSource,
  /** Replicates when --bootstrap is given without a number. */
  bootstrapReplicates: 2000,
  seed: 1,
} as const;

/** Standard errors need this many observations; with fewer, none are reported. */
export const minimumForUncertainty = 10;

/** Largest grid the CLI accepts: a sanity limit on output size, not a numerical one. */
export const maximumSteps = 100_000;

/** Formats of `solve`: one report (text, json, csv) or one record per line for several pairs (jsonl). */
export const solveFormats = [...reportFormats, "jsonl"] as const;
export const inputKinds = ["returns", "prices", "log-returns"] as const;
export const missingPolicies = ["drop", "error"] as const;

/**
 * A value built on first use. The schemas below are built only for the command that runs: building
 * every command's schemas up front costs start-up time on every run.
 */
export function once<T>(build: () => T): () => T {
  let value: T | undefined;
  return () => (value ??= build());
}

/** Options shared by every command that reads return files: which books, and how to read them. */
export const inputOptionsShape = once(() => ({
  low: z.string().min(1).optional(),
  high: z.string().min(1).optional(),
  pair: z.array(z.object({ low: z.string().min(1), high: z.string().min(1) }).strict()).optional(),
  lows: z.array(z.string().min(1)).optional(),
  highs: z.array(z.string().min(1)).optional(),
  date: z.string().min(1).optional(),
  weight: z.number().gt(0).lt(1),
  rf: z.string().min(1).optional(),
  units: z.enum(unitChoices),
  output: z.string().min(1).optional(),
  allowExtreme: z.boolean(),
  delimiter: z.string().length(1).optional(),
  block: z.number().int().positive().optional(),
  dateFormat: z.string().min(1).optional(),
  sort: z.boolean(),
  periodsPerYear: z.number().positive().optional(),
  missing: z.array(z.string().min(1)).optional(),
  onMissing: z.enum(missingPolicies),
  input: z.enum(inputKinds),
  idColumn: z.string().min(1).optional(),
  valueColumn: z.string().min(1).optional(),
  decimalComma: z.boolean(),
}));

/** The input options after validation (what the pair loader needs). */
export type InputCliOptions = z.infer<z.ZodObject<ReturnType<typeof inputOptionsShape>>>;

/** Cross-field rules of the input options, for any schema that spreads inputOptionsShape. */
export function refineInputOptions<T extends z.ZodType<InputCliOptions>>(schema: T) {
  return schema
    .refine((o) => (o.low === undefined) === (o.high === undefined), {
      path: ["high"],
      message: "--low and --high go together (or use --pair LOW:HIGH)",
    })
    .refine((o) => (o.lows === undefined) === (o.highs === undefined), { path: ["highs"], message: "--lows and --highs go together" })
    .refine((o) => o.low !== undefined || (o.pair?.length ?? 0) > 0 || o.lows !== undefined, {
      path: ["low"],
      message: "name the books: --low COLUMN --high COLUMN, or --pair LOW:HIGH, or --lows A,B --highs X,Y",
    })
    .refine((o) => (o.idColumn === undefined) === (o.valueColumn === undefined), {
      path: ["valueColumn"],
      message: "the long layout needs both --id-column and --value-column",
    });
}

export const solveOptionsSchema = once(() => refineInputOptions(
  z
    .object({
      ...inputOptionsShape(),
      steps: z.number().int().min(2).max(maximumSteps),
      format: z.enum(solveFormats),
      uncertainty: z.boolean(),
      confidence: z.number().gt(0).lt(1),
      longRun: z.enum(longRunMethods),
      hacKernel: z.enum(hacKernels),
      hacBandwidth: z.enum(automaticBandwidths),
      hacLags: z.number().int().nonnegative().optional(),
      hacPrewhite: z.boolean(),
      hacAdjust: z.boolean(),
      interval: z.enum(intervalMethods),
      intervalSource: z.enum(intervalSources),
      bootstrap: z.number().int().nonnegative(),
      blockLength: z.union([z.literal("auto"), z.number().gte(1)]),
      seed: z.number().int().nonnegative(),
      threads: z.number().int().positive(),
      chart: z.string().min(1).optional(),
      chartY: z.enum(chartYChoices),
      report: z.string().min(1).optional(),
    })
    .strict(),
).refine((o) => o.intervalSource !== "bootstrap" || o.bootstrap >= 2, {
  path: ["intervalSource"],
  message: "bootstrap standard errors need --bootstrap with at least 2 replicates",
}));

export type SolveCliOptions = z.infer<ReturnType<typeof solveOptionsSchema>>;

export const simulateFormats = ["csv", "jsonl"] as const;

/** A structure given on the command line (simulate, implied): per period, decimal. */
const structureShape = once(() => ({
  lowBeta: z.number().positive(),
  factorVol: z.number().positive(),
  factorMean: z.number(),
  lowNoiseVol: z.number().nonnegative(),
  highNoiseVol: z.number().nonnegative(),
  weight: z.number().gt(0).lt(1),
  rf: z.number(),
}));

/** b_low < 1/w, so that the high book's structural beta is positive. */
const positiveHighBeta: [(o: { lowBeta: number; weight: number }) => boolean, { path: PropertyKey[]; message: string }] = [
  (o) => o.lowBeta < 1 / o.weight,
  { path: ["lowBeta"], message: "must be below 1/w so that the high book's beta is positive" },
];

/** The options of `simulate` after commander's parsing (each number already checked by its argParser). */
export const simulateOptionsSchema = once(() => z
  .object({
    ...structureShape(),
    periods: z.number().int().positive(),
    frequency: z.enum(frequencies),
    start: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date YYYY-MM-DD").refine((s) => !Number.isNaN(Date.parse(s)), "must be a real date"),
    seed: z.number().int().nonnegative(),
    tails: z.number().gt(2).optional(),
    noiseAr: z.number().gt(-1).lt(1).optional(),
    garch: z.object({ alpha: z.number().nonnegative(), beta: z.number().nonnegative() }).optional(),
    names: z.tuple([z.string().min(1), z.string().min(1), z.string().min(1)]),
    digits: z.number().int().min(1).max(17).optional(),
    format: z.enum(simulateFormats),
    output: z.string().min(1).optional(),
  })
  .strict()
  .refine(...positiveHighBeta));

export type SimulateCliOptions = z.infer<ReturnType<typeof simulateOptionsSchema>>;

/** The first zod issue as a CLI usage message: the option in kebab case and what is wrong. */
export function describeOptionIssue(error: z.ZodError): string {
  const issue = error.issues[0];
  const key = String(issue?.path[0] ?? "");
  const flag = key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`);
  return `option '--${flag}' is invalid: ${issue?.message ?? "unknown problem"}`;
}

/** The options of `implied`: a structure (per period, decimal) and the report settings. */
export const impliedOptionsSchema = once(() => z
  .object({
    ...structureShape(),
    steps: z.number().int().min(2).max(maximumSteps),
    format: z.enum(reportFormats),
    output: z.string().min(1).optional(),
  })
  .strict()
  .refine(...positiveHighBeta));

export type ImpliedCliOptions = z.infer<ReturnType<typeof impliedOptionsSchema>>;

export const rollFormats = ["text", "csv", "jsonl"] as const;

/** The options of `roll`: the input options, the windows, and the per-window outputs. */
export const rollOptionsSchema = once(() => refineInputOptions(
  z
    .object({
      ...inputOptionsShape(),
      window: z.number().int().min(3).optional(),
      step: z.number().int().positive(),
      expanding: z.boolean(),
      minPeriods: z.number().int().min(3).optional(),
      format: z.enum(rollFormats),
      uncertainty: z.boolean(),
      confidence: z.number().gt(0).lt(1),
      longRun: z.enum(longRunMethods),
      chart: z.string().min(1).optional(),
    })
    .strict(),
)
  .refine((o) => (o.window === undefined) !== !o.expanding, {
    path: ["window"],
    message: "give either --window N (a rolling window) or --expanding (with --min-periods N)",
  })
  .refine((o) => !o.expanding || o.minPeriods !== undefined, { path: ["minPeriods"], message: "--expanding needs --min-periods N (at least 3)" }));

export type RollCliOptions = z.infer<ReturnType<typeof rollOptionsSchema>>;
