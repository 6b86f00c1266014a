/**
 * `betabound solve`: read one file, solve the identified set, render, write. Each step returns a
 * typed outcome; `run` maps it to a message and an exit code.
 */
import { Command, Option } from "commander";
import { solve } from "../core/solve.js";
import type { Diagnostic } from "../core/diagnostics.js";
import { describeInputIssue, type InputIssue } from "../input/issues.js";
import { parseDecimal } from "../input/numbers.js";
import { readReturns } from "../input/readReturns.js";
import { renderReport } from "../report/render.js";
import type { InputDescription, RiskFreeSource, SolveReport } from "../report/types.js";
import { exitCodes, type ExitCode } from "./exitCodes.js";
import { emit, wantsColour } from "./emit.js";
import type { CliIo } from "./io.js";
import { describeCliIssue } from "./messages.js";
import { openUnitInterval, wholeNumber } from "./arguments.js";
import { maximumSteps, reportFormats, describeOptionIssue, solveDefaults, solveOptionsSchema, unitChoices, type SolveCliOptions } from "./options.js";
import { version } from "./version.js";

/** Runs solve on `file` ("-" for standard input) and returns the exit code. */
export async function runSolve(file: string, options: SolveCliOptions, io: CliIo): Promise<ExitCode> {
  const source = file === "-" ? "<stdin>" : file;
  const bytes = await io.readInput(file);
  if (!bytes.ok) return fail(io, describeCliIssue(bytes.issues), exitCodes.input);
  const text = new TextDecoder("utf-8").decode(bytes.value);

  const riskFree = riskFreeSource(options);
  const columns = [options.low, options.high, ...(riskFree.kind === "column" ? [riskFree.column] : [])];
  const table = readReturns(text, {
    source,
    columns,
    units: options.units,
    allowExtreme: options.allowExtreme,
    ...(options.date === undefined ? {} : { dateColumn: options.date }),
  });
  if (!table.ok) return failInput(io, table.issues);

  const { columns: values } = table.value;
  const solved = solve(
    {
      low: values.get(options.low)!,
      high: values.get(options.high)!,
      riskFree: riskFree.kind === "column" ? values.get(riskFree.column)! : riskFree.kind === "constant" ? riskFree.rate : 0,
    },
    { weight: options.weight, steps: options.steps },
  );
  if (!solved.ok) return failDiagnostics(io, source, solved.issues);

  const { dates, dropped } = table.value;
  const input: InputDescription = {
    source,
    dateColumn: table.value.dateColumn,
    lowColumn: options.low,
    highColumn: options.high,
    riskFree,
    units: options.units,
    firstDate: dates[0] ?? "",
    lastDate: dates[dates.length - 1] ?? "",
    rowsRead: table.value.rowsRead,
    rowsDropped: dropped.count,
    droppedDates: dropped.firstDates,
    frequency: table.value.frequency,
  };
  const report: SolveReport = { tool: { name: "betabound", version }, input, solution: solved.value };
  const toTerminal = options.output === undefined && io.stdoutIsTerminal;
  const colour = wantsColour(io, options.output, options.format);
  const rendered = renderReport(report, options.format, { colour });

  const written = await emit(io, options.output, rendered);
  if (written !== exitCodes.ok) return written;
  // Diagnostics are in the report; repeat them on stderr when the report itself is not on a terminal.
  if (!toTerminal || options.format !== "text") {
    for (const d of solved.value.diagnostics) if (d.severity !== "info") io.writeErr(`${d.severity}: ${d.message}\n`);
  }
  return solved.value.bounds === null ? exitCodes.rejected : exitCodes.ok;
}

function riskFreeSource(options: SolveCliOptions): RiskFreeSource {
  if (options.rf === undefined) return { kind: "none" };
  const rate = parseDecimal(options.rf);
  if (rate === null) return { kind: "column", column: options.rf };
  return { kind: "constant", rate: options.units === "percent" ? rate / 100 : rate };
}

function fail(io: CliIo, message: string, code: ExitCode): ExitCode {
  io.writeErr(`error: ${message}\n`);
  return code;
}

function failInput(io: CliIo, issues: readonly InputIssue[]): ExitCode {
  for (const issue of issues) io.writeErr(`error: ${describeInputIssue(issue)}\n`);
  return exitCodes.input;
}

function failDiagnostics(io: CliIo, source: string, diagnostics: readonly Diagnostic[]): ExitCode {
  for (const d of diagnostics) io.writeErr(`error: ${source}: ${d.message}\n`);
  return exitCodes.input;
}

const solveExamples = `
Examples:
  $ betabound solve returns.csv --low "Low Vol Fund" --high "High Beta Fund"
  $ betabound solve returns.csv --low LOW --high HIGH --rf TBILL --units percent --format json
  $ cat returns.csv | betabound solve - --low LOW --high HIGH --steps 21 --format csv --output grid.csv
`;

/** The commander definition of `solve`. */
export function solveCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  return new Command("solve")
    .description("Sample moments, CAPM fits and the identified set of structural betas for one return file.")
    .argument("[file]", "CSV file of per-period returns, or '-' for standard input")
    .requiredOption("--low <column>", "column of the low-beta book's returns")
    .requiredOption("--high <column>", "column of the high-beta book's returns")
    .option("--date <column>", "date column (default: the first column)")
    .addOption(
      new Option("--weight <w>", "weight of the low book in the market proxy, 0 < w < 1")
        .argParser(openUnitInterval)
        .default(solveDefaults.weight),
    )
    .option("--rf <column|number>", "risk-free return per period: a column name or a constant (default 0)")
    .addOption(new Option("--units <units>", "units of the file's numbers").choices(unitChoices).default(solveDefaults.units))
    .addOption(
      new Option("--steps <n>", "number of candidates in the grid, endpoints included")
        .argParser(wholeNumber(2, maximumSteps))
        .default(solveDefaults.steps),
    )
    .addOption(new Option("--format <format>", "report format").choices(reportFormats).default(solveDefaults.format))
    .option("--output <path>", "write the report to this file (atomically) instead of standard output")
    .option("--allow-extreme", "accept returns above 10 (1000%) in absolute value", false)
    .addHelpText("after", solveExamples)
    .action(async (file: string | undefined, raw: Record<string, unknown>) => {
      const parsed = solveOptionsSchema.safeParse(raw);
      if (!parsed.success) {
        io.writeErr(`error: ${describeOptionIssue(parsed.error)}\n`);
        setExit(exitCodes.usage);
        return;
      }
      if (file === undefined && io.stdinIsTerminal) {
        io.writeErr(`error: ${describeCliIssue({ code: "no-input" })}\n`);
        setExit(exitCodes.usage);
        return;
      }
      setExit(await runSolve(file ?? "-", parsed.data, io));
    });
}
