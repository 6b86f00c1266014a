/**
 * `betabound simulate`: the simulate job (src/jobs/simulateJob.ts): a sample drawn from a structure,
 * written as CSV that `solve` reads as it is, or as JSON Lines. The same options and seed give the
 * same bytes.
 */
import { Command } from "commander";
import { simulateJob } from "../../jobs/index.js";
import type { CommandOptionsInput } from "../../options/index.js";
import { sampleCsv, sampleJsonLines } from "../../report/simulatedSample.js";
import { addTableOptions } from "../commandOptions.js";
import { emit, usage } from "../emit.js";
import { describeCliIssue, describeOptionIssue } from "../messages.js";
import { outputClash } from "../outputPaths.js";
import type { ExitCode } from "../runtime/exitCodes.js";
import type { CliIo } from "../runtime/io.js";

export async function runSimulate(flags: Readonly<Record<string, unknown>>, io: CliIo): Promise<ExitCode> {
  const job = simulateJob(flags as CommandOptionsInput<"simulate">);
  if (!job.ok) return usage(io, describeOptionIssue(job.issues));
  // No input to protect, but an output that names a folder is refused as solve and roll refuse it (exit 1).
  const clash = outputClash(io, [], job.value.options);
  if (clash !== null) return usage(io, describeCliIssue(clash));
  const { options, sample } = job.value;
  const text = options.format === "csv" ? sampleCsv(sample, options.digits) : sampleJsonLines(sample, options.digits);
  return emit(io, options.output, text);
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
  const command = new Command("simulate").description(
    "Draw a return sample from a structure (per period, decimal units) as CSV or JSON Lines.",
  );
  return addTableOptions(command, "simulate")
    .addHelpText("after", simulateExamples)
    .action(async (flags: Record<string, unknown>) => setExit(await runSimulate(flags, io)));
}
