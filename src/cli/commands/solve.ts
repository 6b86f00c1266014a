/**
 * `betabound solve`: the solve job (src/jobs/solveJob.ts) on the files and options of the command
 * line, rendered in the asked format and written once. Exit code: that of the single record, or for
 * several records 0 when all succeeded and `partial` otherwise.
 */
import { availableParallelism } from "node:os";
import { Command } from "commander";
import { defaultThreads, type PairStatus, runShape, type SolvedPair, solveOptions, solvePlanned } from "../../jobs/index.js";
import type { CommandOptionsInput, OptionIssue } from "../../options/index.js";
import { documentLinePieces, renderRecordsCsv, renderRecordsText } from "../../report/records.js";
import { renderReport } from "../../report/render.js";
import { renderSummaryCsv } from "../../report/summaryCsv.js";
import { addTableOptions } from "../commandOptions.js";
import { withConfig } from "../config.js";
import { outputFailed, usage, waitsOnTerminal, wantsColour } from "../emit.js";
import { jobContext } from "../jobContext.js";
import { writeMessages } from "../jobMessages.js";
import { describeCliIssue, describeOptionIssue } from "../messages.js";
import { type ExitCode, exitCodes } from "../runtime/exitCodes.js";
import { type CliIo, type OutputText, writeOutputs } from "../runtime/io.js";
import { outputClash } from "../outputPaths.js";
import { drawCharts } from "./charts.js";

const severalJobsAsJson: OptionIssue = {
  code: "options-conflict",
  option: "format",
  value: "json",
  message: "several jobs need --format jsonl (one record per line), csv, summary-csv or text",
};
const severalJobsDrawn: OptionIssue = {
  code: "options-conflict",
  option: "report",
  message: "draws one file and one pair; run it per pair",
};

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
  return runSolveJobs([{ files, flags }], io, configFile);
}

/**
 * Runs the jobs of one run (a config file's "jobs", or the one job of the command line) into one output:
 * every job's options are checked before anything is read, each job's pairs are solved on its own files,
 * and the records follow in job order.
 */
export async function runSolveJobs(
  jobs: readonly { readonly files: readonly string[]; readonly flags: Readonly<Record<string, unknown>> }[],
  io: CliIo,
  configFile?: string,
): Promise<ExitCode> {
  const plans = [];
  for (const { files, flags } of jobs) {
    const input = { threads: defaultThreads(availableParallelism()), ...flags } as CommandOptionsInput<"solve">;
    const plan = solveOptions(files, input);
    if (!plan.ok) return usage(io, describeOptionIssue(plan.issues));
    const shape = runShape(files, plan.value.options);
    if (waitsOnTerminal(io, files, shape)) return usage(io, describeCliIssue({ code: "no-input" }));
    plans.push({ files, plan: plan.value, shape });
  }
  const [lead] = plans;
  if (lead === undefined) return usage(io, describeCliIssue({ code: "no-input" }));
  const options = lead.plan.options;
  if (plans.length > 1 && options.format === "json") return usage(io, describeOptionIssue(severalJobsAsJson));
  if (plans.length > 1 && (options.chart !== undefined || options.report !== undefined))
    return usage(io, describeOptionIssue(severalJobsDrawn));
  const reads = plans.flatMap((p) => p.shape.reads);
  const clash = outputClash(io, configFile === undefined ? reads : [...reads, configFile], options);
  if (clash !== null) return usage(io, describeCliIssue(clash));
  const pairs: SolvedPair[] = [];
  for (const { files, plan } of plans) pairs.push(...(await solvePlanned(files, plan, jobContext(io))).pairs);
  const several = plans.length > 1 || lead.plan.several;
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
  const brief = options.brief;
  let text: OutputText;
  if (options.format === "summary-csv") text = renderSummaryCsv(pairs.map((p) => p.document));
  else if (single !== null && options.format !== "jsonl") text = renderReport(single, options.format, { colour, brief });
  // The job's documents are what renderJsonLines makes of the records, already checked: not made again.
  else if (options.format === "jsonl") text = documentLinePieces(pairs.map((p) => p.document));
  else text = options.format === "csv" ? renderRecordsCsv(records) : renderRecordsText(records, { colour, brief });

  // The chart, the HTML report and the output are written as one: a failure of any replaces none.
  const charts = single === null ? [] : await drawCharts(single, options, io);
  const written = await writeOutputs(io, [...charts, { path: options.output, text }]);
  if (!written.ok) return outputFailed(io, written.issues);
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
      const jobs = job.value.jobs.map((j) => ({ files: j.files, flags: j.options }));
      setExit(await runSolveJobs(jobs, io, job.value.configFile));
    });
}
