/** The CLI's seams to the outside world; tests replace them, `main.ts` binds them to the process. */
import type { Result } from "../../core/result.js";
import type { VegaLoader } from "../../report/charts/loadVega.js";
import type { CliIssue } from "../messages.js";

export interface CliIo {
  writeOut(text: string): void;
  writeErr(text: string): void;
  readInput(path: string): Promise<Result<Uint8Array, CliIssue>>;
  writeOutput(path: string, text: string): Promise<Result<void, CliIssue>>;
  readonly stdoutIsTerminal: boolean;
  readonly stdinIsTerminal: boolean;
  readonly stderrIsTerminal: boolean;
  /** Milliseconds on a monotonic clock (for the progress line only; results never depend on it). */
  now(): number;
  readonly env: Readonly<Record<string, string | undefined>>;
  /** Imports vega for a chart (the launcher's own import: the bundle cannot use `import()`). */
  readonly loadVega: VegaLoader;
  /**
   * A place to write a long output piece by piece: standard output (path undefined) or a temporary
   * file in the target's folder that `close` renames over the target (`discard` removes it).
   */
  openSink(path: string | undefined): Result<OutputSink, CliIssue>;
}

export interface OutputSink {
  write(text: string): void;
  close(): Result<void, CliIssue>;
  discard(): void;
}
