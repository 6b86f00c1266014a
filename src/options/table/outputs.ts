/** The model's settings and the outputs (entries of the option table, table.ts). */
import { choiceKind, numberKind, switchKind, textKind } from "../kinds.js";
import { option, everyCommand, readers } from "../spec.js";
import { defaultSteps, defaultWeight, parameters, weightRange } from "../../core/parameters.js";
import { chartYChoices } from "../../report/charts/chartOptions.js";
import { impliedFormats, rollFormats, simulateFormats, solveFormats } from "../../report/formats.js";

export const reportOptions = {
  // ---- the model ---------------------------------------------------------------------------
  weight: option(numberKind(parameters.weight), {
    name: "weight",
    argument: "<w>",
    help: `weight of the low book in the market proxy, ${weightRange.gte} <= w <= ${weightRange.lte}`,
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
    help: "report format; jsonl writes one record per file and pair, summary-csv one CSV row per file and pair",
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
  brief: option(switchKind(), {
    name: "brief",
    help: "text report: the title, the summary and the caution only",
    group: "output",
    commands: ["solve"],
    default: false,
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
    help: 'a JSON file holding files, pairs and options for a job (or for several, under "jobs", solve only); flags override it',
    group: "output",
    commands: readers,
    flagOnly: true,
  }),
  chart: option(textKind("a file path"), {
    name: "chart",
    argument: "<file.svg>",
    help: "also draw an SVG chart: the identified set, or with --portfolios the loadings against the CAPM betas (solve); the band through time (roll)",
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
} as const;
