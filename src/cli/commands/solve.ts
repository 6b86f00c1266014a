/**
 * `betabound solve`: the solve job (src/jobs/solveJob.ts) on the files and options of the command
 * line, rendered in the asked format and written once. Exit code: that of the single record, or for
 * several records 0 when all succeeded and `partial` otherwise.
 */
import { availableParallelism } from "node:os";
import { Command } from "commander";
import { defaultThreads, type PairStatus, runShape, solveOptions, solvePlanned } from "../../jobs/index.js";
import type { CommandOptionsInput } from "../../options/index.js";
import { renderJsonLines, renderRecordsCsv, renderRecordsText } from "../../report/records.js";
import { renderReport } from "../../report/render.js";
import { renderSummaryCsv } from "../../report/summaryCsv.js";
import { addTableOptions } from "../commandOptions.js";
import { withConfig } from "../config.js";
import { emit, usage, waitsOnTerminal, wantsColour } from "../emit.js";
import { jobContext } from "../jobContext.js";
import { writeMessages } from "../jobMessages.js";
import { describeCliIssue, describeOptionIssue } from "../messages.js";
import { type ExitCode, exitCodes } from "../runtime/exitCodes.js";
import type { CliIo } from "../runtime/io.js";
import { outputClash } from "../outputPaths.js";
import { writeCharts } from "./charts.js";

/** The exit code of one (file, pair). */
export const pairExitCode: Readonly<Record<PairStatus, ExitCode>> = {
  ok: exitCodes.ok,
  rejected: exitCodes.rejected,
  failed: exitCodes.input,
};

/** Runs solve on `files` (none or "-": standard input) with the parsed flags and returns the exit code. */
export async function runSolve(
  files: readonly string[],
  flags: Readonly<Record<string, unknown>>,
  io: CliIo,
  configFile?: string,
): Promise<ExitCode> {
  const input = { threads: defaultThreads(availableParallelism()), ...flags } as CommandOptionsInput<"solve">;
  const plan = solveOptions(files, input);
  if (!plan.ok) return usage(io, describeOptionIssue(plan.issues));
  const options = plan.value.options;
  const shape = runShape(files, options);
  if (waitsOnTerminal(io, files, shape)) return usage(io, describeCliIssue({ code: "no-input" }));
  const clash = outputClash(io, configFile === undefined ? shape.reads : [...shape.reads, configFile], options);
  if (clash !== null) return usage(io, describeCliIssue(clash));
  const { pairs, several } = await solvePlanned(files, plan.value, jobContext(io));
  // Nothing is written when no pair could be read: the messages say why, and outputs stay as they were.
  const seen = new Set<string>();
  if (pairs.every((p) => p.status === "failed")) {
    for (const pair of pairs) writeMessages(io, pair.messages, seen);
    return exitCodes.input;
  }

  const records = pairs.map((p) => p.record);
  const first = records[0];
  const single = !several && first?.kind === "report" ? first.report : null;
  const colour = wantsColour(io, options.output, options.format);
  let text: string;
  if (options.format === "summary-csv") text = renderSummaryCsv(pairs.map((p) => p.document));
  else if (single !== null && options.format !== "jsonl") text = renderReport(single, options.format, { colour });
  else if (options.format === "jsonl") text = renderJsonLines(records);
  else text = options.format === "csv" ? renderRecordsCsv(records) : renderRecordsText(records, { colour });

  if (single !== null) {
    const drawn = await writeCharts(single, options, io);
    if (drawn !== exitCodes.ok) return drawn;
  }
  const written = await emit(io, options.output, text);
  if (written !== exitCodes.ok) return written;
  // Reports carry their diagnostics; repeat them on stderr unless a text report is on the terminal
  // (reading warnings always, once per file).
  const reportOnTerminal = options.output === undefined && io.stdoutIsTerminal && options.format === "text";
  for (const pair of pairs) writeMessages(io, pair.messages, seen, pair.status !== "failed" && reportOnTerminal);
  if (!several) return pairExitCode[pairs[0]?.status ?? "failed"];
  return pairs.every((p) => p.status === "ok") ? exitCodes.ok : exitCodes.partial;
}

const solveExamples = `
Examples:
  $ betabound solve returns.csv --low "Low Vol Fund" --high "High Beta Fund"
  $ betabound solve returns.csv --low LOW --high HIGH --rf TBILL --units percent --format json
  $ cat returns.csv | betabound solve - --low LOW --high HIGH --steps 21 --format csv --output grid.csv
  $ betabound solve desk-a.csv desk-b.csv --lows LV1,LV2 --highs HB1 --format jsonl > pairs.jsonl
  $ betabound solve --low calm.csv:Return --high bold.csv:Return --rf 0.0001
  $ betabound solve funds.csv --all-pairs FUND1,FUND2,FUND3 --format summary-csv > pairs.csv
  $ betabound solve returns.csv --low LOW --high HIGH --chart set.svg --report report.html
`;

/** The commander definition of `solve`. */
export function solveCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  const command = new Command("solve")
    .description("Sample moments, CAPM fits and the identified set of structural betas for return files.")
    .argument("[files...]", "CSV files of per-period returns, or '-' for standard input");
  return addTableOptions(command, "solve")
    .addHelpText("after", solveExamples)
    .action(async (given: string[], _raw: Record<string, unknown>, self: Command) => {
      const job = await withConfig(self, "solve", given, io);
      if (!job.ok) return setExit(usage(io, describeCliIssue(job.issues)));
      setExit(await runSolve(job.value.files, job.value.options, io, job.value.configFile));
    });
}
