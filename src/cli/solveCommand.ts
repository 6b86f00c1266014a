/**
 * `betabound solve`: for every file and every (low, high) pair, read, solve the identified set and
 * render; then write everything once. A pair that fails yields a failure record and does not stop
 * the others. Exit code: that of the single record, or for several records 0 when all succeeded and
 * `partial` otherwise.
 */
import { Command, Option } from "commander";
import { diagnose, type Diagnostic } from "../core/diagnostics.js";
import type { BootstrapSummary } from "../core/inference/bootstrapSummary.js";
import type { HacOptions } from "../core/inference/options.js";
import { assessUncertainty, type UncertaintySample } from "../core/inference/uncertainty.js";
import type { Uncertainty } from "../core/inference/uncertaintyTypes.js";
import { solve } from "../core/solve.js";
import type { Solution } from "../core/types.js";
import { decodeText } from "../input/decodeText.js";
import { describeInputIssue, describeInputWarning, type InputIssue } from "../input/issues.js";
import { parseDecimal } from "../input/numbers.js";
import type { ReadOptions } from "../input/options.js";
import { joinOnDates } from "../input/joinOnDates.js";
import { readReturns } from "../input/readReturns.js";
import type { ReturnTable } from "../input/returnTable.js";
import { renderRecordsCsv, renderRecordsText, renderJsonLines, type SolveFailure, type SolveRecord } from "../report/records.js";
import { renderReport } from "../report/render.js";
import type { InputDescription, JoinDescription, RiskFreeSource, SolveReport } from "../report/types.js";
import { exitCodes, type ExitCode } from "./exitCodes.js";
import { emit, wantsColour } from "./emit.js";
import type { CliIo } from "./io.js";
import { runBootstrap } from "./bootstrapRunner.js";
import { chartYChoices, writeCharts } from "./charts.js";
import { withConfig } from "./config.js";
import { createProgress } from "./progress.js";
import { describeCliIssue } from "./messages.js";
import { availableParallelism } from "node:os";
import { InvalidArgumentError } from "commander";
import { numberArgument, openUnitInterval, wholeNumber } from "./arguments.js";
import { collectPair, columnList, pairsFrom, type Pair } from "./pairs.js";
import {
  describeOptionIssue,
  inputKinds,
  automaticBandwidths,
  hacKernels,
  intervalMethods,
  intervalSources,
  longRunMethods,
  maximumSteps,
  minimumForUncertainty,
  missingPolicies,
  uncertaintyDefaults,
  solveDefaults,
  solveFormats,
  solveOptionsSchema,
  unitChoices,
  type SolveCliOptions,
} from "./options.js";
import { version } from "./version.js";

const tool = { name: "betabound", version } as const;

interface Outcome {
  readonly record: SolveRecord;
  readonly code: ExitCode;
  readonly messages: readonly string[];
}

/** Runs solve on `given` files (none or "-": standard input) for every pair and returns the exit code. */
export async function runSolve(given: readonly string[], options: SolveCliOptions, io: CliIo): Promise<ExitCode> {
  const pairs = pairsFrom(options);
  const joined = joinedSides(given, options);
  if (joined === null && given.length === 0 && io.stdinIsTerminal) {
    io.writeErr(`error: ${describeCliIssue({ code: "no-input" })}\n`);
    return exitCodes.usage;
  }
  const files = given.length === 0 ? ["-"] : given;
  const several = joined === null && files.length * pairs.length > 1;
  if (several && (options.chart !== undefined || options.report !== undefined)) {
    io.writeErr(`error: ${describeCliIssue({ code: "invalid-option", option: options.chart === undefined ? "--report" : "--chart", value: options.chart ?? options.report ?? "", expected: "draws one file and one pair; run it per pair" })}\n`);
    return exitCodes.usage;
  }
  if (several && options.format === "json") {
    io.writeErr(`error: ${describeCliIssue({ code: "invalid-option", option: "--format", value: "json", expected: "several files or pairs need --format jsonl (one record per line), csv or text" })}\n`);
    return exitCodes.usage;
  }
  const outcomes: Outcome[] = [];
  if (joined !== null) outcomes.push(await solveJoined(joined, options, io));
  else for (const file of files) outcomes.push(...(await solveFile(file, pairs, options, io)));

  const records = outcomes.map((o) => o.record);
  const single = !several && records[0]?.kind === "report" ? records[0].report : null;
  const colour = wantsColour(io, options.output, options.format);
  let text: string | null;
  if (single !== null && options.format !== "jsonl") text = renderReport(single, options.format, { colour });
  else if (options.format === "jsonl") text = renderJsonLines(records);
  else if (!several) text = null; // one pair that failed: its messages go to stderr, nothing to stdout
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

async function solveFile(file: string, pairs: readonly Pair[], options: SolveCliOptions, io: CliIo): Promise<Outcome[]> {
  const source = file === "-" ? "<stdin>" : file;
  const failAll = (code: ExitCode, errors: { code: string; message: string }[]): Outcome[] =>
    pairs.map((pair) => failed(source, pair, code, errors));
  const bytes = await io.readInput(file);
  if (!bytes.ok) return failAll(exitCodes.input, [{ code: bytes.issues.code, message: describeCliIssue(bytes.issues) }]);
  const text = decodeText(bytes.value, source);
  if (!text.ok) return failAll(exitCodes.input, inputErrors(text.issues));
  const outcomes: Outcome[] = [];
  for (const pair of pairs) outcomes.push(await solvePair(text.value, source, pair, options, io));
  return outcomes;
}

/** Standard errors and intervals as the options ask, or null with the reason as a diagnostic. */
async function uncertaintyFor(
  sample: UncertaintySample,
  solution: Solution,
  options: SolveCliOptions,
  io: CliIo,
): Promise<{ uncertainty: Uncertainty | null; note: Diagnostic | null }> {
  if (!options.uncertainty) return { uncertainty: null, note: null };
  if (solution.observations < minimumForUncertainty) {
    return {
      uncertainty: null,
      note: diagnose({ code: "uncertainty-unavailable", observations: solution.observations, minimum: minimumForUncertainty }),
    };
  }
  const hac: HacOptions = {
    kernel: options.hacKernel,
    bandwidth: options.hacBandwidth,
    prewhite: options.hacPrewhite,
    adjust: options.hacAdjust,
    ...(options.hacLags === undefined ? {} : { lags: options.hacLags }),
  };
  let bootstrapSummary: BootstrapSummary | undefined;
  if (options.bootstrap > 0) {
    const progress = createProgress(io, "bootstrap", options.bootstrap);
    bootstrapSummary = await runBootstrap(
      { ...sample, weight: options.weight },
      { replicates: options.bootstrap, blockLength: options.blockLength, seed: options.seed, confidence: options.confidence, threads: options.threads },
      (done) => progress.update(done),
    );
    progress.finish();
  }
  const uncertainty = assessUncertainty(sample, {
    weight: options.weight,
    confidence: options.confidence,
    longRun: options.longRun,
    hac,
    interval: options.interval,
    intervalSource: options.intervalSource,
    ...(bootstrapSummary === undefined ? {} : { bootstrapSummary }),
  });
  return { uncertainty, note: null };
}

async function solvePair(text: string, source: string, pair: Pair, options: SolveCliOptions, io: CliIo): Promise<Outcome> {
  const riskFree = riskFreeSource(options);
  const table = readReturns(text, readOptions(source, [pair.low, pair.high, ...riskFreeColumn(riskFree)], options));
  if (!table.ok) return failed(source, pair, exitCodes.input, inputErrors(table.issues));
  const keys = { low: pair.low, high: pair.high, riskFree: riskFree.kind === "column" ? riskFree.column : null };
  return solveTable(table.value, source, pair, keys, riskFree, null, options, io);
}

/** Columns of a table that hold the books and the risk-free return (null: constant or none). */
interface TableKeys {
  readonly low: string;
  readonly high: string;
  readonly riskFree: string | null;
}

/** Solves one aligned table whose `keys` columns hold the data; describes it as `pair` and `riskFree`. */
async function solveTable(
  table: ReturnTable,
  source: string,
  pair: Pair,
  keys: TableKeys,
  riskFree: RiskFreeSource,
  join: JoinDescription | null,
  options: SolveCliOptions,
  io: CliIo,
): Promise<Outcome> {
  const values = table.columns;
  const sample = {
    low: values.get(keys.low)!,
    high: values.get(keys.high)!,
    riskFree: keys.riskFree !== null ? values.get(keys.riskFree)! : riskFree.kind === "constant" ? riskFree.rate : 0,
  };
  const solved = solve(sample, { weight: options.weight, steps: options.steps });
  if (!solved.ok) {
    return failed(source, pair, exitCodes.input, solved.issues.map((d) => ({ code: d.code, message: `${source}: ${d.message}` })));
  }
  const { dates, dropped } = table;
  const input: InputDescription = {
    source,
    dateColumn: table.dateColumn,
    lowColumn: pair.low,
    highColumn: pair.high,
    riskFree,
    units: options.units,
    firstDate: dates[0] ?? "",
    lastDate: dates[dates.length - 1] ?? "",
    rowsRead: table.rowsRead,
    rowsDropped: dropped.count,
    droppedDates: dropped.firstDates,
    frequency: table.frequency,
    join,
  };
  const assessed = await uncertaintyFor(sample, solved.value, options, io);
  const solution = assessed.note === null ? solved.value : { ...solved.value, diagnostics: [...solved.value.diagnostics, assessed.note] };
  const report: SolveReport = { tool, input, solution, uncertainty: assessed.uncertainty };
  const messages = [
    ...table.warnings.map((w) => `warning: ${describeInputWarning(w)}\n`),
    ...solved.value.diagnostics.filter((d) => d.severity !== "info").map((d) => `${d.severity}: ${source}: ${d.message}\n`),
  ];
  return { record: { kind: "report", report }, code: solved.value.bounds === null ? exitCodes.rejected : exitCodes.ok, messages };
}

interface Side {
  readonly file: string;
  readonly column: string;
}

/** Two-file mode: no file arguments, and --low and --high both written as PATH:COLUMN (split at the last colon). */
function joinedSides(files: readonly string[], options: SolveCliOptions): { low: Side; high: Side } | null {
  if (files.length > 0 || options.low === undefined || options.high === undefined) return null;
  const side = (value: string): Side | null => {
    const at = value.lastIndexOf(":");
    return at <= 0 || at === value.length - 1 ? null : { file: value.slice(0, at), column: value.slice(at + 1) };
  };
  const low = side(options.low);
  const high = side(options.high);
  return low === null || high === null ? null : { low, high };
}

/** Reads the low book from one file and the high book from another and joins them on date. */
async function solveJoined(sides: { low: Side; high: Side }, options: SolveCliOptions, io: CliIo): Promise<Outcome> {
  const describe = (side: Side): string => (side.file === "-" ? "<stdin>" : side.file);
  const source = `${describe(sides.low)} + ${describe(sides.high)}`;
  const pair = { low: sides.low.column, high: sides.high.column };
  const riskFree = riskFreeSource(options);
  const tables: ReturnTable[] = [];
  for (const [key, side, extra] of [["low", sides.low, riskFreeColumn(riskFree)], ["high", sides.high, []]] as const) {
    const bytes = await io.readInput(side.file);
    if (!bytes.ok) return failed(source, pair, exitCodes.input, [{ code: bytes.issues.code, message: describeCliIssue(bytes.issues) }]);
    const text = decodeText(bytes.value, describe(side));
    if (!text.ok) return failed(source, pair, exitCodes.input, inputErrors(text.issues));
    const table = readReturns(text.value, readOptions(describe(side), [side.column, ...extra], options));
    if (!table.ok) return failed(source, pair, exitCodes.input, inputErrors(table.issues));
    // Both files may call their column the same ("Return"): key them by role for the join.
    const columns = new Map<string, Float64Array>([[key, table.value.columns.get(side.column)!]]);
    for (const name of extra) columns.set(`rf:${name}`, table.value.columns.get(name)!);
    tables.push({ ...table.value, columns });
  }
  const joined = joinOnDates(tables);
  if (!joined.ok) return failed(source, pair, exitCodes.input, inputErrors(joined.issues));
  const { table, dateCounts, matched, unmatched } = joined.value;
  const join: JoinDescription = {
    sides: [sides.low, sides.high].map((side, i) => ({
      source: describe(side),
      column: side.column,
      dates: dateCounts[i] ?? 0,
      unmatched: unmatched[i]?.count ?? 0,
    })),
    matched,
  };
  const keys = { low: "low", high: "high", riskFree: riskFree.kind === "column" ? `rf:${riskFree.column}` : null };
  return solveTable(table, source, pair, keys, riskFree, join, options, io);
}

function riskFreeColumn(riskFree: RiskFreeSource): string[] {
  return riskFree.kind === "column" ? [riskFree.column] : [];
}

function readOptions(source: string, columns: readonly string[], options: SolveCliOptions): ReadOptions {
  return {
    source,
    columns,
    units: options.units,
    allowExtreme: options.allowExtreme,
    sort: options.sort,
    onMissing: options.onMissing,
    input: options.input,
    decimalComma: options.decimalComma,
    ...definedOnly({
      dateColumn: options.date,
      delimiter: options.delimiter,
      block: options.block,
      dateFormat: options.dateFormat,
      periodsPerYear: options.periodsPerYear,
      missing: options.missing,
      idColumn: options.idColumn,
      valueColumn: options.valueColumn,
    }),
  };
}

/** The entries whose value is not undefined (optional properties must be absent, not undefined). */
function definedOnly<T extends Record<string, unknown>>(entries: T): { [K in keyof T]?: Exclude<T[K], undefined> } {
  return Object.fromEntries(Object.entries(entries).filter(([, v]) => v !== undefined)) as { [K in keyof T]?: Exclude<T[K], undefined> };
}

function inputErrors(issues: readonly InputIssue[]): { code: string; message: string }[] {
  return issues.map((issue) => ({ code: issue.code, message: describeInputIssue(issue) }));
}

function failed(source: string, pair: Pair, code: ExitCode, errors: readonly { code: string; message: string }[]): Outcome {
  const failure: SolveFailure = { tool, source, lowColumn: pair.low, highColumn: pair.high, errors };
  return { record: { kind: "failure", failure }, code, messages: errors.map((e) => `error: ${e.message}\n`) };
}

function riskFreeSource(options: SolveCliOptions): RiskFreeSource {
  if (options.rf === undefined) return { kind: "none" };
  const rate = parseDecimal(options.rf);
  if (rate === null) return { kind: "column", column: options.rf };
  return { kind: "constant", rate: options.units === "percent" ? rate / 100 : rate };
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
  return new Command("solve")
    .description("Sample moments, CAPM fits and the identified set of structural betas for return files.")
    .argument("[files...]", "CSV files of per-period returns, or '-' for standard input")
    .option("--low <column>", "column of the low-beta book's returns (PATH:COLUMN to read it from its own file)")
    .option("--high <column>", "column of the high-beta book's returns (PATH:COLUMN: joined with --low on date)")
    .option("--pair <low:high>", "a pair of columns to solve (repeatable)", collectPair)
    .option("--lows <columns>", "comma-separated low-beta columns: every combination with --highs", columnList)
    .option("--highs <columns>", "comma-separated high-beta columns", columnList)
    .option("--date <column>", "date column (default: the first column)")
    .addOption(new Option("--weight <w>", "weight of the low book in the market proxy, 0 < w < 1").argParser(openUnitInterval).default(solveDefaults.weight))
    .option("--rf <column|number>", "risk-free return per period: a column name or a constant (default 0)")
    .addOption(new Option("--units <units>", "units of the file's numbers").choices(unitChoices).default(solveDefaults.units))
    .addOption(new Option("--steps <n>", "number of candidates in the grid, endpoints included").argParser(wholeNumber(2, maximumSteps)).default(solveDefaults.steps))
    .addOption(new Option("--format <format>", "report format (jsonl: one record per file and pair)").choices(solveFormats).default(solveDefaults.format))
    .option("--output <path>", "write the report to this file (atomically) instead of standard output")
    .option("--allow-extreme", "accept returns above 10 (1000%) in absolute value", false)
    .option("--delimiter <char>", "field delimiter (default: detected among comma, semicolon, tab)")
    .option("--block <n>", "which table of the file when blank lines separate several (1-based)", wholeNumber(1, 1_000_000))
    .option("--date-format <layout>", "explicit date layout, e.g. DD/MM/YYYY, MM/DD/YYYY, D MMM YYYY")
    .option("--sort", "sort rows by date instead of reporting unsorted dates", false)
    .option("--decimal-comma", "numbers use a decimal comma (1,5 is 1.5; use with a semicolon or tab delimiter)", false)
    .option("--periods-per-year <n>", "override the detected frequency", numberArgument("must be a positive number", (x) => x > 0))
    .option("--missing <values>", "extra missing-value markers, comma-separated (e.g. -99.99,-999)", columnList)
    .addOption(new Option("--on-missing <policy>", "drop rows with a missing value, or treat them as errors").choices(missingPolicies).default("drop"))
    .addOption(new Option("--input <kind>", "what the numbers are").choices(inputKinds).default("returns"))
    .option("--id-column <column>", "long layout: the column naming the series (then --low/--high name series)")
    .option("--value-column <column>", "long layout: the column holding the values")
    .option("--no-uncertainty", "skip standard errors and intervals (faster on very long files)")
    .option("--confidence <level>", "confidence level of every interval", openUnitInterval, uncertaintyDefaults.confidence)
    .addOption(new Option("--long-run <method>", "long-run covariance of the moment contributions for the bounds' standard errors").choices(longRunMethods).default(uncertaintyDefaults.longRun))
    .addOption(new Option("--hac-kernel <kernel>", "HAC kernel").choices(hacKernels).default(uncertaintyDefaults.hacKernel))
    .addOption(new Option("--hac-bandwidth <rule>", "automatic HAC bandwidth rule").choices(automaticBandwidths).default(uncertaintyDefaults.hacBandwidth))
    .option("--hac-lags <n>", "fixed HAC lag truncation instead of the automatic rule", wholeNumber(0, 100_000))
    .option("--hac-prewhite", "VAR(1) prewhitening before the HAC kernel", false)
    .option("--hac-adjust", "small-sample factor T/(T - k) on the CAPM HAC covariances", false)
    .addOption(new Option("--interval <method>", "confidence interval for the structural betas").choices(intervalMethods).default(uncertaintyDefaults.interval))
    .addOption(new Option("--interval-source <source>", "standard errors of the bounds: delta method or bootstrap").choices(intervalSources).default(uncertaintyDefaults.intervalSource))
    .addOption(
      new Option("--bootstrap [replicates]", `stationary bootstrap replicates (${uncertaintyDefaults.bootstrapReplicates} when no number is given; 0 = off)`)
        .argParser(wholeNumber(0, 10_000_000))
        .preset(uncertaintyDefaults.bootstrapReplicates)
        .default(0),
    )
    .option("--block-length <b|auto>", "mean block length of the bootstrap (auto: Politis-White)", blockLengthArgument, "auto" as const)
    .option("--seed <n>", "seed of the bootstrap (the same seed gives the same intervals)", wholeNumber(0, Number.MAX_SAFE_INTEGER), uncertaintyDefaults.seed)
    .option("--threads <n>", "worker threads for the bootstrap (results do not depend on it)", wholeNumber(1, 256), defaultThreads())
    .option("--chart <file.svg>", "also draw the identified set as an SVG chart")
    .addOption(new Option("--chart-y <quantity>", "what the chart's y axis shows").choices(chartYChoices).default("variance"))
    .option("--report <file.html>", "also write a self-contained HTML report with the tables and the chart")
    .option("--config <file>", "JSON file with files, pairs and options for a job; flags override it")
    .addHelpText("after", solveExamples)
    .action(async (given: string[], _raw: Record<string, unknown>, command: Command) => {
      const job = await withConfig(command, given, io);
      if (!job.ok) {
        io.writeErr(`error: ${describeCliIssue(job.issues)}\n`);
        setExit(exitCodes.usage);
        return;
      }
      const { files, options: raw } = job.value;
      const parsed = solveOptionsSchema.safeParse(raw);
      if (!parsed.success) {
        io.writeErr(`error: ${describeOptionIssue(parsed.error)}\n`);
        setExit(exitCodes.usage);
        return;
      }
      setExit(await runSolve(files, parsed.data, io));
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
