/**
 * The options of `solve`: one set of constants feeds commander's choices and defaults, the zod schema
 * that validates the merged options, and the TypeScript types.
 */
import en from "zod/v4/locales/en.js";
import * as z from "zod/mini";
import { frequencies } from "../core/calendar.js";
import { chartYChoices } from "./commands/charts.js";
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

// zod/mini (smaller and quicker to build than the classic API) loads no messages of its own: English
// ones; and no compiled fast path, which costs more to build than it saves when each run parses
// its options once.
z.config({ ...en(), jitless: true });

/**
 * The leaf schemas most options share, each built once (zod schemas are immutable, so one instance
 * serves every field; issues carry the field's path, not the schema's).
 */
const leaves = once(() => ({
  /** A non-empty string. */
  text: z.string().check(z.minLength(1)),
  optionalText: z.optional(z.string().check(z.minLength(1))),
  boolean: z.boolean(),
  /** A number strictly between 0 and 1. */
  fraction: z.number().check(z.gt(0), z.lt(1)),
  positive: z.number().check(z.positive()),
  nonnegative: z.number().check(z.nonnegative()),
  wholeNonnegative: z.int().check(z.nonnegative()),
  wholePositive: z.int().check(z.positive()),
}));
const text = () => leaves().text;
const fraction = () => leaves().fraction;

/** Options shared by every command that reads return files: which books, and how to read them. */
export const inputOptionsShape = once(() => ({
  low: leaves().optionalText,
  high: leaves().optionalText,
  pair: z.optional(z.array(z.strictObject({ low: text(), high: text() }))),
  lows: z.optional(z.array(text())),
  highs: z.optional(z.array(text())),
  date: leaves().optionalText,
  weight: fraction(),
  rf: leaves().optionalText,
  units: z.enum(unitChoices),
  output: leaves().optionalText,
  allowExtreme: leaves().boolean,
  delimiter: z.optional(z.string().check(z.length(1))),
  block: z.optional(leaves().wholePositive),
  dateFormat: leaves().optionalText,
  sort: leaves().boolean,
  periodsPerYear: z.optional(leaves().positive),
  missing: z.optional(z.array(text())),
  onMissing: z.enum(missingPolicies),
  input: z.enum(inputKinds),
  idColumn: leaves().optionalText,
  valueColumn: leaves().optionalText,
  decimalComma: leaves().boolean,
}));

/** The input options after validation (what the pair loader needs). */
export type InputCliOptions = z.infer<z.ZodMiniObject<ReturnType<typeof inputOptionsShape>>>;

/** Cross-field rules of the input options, for any schema that spreads inputOptionsShape. */
export function refineInputOptions<T extends z.ZodMiniType<InputCliOptions>>(schema: T): T {
  return schema.check(
    z.refine<InputCliOptions>((o) => (o.low === undefined) === (o.high === undefined), {
      path: ["high"],
      message: "--low and --high go together (or use --pair LOW:HIGH)",
    }),
    z.refine<InputCliOptions>((o) => (o.lows === undefined) === (o.highs === undefined), {
      path: ["highs"],
      message: "--lows and --highs go together",
    }),
    z.refine<InputCliOptions>((o) => o.low !== undefined || (o.pair?.length ?? 0) > 0 || o.lows !== undefined, {
      path: ["low"],
      message: "name the books: --low COLUMN --high COLUMN, or --pair LOW:HIGH, or --lows A,B --highs X,Y",
    }),
    z.refine<InputCliOptions>((o) => (o.idColumn === undefined) === (o.valueColumn === undefined), {
      path: ["valueColumn"],
      message: "the long layout needs both --id-column and --value-column",
    }),
  );
}

export const solveOptionsSchema = once(() => {
  const schema = z.strictObject({
    ...inputOptionsShape(),
    steps: z.int().check(z.gte(2), z.lte(maximumSteps)),
    format: z.enum(solveFormats),
    uncertainty: leaves().boolean,
    confidence: fraction(),
    longRun: z.enum(longRunMethods),
    hacKernel: z.enum(hacKernels),
    hacBandwidth: z.enum(automaticBandwidths),
    hacLags: z.optional(leaves().wholeNonnegative),
    hacPrewhite: leaves().boolean,
    hacAdjust: leaves().boolean,
    interval: z.enum(intervalMethods),
    intervalSource: z.enum(intervalSources),
    bootstrap: leaves().wholeNonnegative,
    blockLength: z.union([z.literal("auto"), z.number().check(z.gte(1))]),
    seed: leaves().wholeNonnegative,
    threads: leaves().wholePositive,
    chart: leaves().optionalText,
    chartY: z.enum(chartYChoices),
    report: leaves().optionalText,
  });
  return refineInputOptions(schema).check(
    z.refine<z.infer<typeof schema>>((o) => o.intervalSource !== "bootstrap" || o.bootstrap >= 2, {
      path: ["intervalSource"],
      message: "bootstrap standard errors need --bootstrap with at least 2 replicates",
    }),
  );
});

export type SolveCliOptions = z.infer<ReturnType<typeof solveOptionsSchema>>;

export const simulateFormats = ["csv", "jsonl"] as const;

/** A structure given on the command line (simulate, implied): per period, decimal. */
const structureShape = once(() => ({
  lowBeta: leaves().positive,
  factorVol: leaves().positive,
  factorMean: z.number(),
  lowNoiseVol: leaves().nonnegative,
  highNoiseVol: leaves().nonnegative,
  weight: fraction(),
  rf: z.number(),
}));

/** b_low < 1/w, so that the high book's structural beta is positive. */
const positiveHighBeta = () =>
  z.refine<{ lowBeta: number; weight: number }>((o) => o.lowBeta < 1 / o.weight, {
    path: ["lowBeta"],
    message: "must be below 1/w so that the high book's beta is positive",
  });

/** The options of `simulate` after commander's parsing (each number already checked by its argParser). */
export const simulateOptionsSchema = once(() =>
  z
    .strictObject({
      ...structureShape(),
      periods: leaves().wholePositive,
      frequency: z.enum(frequencies),
      start: z.string().check(
        z.regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date YYYY-MM-DD"),
        z.refine((s: string) => !Number.isNaN(Date.parse(s)), "must be a real date"),
      ),
      seed: leaves().wholeNonnegative,
      tails: z.optional(z.number().check(z.gt(2))),
      noiseAr: z.optional(z.number().check(z.gt(-1), z.lt(1))),
      garch: z.optional(z.strictObject({ alpha: leaves().nonnegative, beta: leaves().nonnegative })),
      names: z.tuple([text(), text(), text()]),
      digits: z.optional(z.int().check(z.gte(1), z.lte(17))),
      format: z.enum(simulateFormats),
      output: leaves().optionalText,
    })
    .check(positiveHighBeta()),
);

export type SimulateCliOptions = z.infer<ReturnType<typeof simulateOptionsSchema>>;

/** The first zod issue as a CLI usage message: the option in kebab case and what is wrong. */
export function describeOptionIssue(error: z.core.$ZodError): string {
  const issue = error.issues[0];
  const key = String(issue?.path[0] ?? "");
  const flag = key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`);
  return `option '--${flag}' is invalid: ${issue?.message ?? "unknown problem"}`;
}

/** The options of `implied`: a structure (per period, decimal) and the report settings. */
export const impliedOptionsSchema = once(() =>
  z
    .strictObject({
      ...structureShape(),
      steps: z.int().check(z.gte(2), z.lte(maximumSteps)),
      format: z.enum(reportFormats),
      output: leaves().optionalText,
    })
    .check(positiveHighBeta()),
);

export type ImpliedCliOptions = z.infer<ReturnType<typeof impliedOptionsSchema>>;

export const rollFormats = ["text", "csv", "jsonl"] as const;

/** The options of `roll`: the input options, the windows, and the per-window outputs. */
export const rollOptionsSchema = once(() => {
  const schema = z.strictObject({
    ...inputOptionsShape(),
    window: z.optional(z.int().check(z.gte(3))),
    step: leaves().wholePositive,
    expanding: leaves().boolean,
    minPeriods: z.optional(z.int().check(z.gte(3))),
    format: z.enum(rollFormats),
    uncertainty: leaves().boolean,
    confidence: fraction(),
    longRun: z.enum(longRunMethods),
    chart: leaves().optionalText,
  });
  type Roll = z.infer<typeof schema>;
  return refineInputOptions(schema).check(
    z.refine<Roll>((o) => (o.window === undefined) !== !o.expanding, {
      path: ["window"],
      message: "give either --window N (a rolling window) or --expanding (with --min-periods N)",
    }),
    z.refine<Roll>((o) => !o.expanding || o.minPeriods !== undefined, {
      path: ["minPeriods"],
      message: "--expanding needs --min-periods N (at least 3)",
    }),
  );
});

export type RollCliOptions = z.infer<ReturnType<typeof rollOptionsSchema>>;
