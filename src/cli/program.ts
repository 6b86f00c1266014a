/**
 * The command-line program. `run(argv, io)` parses, validates and dispatches, and returns the exit
 * code; it never calls process.exit, so tests drive it in process.
 */
import { Command, CommanderError } from "commander";
import en from "zod/v4/locales/en.js";
import * as z from "zod/mini";
import { exitCodes, type ExitCode } from "./runtime/exitCodes.js";
import { impliedCommand } from "./commands/implied.js";
import type { CliIo } from "./runtime/io.js";
import { rollCommand } from "./commands/roll.js";
import { schemaCommand } from "./commands/schema.js";
import { simulateCommand } from "./commands/simulate.js";
import { solveCommand } from "./commands/solve.js";
import { version } from "../jobs/index.js";

// The CLI's own zod settings (the library never changes its caller's): English messages for the few
// structural issues that have no message of their own (every option value's comes from its kind),
// and no compiled fast path, which costs more to build than it saves when a run parses its options once.
z.config({ ...en(), jitless: true });

type CommandBuilder = (io: CliIo, setExit: (code: ExitCode) => void) => Command;

/** The commands in help order. */
const commands: readonly (readonly [string, CommandBuilder])[] = [
  ["solve", solveCommand],
  ["roll", rollCommand],
  ["implied", impliedCommand],
  ["simulate", simulateCommand],
  ["schema", schemaCommand],
];

/**
 * The program; when argv names a command, only that one is built (each definition costs start-up
 * time), otherwise all of them, for the help listing and the "did you mean" suggestions.
 */
function buildProgram(io: CliIo, setExit: (code: ExitCode) => void, first: string | undefined): Command {
  const program = new Command("betabound")
    .description("Bounds on structural betas and noise variances for a low-beta / high-beta portfolio pair.")
    .version(version, "-V, --version")
    .showSuggestionAfterError(true)
    .configureOutput({ writeOut: io.writeOut, writeErr: io.writeErr })
    .exitOverride();
  const named = commands.filter(([name]) => name === first);
  for (const [, build] of named.length === 1 ? named : commands) program.addCommand(build(io, setExit));
  return program;
}

/** Parses `argv` (without the node and script entries), runs the command and returns its exit code. */
export async function run(argv: readonly string[], io: CliIo): Promise<ExitCode> {
  let exitCode: ExitCode = exitCodes.ok;
  const program = buildProgram(
    io,
    (code) => {
      exitCode = code;
    },
    argv[0],
  );
  for (const command of program.commands) command.exitOverride().configureOutput({ writeOut: io.writeOut, writeErr: io.writeErr });
  // No command at all: the help, on stderr (nothing was asked for stdout), and a usage exit code.
  if (argv.length === 0) {
    io.writeErr(program.helpInformation());
    return exitCodes.usage;
  }
  try {
    await program.parseAsync([...argv], { from: "user" });
  } catch (error) {
    if (error instanceof CommanderError) {
      const helpOrVersion = ["commander.helpDisplayed", "commander.version", "commander.help"].includes(error.code);
      return helpOrVersion ? exitCodes.ok : exitCodes.usage;
    }
    throw error;
  }
  return exitCode;
}
