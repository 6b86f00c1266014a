/**
 * `betabound simulate`: draw a sample from a structure and write it as CSV that `solve` reads as it
 * is, or as JSON Lines. The same options and seed give the same bytes.
 */
import { Command, InvalidArgumentError, Option } from "commander";
import { frequencies, periodDates } from "../../core/calendar.js";
import type { Structure } from "../../core/forward/populationMoments.js";
import { simulateSample, type SimulationOptions } from "../../core/forward/simulate.js";
import { parseDecimal } from "../../input/values/numbers.js";
import { anyNumber, nameList, nonNegativeNumber, numberArgument, openUnitInterval, positiveNumber, wholeNumber } from "../arguments.js";
import { exitCodes, type ExitCode } from "../runtime/exitCodes.js";
import type { CliIo } from "../runtime/io.js";
import { emit } from "../emit.js";
import { describeOptionIssue, simulateFormats, simulateOptionsSchema, type SimulateCliOptions } from "../options.js";

export async function runSimulate(options: SimulateCliOptions, io: CliIo): Promise<ExitCode> {
  const structure: Structure = {
    lowBeta: options.lowBeta,
    weight: options.weight,
    factorVol: options.factorVol,
    factorMean: options.factorMean,
    lowNoiseVol: options.lowNoiseVol,
    highNoiseVol: options.highNoiseVol,
  };
  const simulation: SimulationOptions = {
    periods: options.periods,
    seed: options.seed,
    riskFree: options.rf,
    ...(options.tails === undefined ? {} : { tails: options.tails }),
    ...(options.noiseAr === undefined ? {} : { noiseAr: options.noiseAr }),
    ...(options.garch === undefined ? {} : { garch: options.garch }),
  };
  const sample = simulateSample(structure, simulation);
  const dates = periodDates(options.frequency, options.start, options.periods);
  const text =
    options.format === "csv" ? toCsv(dates, sample.low, sample.high, options) : toJsonLines(dates, sample.low, sample.high, options);
  return emit(io, options.output, text);
}

/** Fixed decimals when asked (e.g. 6 for a realistic export), else the shortest exact form. */
function formatter(digits: number | undefined): (x: number) => string {
  if (digits === undefined) return (x) => String(x);
  return (x) => {
    const text = x.toFixed(digits);
    return /^-0\.?0*$/.test(text) ? text.slice(1) : text;
  };
}

function csvField(text: string): string {
  return /[",\n\r]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

function toCsv(dates: readonly string[], low: Float64Array, high: Float64Array, options: SimulateCliOptions): string {
  const format = formatter(options.digits);
  const lines = [options.names.map(csvField).join(",")];
  for (let t = 0; t < dates.length; t++) lines.push(`${dates[t]},${format(low[t]!)},${format(high[t]!)}`);
  return `${lines.join("\n")}\n`;
}

function toJsonLines(dates: readonly string[], low: Float64Array, high: Float64Array, options: SimulateCliOptions): string {
  const format = formatter(options.digits);
  const [dateName, lowName, highName] = options.names;
  let text = "";
  for (let t = 0; t < dates.length; t++) {
    text += `{${JSON.stringify(dateName)}:${JSON.stringify(dates[t])},${JSON.stringify(lowName)}:${format(low[t]!)},${JSON.stringify(highName)}:${format(high[t]!)}}\n`;
  }
  return text;
}

const simulateExamples = `
Examples:
  $ betabound simulate --low-beta 0.7 --factor-vol 0.04 --factor-mean 0.005 \\
      --low-noise-vol 0.01 --high-noise-vol 0.015 --periods 120 --seed 7 > sample.csv
  $ betabound simulate --low-beta 0.7 --factor-vol 0.01 --low-noise-vol 0.004 --high-noise-vol 0.006 \\
      --periods 2520 --frequency daily --tails 5 --seed 1 | betabound solve - --low low --high high
`;

/** The commander definition of `simulate`. */
export function simulateCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  return new Command("simulate")
    .description("Draw a return sample from a structure (per period, decimal units) as CSV or JSON Lines.")
    .requiredOption("--low-beta <b>", "structural beta of the low book (0 < b < 1/w)", positiveNumber)
    .requiredOption("--factor-vol <sd>", "standard deviation of the latent factor per period", positiveNumber)
    .option("--factor-mean <m>", "mean excess return of the factor per period", anyNumber, 0)
    .requiredOption("--low-noise-vol <sd>", "standard deviation of the low book's noise", nonNegativeNumber)
    .requiredOption("--high-noise-vol <sd>", "standard deviation of the high book's noise", nonNegativeNumber)
    .option("--weight <w>", "weight of the low book in the market proxy", openUnitInterval, 0.5)
    .option("--rf <r>", "risk-free return per period added to both books", anyNumber, 0)
    .requiredOption("--periods <n>", "number of periods", wholeNumber(1, 100_000_000))
    .addOption(new Option("--frequency <f>", "spacing of the dates").choices(frequencies).default("monthly"))
    .option("--start <date>", "first date (YYYY-MM-DD); the first period end on or after it is used", "2000-01-01")
    .option("--seed <n>", "seed of the random generator", wholeNumber(0, Number.MAX_SAFE_INTEGER), 1)
    .option(
      "--tails <df>",
      "Student t innovations with this many degrees of freedom (> 2)",
      numberArgument("must be a number > 2", (x) => x > 2),
    )
    .option(
      "--noise-ar <rho>",
      "AR(1) coefficient of both noises",
      numberArgument("must lie strictly between -1 and 1", (x) => Math.abs(x) < 1),
    )
    .option("--garch <alpha,beta>", "GARCH(1,1) volatility clustering of the factor", garchArgument)
    .option("--names <date,low,high>", "column names", nameList(3), ["date", "low", "high"])
    .option("--digits <n>", "write returns with this many decimals (default: full precision)", wholeNumber(1, 17))
    .addOption(new Option("--format <format>", "output format").choices(simulateFormats).default("csv"))
    .option("--output <path>", "write to this file (atomically) instead of standard output")
    .addHelpText("after", simulateExamples)
    .action(async (raw: Record<string, unknown>) => {
      const parsed = simulateOptionsSchema().safeParse(raw);
      if (!parsed.success) {
        io.writeErr(`error: ${describeOptionIssue(parsed.error)}\n`);
        setExit(exitCodes.usage);
        return;
      }
      setExit(await runSimulate(parsed.data, io));
    });
}

function garchArgument(value: string): { alpha: number; beta: number } {
  const parts = value.split(",").map((s) => parseDecimal(s.trim()));
  const [alpha, beta] = parts;
  if (parts.length !== 2 || alpha == null || beta == null || alpha < 0 || beta < 0 || alpha + beta >= 1) {
    throw new InvalidArgumentError("must be two numbers alpha,beta >= 0 with alpha + beta < 1");
  }
  return { alpha, beta };
}
