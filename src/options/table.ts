/**
 * Every option of every command, defined once: its name (the camelCase attribute, config key and
 * library field; the flag is its kebab-case form), the kind of value and its rule, the default, the
 * help text and the commands that take it. Commander's options (src/cli/commandOptions.ts), the zod
 * schemas of flags, config files and library calls (schemas.ts, config.ts), the README's option
 * tables (docs.ts) and the library's defaults (defaults.ts) are all generated from this table.
 *
 * An entry's key is unique; two entries may share a `name` when they never share a command (`format`
 * has other choices for each command), and a test checks that.
 */
import { frequencies } from "../core/calendar.js";
import {
  automaticBandwidths,
  defaultHac,
  defaultIntervalMethod,
  defaultIntervalSource,
  defaultLongRun,
  hacKernels,
  intervalMethods,
  intervalSources,
  longRunMethods,
} from "../core/inference/options.js";
import { defaultConfidence, defaultSteps, defaultWeight, integerRule, parameters } from "../core/parameters.js";
import { inputKinds, inputRules, missingPolicies, unitChoices } from "../input/options.js";
import { chartYChoices } from "../report/charts/chartOptions.js";
import { impliedFormats, rollFormats, simulateFormats, solveFormats } from "../report/formats.js";
import {
  autoOrNumberKind,
  choiceKind,
  columnOrNumberKind,
  garchKind,
  isoDateKind,
  type Kind,
  nameListKind,
  numberKind,
  pairListKind,
  ruledTextKind,
  switchKind,
  textKind,
} from "./kinds.js";

export const commandNames = ["solve", "roll", "implied", "simulate"] as const;
export type CommandName = (typeof commandNames)[number];

/** Sections of the option tables (help and README). */
export const optionGroups = {
  books: "Books",
  reading: "Reading the files",
  model: "Model",
  output: "Output",
  uncertainty: "Uncertainty",
  bootstrap: "Bootstrap",
  windows: "Windows",
  structure: "Structure (per period, decimal)",
  simulation: "Simulation",
} as const;
export type OptionGroup = keyof typeof optionGroups;

/** One option. */
export interface OptionSpec<T> {
  /** The attribute, config key and library field (camelCase); the flag is `--` and its kebab-case form. */
  readonly name: string;
  readonly kind: Kind<T>;
  /** The flag's value placeholder ("<w>", "[replicates]"); absent for a switch. */
  readonly argument?: string;
  readonly help: string;
  readonly group: OptionGroup;
  readonly commands: readonly CommandName[];
  readonly default?: T;
  /** What happens without the option, when that is not a value ("detected", "the first column"). */
  readonly otherwise?: string;
  /** Must be given (there is no sensible default). */
  readonly required?: true;
  /** The value of the flag given without one (`--bootstrap` alone). */
  readonly preset?: T;
  /** A switch written `--no-<flag>` on the command line (its default is on). */
  readonly negated?: true;
  /** A path: in a config file, relative to the file's folder. */
  readonly path?: true;
  /** Not a config key (`--config` itself). */
  readonly flagOnly?: true;
}

/** An entry of the table, with its literal types kept (name, commands, whether it has a default). */
function option<T, const S extends Omit<OptionSpec<T>, "kind">>(kind: Kind<T>, spec: S): S & { readonly kind: Kind<T> } {
  return { ...spec, kind };
}

const readers = ["solve", "roll"] as const;
const everyCommand = commandNames;
const structureCommands = ["implied", "simulate"] as const;

export const optionTable = {
  // ---- the books ----------------------------------------------------------------------------
  low: option(textKind("a column name"), {
    name: "low",
    argument: "<column>",
    help: "column of the low-beta book's returns; PATH:COLUMN for both books (and no file argument) reads each from its own file and joins them on date",
    group: "books",
    commands: readers,
  }),
  high: option(textKind("a column name"), {
    name: "high",
    argument: "<column>",
    help: "column of the high-beta book's returns (PATH:COLUMN: see --low)",
    group: "books",
    commands: readers,
  }),
  pair: option(pairListKind(), {
    name: "pair",
    argument: "<low:high>",
    help: 'a pair of columns to solve, repeatable; in a config file a list of "LOW:HIGH" or {"low", "high"}',
    group: "books",
    commands: readers,
  }),
  lows: option(nameListKind(), {
    name: "lows",
    argument: "<columns>",
    help: "comma-separated low-beta columns: every combination with --highs",
    group: "books",
    commands: readers,
  }),
  highs: option(nameListKind(), {
    name: "highs",
    argument: "<columns>",
    help: "comma-separated high-beta columns",
    group: "books",
    commands: readers,
  }),
  // ---- reading -----------------------------------------------------------------------------
  date: option(textKind("a column name"), {
    name: "date",
    argument: "<column>",
    help: "the date column",
    group: "reading",
    commands: readers,
    otherwise: "the first column",
  }),
  rfColumnOrRate: option(columnOrNumberKind(), {
    name: "rf",
    argument: "<column|number>",
    help: "risk-free return per period: a column (of the low file when joining), or a constant in the file's units",
    group: "reading",
    commands: readers,
    otherwise: "0",
  }),
  units: option(choiceKind(unitChoices), {
    name: "units",
    argument: "<units>",
    help: "units of the file's numbers; percent is divided by 100 on read",
    group: "reading",
    commands: readers,
    default: "decimal",
  }),
  input: option(choiceKind(inputKinds), {
    name: "input",
    argument: "<kind>",
    help: "what the numbers are: prices give simple returns from consecutive levels (the first date is consumed); log returns are converted to simple returns",
    group: "reading",
    commands: readers,
    default: "returns",
  }),
  delimiter: option(ruledTextKind(inputRules.delimiter), {
    name: "delimiter",
    argument: "<char>",
    help: "field delimiter",
    group: "reading",
    commands: readers,
    otherwise: "detected: comma, semicolon or tab",
  }),
  decimalComma: option(switchKind(), {
    name: "decimalComma",
    help: "numbers written with a decimal comma (1,5 is 1.5); needs a semicolon or tab delimiter",
    group: "reading",
    commands: readers,
    default: false,
  }),
  block: option(numberKind(inputRules.block), {
    name: "block",
    argument: "<n>",
    help: "which table of a file whose tables are separated by blank lines (1-based)",
    group: "reading",
    commands: readers,
    otherwise: "1",
  }),
  dateFormat: option(ruledTextKind(inputRules.dateFormat), {
    name: "dateFormat",
    argument: "<layout>",
    help: "explicit date layout: tokens YYYY, MM, M, DD, D, MMM (English month names), e.g. DD/MM/YYYY, MM/DD/YYYY, DD.MM.YYYY, D MMM YYYY",
    group: "reading",
    commands: readers,
    otherwise: "automatic",
  }),
  sort: option(switchKind(), {
    name: "sort",
    help: "sort rows by date instead of refusing unsorted dates",
    group: "reading",
    commands: readers,
    default: false,
  }),
  periodsPerYear: option(numberKind(inputRules.periodsPerYear), {
    name: "periodsPerYear",
    argument: "<n>",
    help: "periods per year, overriding the frequency detected from the dates",
    group: "reading",
    commands: readers,
    otherwise: "detected",
  }),
  missing: option(nameListKind(), {
    name: "missing",
    argument: "<values>",
    help: "extra missing-value markers, comma-separated (e.g. -99.99,-999)",
    group: "reading",
    commands: readers,
  }),
  onMissing: option(choiceKind(missingPolicies), {
    name: "onMissing",
    argument: "<policy>",
    help: "drop rows with a missing value in a used column (counted and listed), or refuse them",
    group: "reading",
    commands: readers,
    default: "drop",
  }),
  idColumn: option(textKind("a column name"), {
    name: "idColumn",
    argument: "<column>",
    help: 'long ("tidy") layout: the column naming the series (--low and --high then name series)',
    group: "reading",
    commands: readers,
    otherwise: "wide layout",
  }),
  valueColumn: option(textKind("a column name"), {
    name: "valueColumn",
    argument: "<column>",
    help: "long layout: the column holding the values",
    group: "reading",
    commands: readers,
  }),
  allowExtreme: option(switchKind(), {
    name: "allowExtreme",
    help: "accept returns above 10 (1,000%) in absolute value",
    group: "reading",
    commands: readers,
    default: false,
  }),
  // ---- the model ---------------------------------------------------------------------------
  weight: option(numberKind(parameters.weight), {
    name: "weight",
    argument: "<w>",
    help: "weight of the low book in the market proxy, 0 < w < 1",
    group: "model",
    commands: everyCommand,
    default: defaultWeight,
  }),
  steps: option(numberKind(parameters.steps), {
    name: "steps",
    argument: "<n>",
    help: "number of candidates in the grid, end points included",
    group: "model",
    commands: ["solve", "implied"],
    default: defaultSteps,
  }),
  // ---- output ------------------------------------------------------------------------------
  solveFormat: option(choiceKind(solveFormats), {
    name: "format",
    argument: "<format>",
    help: "report format; jsonl writes one record per file and pair",
    group: "output",
    commands: ["solve"],
    default: "text",
  }),
  rollFormat: option(choiceKind(rollFormats), {
    name: "format",
    argument: "<format>",
    help: "output format: text (a table), csv (one row per window) or jsonl (one record per window)",
    group: "output",
    commands: ["roll"],
    default: "text",
  }),
  impliedFormat: option(choiceKind(impliedFormats), {
    name: "format",
    argument: "<format>",
    help: "report format",
    group: "output",
    commands: ["implied"],
    default: "text",
  }),
  simulateFormat: option(choiceKind(simulateFormats), {
    name: "format",
    argument: "<format>",
    help: "output format",
    group: "output",
    commands: ["simulate"],
    default: "csv",
  }),
  output: option(textKind("a file path"), {
    name: "output",
    argument: "<path>",
    help: "write the output to this file (a temporary file renamed over it) instead of standard output",
    group: "output",
    commands: everyCommand,
    otherwise: "standard output",
    path: true,
  }),
  config: option(textKind("a file path"), {
    name: "config",
    argument: "<file>",
    help: "a JSON file holding files, pairs and options for a job; flags override it",
    group: "output",
    commands: readers,
    flagOnly: true,
  }),
  chart: option(textKind("a file path"), {
    name: "chart",
    argument: "<file.svg>",
    help: "also draw an SVG chart: the identified set (solve) or its band through time (roll)",
    group: "output",
    commands: readers,
    path: true,
  }),
  chartY: option(choiceKind(chartYChoices), {
    name: "chartY",
    argument: "<quantity>",
    help: "what the chart's y axis shows: both noise variances, or the noise shares",
    group: "output",
    commands: ["solve"],
    default: "variance",
  }),
  report: option(textKind("a file path"), {
    name: "report",
    argument: "<file.html>",
    help: "also write a self-contained HTML report with the tables and the chart",
    group: "output",
    commands: ["solve"],
    path: true,
  }),
  // ---- uncertainty -------------------------------------------------------------------------
  uncertainty: option(switchKind(), {
    name: "uncertainty",
    help: "skip standard errors and intervals (faster on very long files)",
    group: "uncertainty",
    commands: ["solve"],
    default: true,
    negated: true,
  }),
  windowUncertainty: option(switchKind(), {
    name: "uncertainty",
    help: "delta-method standard errors of the bounds and an interval for the low beta in every window",
    group: "uncertainty",
    commands: ["roll"],
    default: false,
  }),
  confidence: option(numberKind(parameters.confidence), {
    name: "confidence",
    argument: "<level>",
    help: "confidence level of every interval",
    group: "uncertainty",
    commands: readers,
    default: defaultConfidence,
  }),
  longRun: option(choiceKind(longRunMethods), {
    name: "longRun",
    argument: "<method>",
    help: "long-run covariance of the moment contributions behind the bounds' delta-method standard errors",
    group: "uncertainty",
    commands: readers,
    default: defaultLongRun,
  }),
  hacKernel: option(choiceKind(hacKernels), {
    name: "hacKernel",
    argument: "<kernel>",
    help: "HAC kernel (Newey-West 1987; Andrews 1991)",
    group: "uncertainty",
    commands: ["solve"],
    default: defaultHac.kernel,
  }),
  hacBandwidth: option(choiceKind(automaticBandwidths), {
    name: "hacBandwidth",
    argument: "<rule>",
    help: "automatic HAC bandwidth rule",
    group: "uncertainty",
    commands: ["solve"],
    default: defaultHac.bandwidth,
  }),
  hacLags: option(numberKind(parameters.hacLags), {
    name: "hacLags",
    argument: "<n>",
    help: "a fixed HAC lag truncation instead of the automatic rule",
    group: "uncertainty",
    commands: ["solve"],
    otherwise: "automatic",
  }),
  hacPrewhite: option(switchKind(), {
    name: "hacPrewhite",
    help: "VAR(1) prewhitening before the HAC kernel (Andrews-Monahan 1992)",
    group: "uncertainty",
    commands: ["solve"],
    default: defaultHac.prewhite,
  }),
  hacAdjust: option(switchKind(), {
    name: "hacAdjust",
    help: "small-sample factor T/(T - k) on the CAPM HAC covariances",
    group: "uncertainty",
    commands: ["solve"],
    default: defaultHac.adjust,
  }),
  interval: option(choiceKind(intervalMethods), {
    name: "interval",
    argument: "<method>",
    help: "confidence interval for the structural betas themselves",
    group: "uncertainty",
    commands: ["solve"],
    default: defaultIntervalMethod,
  }),
  intervalSource: option(choiceKind(intervalSources), {
    name: "intervalSource",
    argument: "<source>",
    help: "standard errors of the bounds behind those intervals: delta method or bootstrap",
    group: "uncertainty",
    commands: ["solve"],
    default: defaultIntervalSource,
  }),
  // ---- bootstrap ---------------------------------------------------------------------------
  bootstrap: option(numberKind(parameters.replicates), {
    name: "bootstrap",
    argument: "[replicates]",
    help: "stationary bootstrap (Politis-Romano 1994) of every headline number, with this many replicates (2000 when no number is given; 0 = off)",
    group: "bootstrap",
    commands: ["solve"],
    default: 0,
    preset: 2000,
  }),
  blockLength: option(autoOrNumberKind(parameters.blockLength), {
    name: "blockLength",
    argument: "<b|auto>",
    help: "mean block length of the bootstrap; auto: Politis-White (2004) with the Patton-Politis-White (2009) correction",
    group: "bootstrap",
    commands: ["solve"],
    default: "auto",
  }),
  seed: option(numberKind(parameters.seed), {
    name: "seed",
    argument: "<n>",
    help: "seed of the random streams: the same seed gives the same result, whatever --threads",
    group: "bootstrap",
    commands: ["solve", "simulate"],
    default: 1,
  }),
  threads: option(numberKind(integerRule(1, 256)), {
    name: "threads",
    argument: "<n>",
    help: "worker threads for the bootstrap (results do not depend on it)",
    group: "bootstrap",
    commands: ["solve"],
    otherwise: "the cores, at most 4",
  }),
  // ---- windows -----------------------------------------------------------------------------
  window: option(numberKind(integerRule(3, 100_000_000)), {
    name: "window",
    argument: "<n>",
    help: "rolling window length in periods",
    group: "windows",
    commands: ["roll"],
  }),
  step: option(numberKind(integerRule(1, 100_000_000)), {
    name: "step",
    argument: "<k>",
    help: "periods between consecutive windows",
    group: "windows",
    commands: ["roll"],
    default: 1,
  }),
  expanding: option(switchKind(), {
    name: "expanding",
    help: "expanding windows from the first row instead of a rolling window",
    group: "windows",
    commands: ["roll"],
    default: false,
  }),
  minPeriods: option(numberKind(integerRule(3, 100_000_000)), {
    name: "minPeriods",
    argument: "<n>",
    help: "with --expanding: the first window's length",
    group: "windows",
    commands: ["roll"],
  }),
  // ---- a structure (implied, simulate) -----------------------------------------------------
  lowBeta: option(numberKind(parameters.lowBeta), {
    name: "lowBeta",
    argument: "<b>",
    help: "structural beta of the low book (0 < b < 1/w)",
    group: "structure",
    commands: structureCommands,
    required: true,
  }),
  factorVol: option(numberKind(parameters.factorVol), {
    name: "factorVol",
    argument: "<sd>",
    help: "standard deviation of the latent factor per period",
    group: "structure",
    commands: structureCommands,
    required: true,
  }),
  factorMean: option(numberKind(parameters.mean), {
    name: "factorMean",
    argument: "<m>",
    help: "mean excess return of the factor per period",
    group: "structure",
    commands: structureCommands,
    default: 0,
  }),
  lowNoiseVol: option(numberKind(parameters.noiseVol), {
    name: "lowNoiseVol",
    argument: "<sd>",
    help: "standard deviation of the low book's noise",
    group: "structure",
    commands: structureCommands,
    required: true,
  }),
  highNoiseVol: option(numberKind(parameters.noiseVol), {
    name: "highNoiseVol",
    argument: "<sd>",
    help: "standard deviation of the high book's noise",
    group: "structure",
    commands: structureCommands,
    required: true,
  }),
  rfRate: option(numberKind(parameters.mean), {
    name: "rf",
    argument: "<r>",
    help: "risk-free return per period: moments are of excess returns; it sets the raw means (implied) or is added to both books (simulate)",
    group: "structure",
    commands: structureCommands,
    default: 0,
  }),
  // ---- simulation --------------------------------------------------------------------------
  periods: option(numberKind(parameters.periods), {
    name: "periods",
    argument: "<n>",
    help: "number of periods",
    group: "simulation",
    commands: ["simulate"],
    required: true,
  }),
  frequency: option(choiceKind(frequencies), {
    name: "frequency",
    argument: "<f>",
    help: "spacing of the dates (daily: business days)",
    group: "simulation",
    commands: ["simulate"],
    default: "monthly",
  }),
  start: option(isoDateKind(), {
    name: "start",
    argument: "<date>",
    help: "first date (YYYY-MM-DD); the first period end on or after it is used",
    group: "simulation",
    commands: ["simulate"],
    default: "2000-01-01",
  }),
  tails: option(numberKind(parameters.tails), {
    name: "tails",
    argument: "<df>",
    help: "Student t innovations with this many degrees of freedom, scaled to the same variance",
    group: "simulation",
    commands: ["simulate"],
    otherwise: "normal",
  }),
  noiseAr: option(numberKind(parameters.noiseAr), {
    name: "noiseAr",
    argument: "<rho>",
    help: "AR(1) coefficient of both noises",
    group: "simulation",
    commands: ["simulate"],
    otherwise: "0",
  }),
  garch: option(garchKind(), {
    name: "garch",
    argument: "<alpha,beta>",
    help: "GARCH(1,1) volatility clustering of the factor, with the same unconditional variance",
    group: "simulation",
    commands: ["simulate"],
  }),
  names: option(nameListKind(3), {
    name: "names",
    argument: "<date,low,high>",
    help: "column names",
    group: "simulation",
    commands: ["simulate"],
    default: ["date", "low", "high"],
  }),
  digits: option(numberKind(integerRule(1, 17)), {
    name: "digits",
    argument: "<n>",
    help: "write returns with this many decimals",
    group: "simulation",
    commands: ["simulate"],
    otherwise: "full precision",
  }),
} as const;

export type OptionTable = typeof optionTable;
export type OptionKey = keyof OptionTable;
