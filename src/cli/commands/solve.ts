/**
 * `betabound solve`: for every file and every (low, high) pair, read, solve the identified set and
 * render; then write everything once. A pair that fails yields a failure record and does not stop
 * the others. Exit code: that of the single record, or for several records 0 when all succeeded and
 * `partial` otherwise.
 */
import { availableParallelism } from "node:os";
import { Command, InvalidArgumentError, Option } from "commander";
import { solve } from "../../core/solve.js";
import { describeInputWarning } from "../../input/issues.js";
import { parseDecimal } from "../../input/values/numbers.js";
import { renderJsonLines, renderRecordsCsv, renderRecordsText, type SolveRecord } from "../../report/records.js";
import { renderReport } from "../../report/render.js";
import type { SolveReport } from "../../report/types.js";
import { openUnitInterval, wholeNumber } from "../arguments.js";
import { chartYChoices, writeCharts } from "./charts.js";
import { withConfig } from "../config.js";
import { emit, usage, wantsColour } from "../emit.js";
import { exitCodes, type ExitCode } from "../runtime/exitCodes.js";
import { addInputOptions } from "../inputOptions.js";
import type { CliIo } from "../runtime/io.js";
import { describeCliIssue } from "../messages.js";
import {
  automaticBandwidths,
  describeOptionIssue,
  hacKernels,
  intervalMethods,
  intervalSources,
  longRunMethods,
  maximumSteps,
  solveDefaults,
  solveFormats,
  solveOptionsSchema,
  uncertaintyDefaults,
  type SolveCliOptions,
} from "../options.js";
import { describeInput, joinedSides, loadPairs, sampleOf, type PairLoad } from "../pairTables.js";
import { pairsFrom } from "../pairs.js";
import { uncertaintyFor } from "../solveUncertainty.js";
import { version } from "../runtime/version.js";

const tool = { name: "betabound", version } as const;

interface Outcome {
  readonly record: SolveRecord;
  readonly code: ExitCode;
  readonly messages: readonly string[];
}

/** Runs solve on `files` (none or "-": standard input) for every pair and returns the exit code. */
export async function runSolve(files: readonly string[], options: SolveCliOptions, io: CliIo): Promise<ExitCode> {
  const pairs = pairsFrom(options);
  const joined = joinedSides(files, options) !== null;
  if (!joined && files.length === 0 && io.stdinIsTerminal) return usage(io, describeCliIssue({ code: "no-input" }));
  const several = !joined && Math.max(files.length, 1) * pairs.length > 1;
  if (several && (options.chart !== undefined || options.report !== undefined)) {
    const option = options.chart === undefined ? "--report" : "--chart";
    return usage(
      io,
      describeCliIssue({
        code: "invalid-option",
        option,
        value: options.chart ?? options.report ?? "",
        expected: "draws one file and one pair; run it per pair",
      }),
    );
  }
  if (several && options.format === "json") {
    const expected = "several files or pairs need --format jsonl (one record per line), csv or text";
    return usage(io, describeCliIssue({ code: "invalid-option", option: "--format", value: "json", expected }));
  }
  const outcomes: Outcome[] = [];
  for await (const load of loadPairs(files, pairs, options, io)) outcomes.push(await solveLoaded(load, options, io));

  const records = outcomes.map((o) => o.record);
  const single = !several && records[0]?.kind === "report" ? records[0].report : null;
  const colour = wantsColour(io, options.output, options.format);
  let text: string | null;
  if (single !== null && options.format !== "jsonl") text = renderReport(single, options.format, { colour });
  else if (options.format === "jsonl") text = renderJsonLines(records);
  else if (!several)
    text = null; // one pair that failed: its messages go to stderr, nothing to stdout
  else text = options.format === "csv" ? renderRecordsCsv(records) : renderRecordsText(records, { colour });

  if (single !== null) {
    const drawn = await writeCharts(single, options, io);
    if (drawn !== exitCodes.ok) return drawn;
  }
  if (text !== null) {
    const written = await emit(io, options.output, text);
    if (written !== exitCodes.ok) return written;
  }
  // Reports carry their diagnostics; repeat them on stderr unless a text report is on the terminal.
  const reportOnTerminal = options.output === undefined && io.stdoutIsTerminal && options.format === "text";
  for (const outcome of outcomes) {
    for (const message of outcome.messages) if (outcome.record.kind === "failure" || !reportOnTerminal) io.writeErr(message);
  }
  if (!several) return outcomes[0]?.code ?? exitCodes.input;
  return outcomes.every((o) => o.code === exitCodes.ok) ? exitCodes.ok : exitCodes.partial;
}

async function solveLoaded(load: PairLoad, options: SolveCliOptions, io: CliIo): Promise<Outcome> {
  if (!load.ok) return failed(load.source, load.pair, exitCodes.input, load.errors);
  const loaded = load.value;
  const { source, pair } = loaded;
  const sample = sampleOf(loaded);
  const solved = solve(sample, { weight: options.weight, steps: options.steps });
  if (!solved.ok) {
    return failed(
      source,
      pair,
      exitCodes.input,
      solved.issues.map((d) => ({ code: d.code, message: `${source}: ${d.message}` })),
    );
  }
  const assessed = await uncertaintyFor(sample, solved.value, options, io);
  const solution = assessed.note === null ? solved.value : { ...solved.value, diagnostics: [...solved.value.diagnostics, assessed.note] };
  const report: SolveReport = { tool, input: describeInput(loaded, options), solution, uncertainty: assessed.uncertainty };
  const messages = [
    ...loaded.table.warnings.map((w) => `warning: ${describeInputWarning(w)}\n`),
    ...solved.value.diagnostics.filter((d) => d.severity !== "info").map((d) => `${d.severity}: ${source}: ${d.message}\n`),
  ];
  return { record: { kind: "report", report }, code: solved.value.bounds === null ? exitCodes.rejected : exitCodes.ok, messages };
}

function failed(
  source: string,
  pair: { low: string; high: string },
  code: ExitCode,
  errors: readonly { code: string; message: string }[],
): Outcome {
  const failure = { tool, source, lowColumn: pair.low, highColumn: pair.high, errors };
  return { record: { kind: "failure", failure }, code, messages: errors.map((e) => `error: ${e.message}\n`) };
}

const solveExamples = `
Examples:
  $ betabound solve returns.csv --low "Low Vol Fund" --high "High Beta Fund"
  $ betabound solve returns.csv --low LOW --high HIGH --rf TBILL --units percent --format json
  $ cat returns.csv | betabound solve - --low LOW --high HIGH --steps 21 --format csv --output grid.csv
  $ betabound solve desk-a.csv desk-b.csv --lows LV1,LV2 --highs HB1 --format jsonl > pairs.jsonl
  $ betabound solve --low calm.csv:Return --high bold.csv:Return --rf 0.0001
  $ betabound solve returns.csv --low LOW --high HIGH --chart set.svg --report report.html
`;

/** The commander definition of `solve`. */
export function solveCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  const command = addInputOptions(
    new Command("solve")
      .description("Sample moments, CAPM fits and the identified set of structural betas for return files.")
      .argument("[files...]", "CSV files of per-period returns, or '-' for standard input"),
  );
  return command
    .addOption(
      new Option("--steps <n>", "number of candidates in the grid, endpoints included")
        .argParser(wholeNumber(2, maximumSteps))
        .default(solveDefaults.steps),
    )
    .addOption(
      new Option("--format <format>", "report format (jsonl: one record per file and pair)")
        .choices(solveFormats)
        .default(solveDefaults.format),
    )
    .option("--no-uncertainty", "skip standard errors and intervals (faster on very long files)")
    .option("--confidence <level>", "confidence level of every interval", openUnitInterval, uncertaintyDefaults.confidence)
    .addOption(
      new Option("--long-run <method>", "long-run covariance of the moment contributions for the bounds' standard errors")
        .choices(longRunMethods)
        .default(uncertaintyDefaults.longRun),
    )
    .addOption(new Option("--hac-kernel <kernel>", "HAC kernel").choices(hacKernels).default(uncertaintyDefaults.hacKernel))
    .addOption(
      new Option("--hac-bandwidth <rule>", "automatic HAC bandwidth rule")
        .choices(automaticBandwidths)
        .default(uncertaintyDefaults.hacBandwidth),
    )
    .option("--hac-lags <n>", "fixed HAC lag truncation instead of the automatic rule", wholeNumber(0, 100_000))
    .option("--hac-prewhite", "VAR(1) prewhitening before the HAC kernel", false)
    .option("--hac-adjust", "small-sample factor T/(T - k) on the CAPM HAC covariances", false)
    .addOption(
      new Option("--interval <method>", "confidence interval for the structural betas")
        .choices(intervalMethods)
        .default(uncertaintyDefaults.interval),
    )
    .addOption(
      new Option("--interval-source <source>", "standard errors of the bounds: delta method or bootstrap")
        .choices(intervalSources)
        .default(uncertaintyDefaults.intervalSource),
    )
    .addOption(
      new Option(
        "--bootstrap [replicates]",
        `stationary bootstrap replicates (${uncertaintyDefaults.bootstrapReplicates} when no number is given; 0 = off)`,
      )
        .argParser(wholeNumber(0, 10_000_000))
        .preset(uncertaintyDefaults.bootstrapReplicates)
        .default(0),
    )
    .option("--block-length <b|auto>", "mean block length of the bootstrap (auto: Politis-White)", blockLengthArgument, "auto" as const)
    .option(
      "--seed <n>",
      "seed of the bootstrap (the same seed gives the same intervals)",
      wholeNumber(0, Number.MAX_SAFE_INTEGER),
      uncertaintyDefaults.seed,
    )
    .option("--threads <n>", "worker threads for the bootstrap (results do not depend on it)", wholeNumber(1, 256), defaultThreads())
    .option("--chart <file.svg>", "also draw the identified set as an SVG chart")
    .addOption(new Option("--chart-y <quantity>", "what the chart's y axis shows").choices(chartYChoices).default("variance"))
    .option("--report <file.html>", "also write a self-contained HTML report with the tables and the chart")
    .option("--config <file>", "JSON file with files, pairs and options for a job; flags override it")
    .addHelpText("after", solveExamples)
    .action(async (given: string[], _raw: Record<string, unknown>, self: Command) => {
      const job = await withConfig(self, given, io);
      if (!job.ok) return setExit(usage(io, describeCliIssue(job.issues)));
      const parsed = solveOptionsSchema().safeParse(job.value.options);
      if (!parsed.success) return setExit(usage(io, describeOptionIssue(parsed.error)));
      setExit(await runSolve(job.value.files, parsed.data, io));
    });
}

function blockLengthArgument(value: string): number | "auto" {
  if (value === "auto") return "auto";
  const b = parseDecimal(value);
  if (b === null || !(b >= 1)) throw new InvalidArgumentError('must be "auto" or a number >= 1');
  return b;
}

/** Both cores of a small machine, at most 4: more rarely pays for the start-up of a worker. */
function defaultThreads(): number {
  return Math.max(1, Math.min(4, availableParallelism()));
}
