/**
 * `betabound implied`: the implied job (src/jobs/impliedJob.ts): what a structure implies for everything
 * `solve` estimates (population values), with the same report formats and JSON field names.
 */
import { Command } from "commander";
import { impliedJob } from "../../jobs/index.js";
import type { CommandOptionsInput } from "../../options/index.js";
import { renderImplied } from "../../report/impliedReport.js";
import { addTableOptions } from "../commandOptions.js";
import { emit, usage, wantsColour } from "../emit.js";
import { describeCliIssue, describeOptionIssue } from "../messages.js";
import { outputClash } from "../outputPaths.js";
import { type ExitCode, exitCodes } from "../runtime/exitCodes.js";
import type { CliIo } from "../runtime/io.js";

export async function runImplied(flags: Readonly<Record<string, unknown>>, io: CliIo): Promise<ExitCode> {
  const job = impliedJob(flags as CommandOptionsInput<"implied">);
  if (!job.ok) return usage(io, describeOptionIssue(job.issues));
  // No input to protect, but an output that names a folder is refused as solve and roll refuse it (exit 1).
  const clash = outputClash(io, [], job.value.options);
  if (clash !== null) return usage(io, describeCliIssue(clash));
  const { options, report, status } = job.value;
  const text = renderImplied(report, options.format, { colour: wantsColour(io, options.output, options.format) });
  const written = await emit(io, options.output, text);
  if (written !== exitCodes.ok) return written;
  return status === "rejected" ? exitCodes.rejected : exitCodes.ok;
}

const impliedExamples = `
Examples:
  $ betabound implied --low-beta 0.72 --factor-vol 0.045 --factor-mean 0.006 \\
      --low-noise-vol 0.014 --high-noise-vol 0.022
  $ betabound implied --low-beta 0.9 --factor-vol 0.01 --low-noise-vol 0.002 --high-noise-vol 0.008 \\
      --weight 0.4 --format json
`;

/** The commander definition of `implied`. */
export function impliedCommand(io: CliIo, setExit: (code: ExitCode) => void): Command {
  const command = new Command("implied").description(
    "What a structure (per period, decimal) implies: moments, CAPM betas and alphas, the identified set.",
  );
  return addTableOptions(command, "implied")
    .addHelpText("after", impliedExamples)
    .action(async (flags: Record<string, unknown>) => setExit(await runImplied(flags, io)));
}
