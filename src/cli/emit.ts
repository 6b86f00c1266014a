/** Writes a command's output to standard output, or atomically to `--output`, and says how it went. */
import { type CliIssue, describeCliIssue } from "./messages.js";
import { exitCodes, type ExitCode } from "./runtime/exitCodes.js";
import { type CliIo, type OutputText, writeOutput } from "./runtime/io.js";

export async function emit(io: CliIo, output: string | undefined, text: OutputText): Promise<ExitCode> {
  const written = await writeOutput(io, output, text);
  return written.ok ? exitCodes.ok : outputFailed(io, written.issues);
}

/** Reports an output that could not be written and gives its exit code. */
export function outputFailed(io: CliIo, issue: CliIssue): ExitCode {
  io.writeErr(`error: ${describeCliIssue(issue)}\n`);
  return exitCodes.output;
}

/** Colour only for a text report going to a terminal, and never when NO_COLOR is set (non-empty). */
export function wantsColour(io: CliIo, output: string | undefined, format: string): boolean {
  const noColour = io.env.NO_COLOR;
  return output === undefined && io.stdoutIsTerminal && format === "text" && (noColour === undefined || noColour === "");
}

/**
 * True when a run would read standard input and standard input is the terminal: nobody is piping
 * data in, so the run would wait for typing. (`files` empty means standard input.)
 */
export function waitsOnTerminal(io: CliIo, files: readonly string[], shape: { readonly joined: boolean }): boolean {
  return !shape.joined && files.length === 0 && io.stdinIsTerminal;
}

/** Reports a command-line problem on stderr and gives the usage exit code. */
export function usage(io: CliIo, message: string): ExitCode {
  io.writeErr(`error: ${message}\n`);
  return exitCodes.usage;
}
