/**
 * The exit codes of every command: one table, documented in the README. 0 only when the job fully
 * succeeded; warnings do not change the code. A run ended by a signal (SIGINT, SIGTERM, SIGHUP and
 * the others of signals.ts) exits with 128 + the signal's number (main.ts).
 */
export const exitCodes = {
  /** The job succeeded (diagnostics of severity warning or info may have been reported). */
  ok: 0,
  /** The command line is invalid: unknown command or option, bad option value, missing input. */
  usage: 1,
  /** The input cannot be read or is invalid: missing file, parse error, too few rows, constant series. */
  input: 2,
  /** The data were read but the model is rejected: no structure fits (no identified set). */
  rejected: 3,
  /** The output could not be written (the previous file, if any, is left untouched). */
  output: 4,
  /** Several files or pairs were solved and at least one of them failed (its record says why). */
  partial: 5,
  /** An internal error: a bug in betabound. Please report it with the command line. */
  internal: 70,
  /** The reader of standard output closed the pipe: 128 + SIGPIPE (13), as a shell reports it; quiet. */
  pipeClosed: 141,
} as const;

export type ExitCode = (typeof exitCodes)[keyof typeof exitCodes];
