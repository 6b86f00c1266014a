/** Writes a command's output to standard output, or atomically to `--output`, and says how it went. */
import { exitCodes, type ExitCode } from "./runtime/exitCodes.js";
import type { CliIo } from "./runtime/io.js";
import { describeCliIssue } from "./messages.js";

export async function emit(io: CliIo, output: string | undefined, text: string): Promise<ExitCode> {
  if (output === undefined) {
    io.writeOut(text);
    return exitCodes.ok;
  }
  const written = await io.writeOutput(output, text);
  if (written.ok) return exitCodes.ok;
  io.writeErr(`error: ${describeCliIssue(written.issues)}\n`);
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
