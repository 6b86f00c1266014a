/**
 * `betabound solve`: for every file and every (low, high) pair, read, solve the identified set and
 * render; then write everything once. A pair that fails yields a failure record and does not stop
 * the others. Exit code: that of the single record, or for several records 0 when all succeeded and
 * `partial` otherwise.
 */
import { Command, Option } from "commander";
import { solve } from "../core/solve.js";
import { decodeText } from "../input/decodeText.js";
import { describeInputIssue, describeInputWarning, type InputIssue } from "../input/issues.js";
import { parseDecimal } from "../input/numbers.js";
import type { ReadOptions } from "../input/options.js";
import { readReturns } from "../input/readReturns.js";
import { renderRecordsCsv, renderRecordsText, renderJsonLines, type SolveFailure, type SolveRecord } from "../report/records.js";
import { renderReport } from "../report/render.js";
import type { InputDescription, RiskFreeSource, SolveReport } from "../report/types.js";
import { exitCodes, type ExitCode } from "./exitCodes.js";
import { emit, wantsColour } from "./emit.js";
import type { CliIo } from "./io.js";
import { withConfig } from "./config.js";
import { describeCliIssue } from "./messages.js";
import { numberArgument, openUnitInterval, wholeNumber } from "./arguments.js";
import { collectPair, columnList, pairsFrom, type Pair } from "./pairs.js";
import {
  describeOptionIssue,
  inputKinds,
  maximumSteps,
  missingPolicies,
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

/** Runs solve on `files` ("-" for standard input) for every pair and returns the exit code. */
export async function runSolve(files: readonly string[], options: SolveCliOptions, io: CliIo): Promise<ExitCode> {
  const pairs = pairsFrom(options);
  const several = files.length * pairs.length > 1;
  if (several && options.format === "json") {
    io.writeErr(`error: ${describeCliIssue({ code: "invalid-option", option: "--format", value: "json", expected: "several files or pairs need --format jsonl (one record per line), csv or text" })}\n`);
    return exitCodes.usage;
  }
  const outcomes: Outcome[] = [];
  for (const file of files) outcomes.push(...(await solveFile(file, pairs, options, io)));

  const records = outcomes.map((o) => o.record);
  const single = !several && records[0]?.kind === "report" ? records[0].report : null;
  const colour = wantsColour(io, options.output, options.format);
  let text: string | null;
  if (single !== null && options.format !== "jsonl") text = renderReport(single, options.format, { colour });
  else if (options.format === "jsonl") text = renderJsonLines(records);
  else if (!several) text = null; // one pair that failed: its messages go to stderr, nothing to stdout
  else text = options.format === "csv" ? renderRecordsCsv(records) : renderRecordsText(records, { colour });

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
  return pairs.map((pair) => solvePair(text.value, source, pair, options));
}

function solvePair(text: string, source: string, pair: Pair, options: SolveCliOptions): Outcome {
  const riskFree = riskFreeSource(options);
  const table = readReturns(text, readOptions(source, pair, riskFree, options));
  if (!table.ok) return failed(source, pair, exitCodes.input, inputErrors(table.issues));
  const values = table.value.columns;
  const solved = solve(
    {
      low: values.get(pair.low)!,
      high: values.get(pair.high)!,
      riskFree: riskFree.kind === "column" ? values.get(riskFree.column)! : riskFree.kind === "constant" ? riskFree.rate : 0,
    },
    { weight: options.weight, steps: options.steps },
  );
  if (!solved.ok) {
    return failed(source, pair, exitCodes.input, solved.issues.map((d) => ({ code: d.code, message: `${source}: ${d.message}` })));
  }
  const { dates, dropped } = table.value;
  const input: InputDescription = {
    source,
    dateColumn: table.value.dateColumn,
    lowColumn: pair.low,
    highColumn: pair.high,
    riskFree,
    units: options.units,
    firstDate: dates[0] ?? "",
    lastDate: dates[dates.length - 1] ?? "",
    rowsRead: table.value.rowsRead,
    rowsDropped: dropped.count,
    droppedDates: dropped.firstDates,
    frequency: table.value.frequency,
  };
  const report: SolveReport = { tool, input, solution: solved.value };
  const messages = [
    ...table.value.warnings.map((w) => `warning: ${describeInputWarning(w)}\n`),
    ...solved.value.diagnostics.filter((d) => d.severity !== "info").map((d) => `${d.severity}: ${source}: ${d.message}\n`),
  ];
  return { record: { kind: "report", report }, code: solved.value.bounds === null ? exitCodes.rejected : exitCodes.ok, messages };
}

function readOptions(source: string, pair: Pair, riskFree: RiskFreeSource, options: SolveCliOptions): ReadOptions {
  return {
    source,
    columns: [pair.low, pair.high, ...(riskFree.kind === "column" ? [riskFree.column] : [])],
    units: options.units,
    allowExtreme: options.allowExtreme,
    sort: options.sort,
    onMissing: options.onMissing,
    input: options.input,
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
`;

/** The commander definition of `solve`. */
export function solveCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  return new Command("solve")
    .description("Sample moments, CAPM fits and the identified set of structural betas for return files.")
    .argument("[files...]", "CSV files of per-period returns, or '-' for standard input")
    .option("--low <column>", "column of the low-beta book's returns")
    .option("--high <column>", "column of the high-beta book's returns")
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
    .option("--periods-per-year <n>", "override the detected frequency", numberArgument("must be a positive number", (x) => x > 0))
    .option("--missing <values>", "extra missing-value markers, comma-separated (e.g. -99.99,-999)", columnList)
    .addOption(new Option("--on-missing <policy>", "drop rows with a missing value, or treat them as errors").choices(missingPolicies).default("drop"))
    .addOption(new Option("--input <kind>", "what the numbers are").choices(inputKinds).default("returns"))
    .option("--id-column <column>", "long layout: the column naming the series (then --low/--high name series)")
    .option("--value-column <column>", "long layout: the column holding the values")
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
      if (files.length === 0 && io.stdinIsTerminal) {
        io.writeErr(`error: ${describeCliIssue({ code: "no-input" })}\n`);
        setExit(exitCodes.usage);
        return;
      }
      setExit(await runSolve(files.length === 0 ? ["-"] : files, parsed.data, io));
    });
}
