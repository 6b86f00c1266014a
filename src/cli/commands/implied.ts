/**
 * `betabound implied`: what a structure implies for everything `solve` estimates (population values),
 * with the same report formats and JSON field names.
 */
import { Command, Option } from "commander";
import { implied } from "../../core/forward/implied.js";
import { renderImplied } from "../../report/impliedReport.js";
import { anyNumber, nonNegativeNumber, openUnitInterval, positiveNumber, wholeNumber } from "../arguments.js";
import { exitCodes, type ExitCode } from "../runtime/exitCodes.js";
import type { CliIo } from "../runtime/io.js";
import { emit, wantsColour } from "../emit.js";
import {
  describeOptionIssue,
  impliedOptionsSchema,
  maximumSteps,
  reportFormats,
  solveDefaults,
  type ImpliedCliOptions,
} from "../options.js";
import { version } from "../runtime/version.js";

export async function runImplied(options: ImpliedCliOptions, io: CliIo): Promise<ExitCode> {
  const { steps, format, output, rf, ...structure } = options;
  const solution = implied(structure, steps);
  const colour = wantsColour(io, output, format);
  const text = renderImplied({ tool: { name: "betabound", version }, solution, riskFree: rf }, format, { colour });
  const written = await emit(io, output, text);
  if (written !== exitCodes.ok) return written;
  return solution.bounds === null ? exitCodes.rejected : exitCodes.ok;
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
  return new Command("implied")
    .description("What a structure (per period, decimal) implies: moments, CAPM betas and alphas, the identified set.")
    .requiredOption("--low-beta <b>", "structural beta of the low book (0 < b < 1/w)", positiveNumber)
    .requiredOption("--factor-vol <sd>", "standard deviation of the latent factor per period", positiveNumber)
    .option("--factor-mean <m>", "mean excess return of the factor per period", anyNumber, 0)
    .requiredOption("--low-noise-vol <sd>", "standard deviation of the low book's noise", nonNegativeNumber)
    .requiredOption("--high-noise-vol <sd>", "standard deviation of the high book's noise", nonNegativeNumber)
    .option("--weight <w>", "weight of the low book in the market proxy", openUnitInterval, solveDefaults.weight)
    .option("--rf <r>", "risk-free return per period (moments are of excess returns; it sets the raw means)", anyNumber, 0)
    .option("--steps <n>", "number of candidates in the grid, endpoints included", wholeNumber(2, maximumSteps), solveDefaults.steps)
    .addOption(new Option("--format <format>", "report format").choices(reportFormats).default(solveDefaults.format))
    .option("--output <path>", "write the report to this file (atomically) instead of standard output")
    .addHelpText("after", impliedExamples)
    .action(async (raw: Record<string, unknown>) => {
      const parsed = impliedOptionsSchema().safeParse(raw);
      if (!parsed.success) {
        io.writeErr(`error: ${describeOptionIssue(parsed.error)}\n`);
        setExit(exitCodes.usage);
        return;
      }
      setExit(await runImplied(parsed.data, io));
    });
}
