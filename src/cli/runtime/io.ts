/** The CLI's seams to the outside world; tests replace them, `main.ts` binds them to the process. */
import { type Result, success } from "../../core/result.js";
import type { PagedFile } from "../../jobs/index.js";
import type { VegaLoader } from "../../report/charts/loadVega.js";
import type { CliIssue } from "../messages.js";
import type { OutputTarget, OutputText } from "./output.js";

export type { OutputTarget, OutputText };

export interface CliIo {
  /** Standard output, for help and schema texts (command outputs go through `openOutput`). */
  writeOut(text: string): void;
  writeErr(text: string): void;
  /** A whole input file, or standard input for "-"; refused beyond the input size limit. */
  readInput(path: string): Promise<Result<Uint8Array, CliIssue>>;
  /** An input file for a job: as readInput, or a large file opened to be read by position (readInput when absent). */
  readSource?(path: string): Promise<Result<Uint8Array | PagedFile, CliIssue>>;
  /**
   * Standard output (path undefined) or the file at `path`, written as output.ts promises (a
   * temporary file renamed on commit; special files in place). Nothing is created before this call.
   */
  openOutput(path: string | undefined): Result<OutputTarget, CliIssue>;
  /**
   * What a path names, to tell whether an output would land on an input or on another output: the
   * device and inode of an existing file ("-": standard input; links followed), else the absolute
   * path a write would create; and whether it is a character device (which several outputs may share).
   */
  identify(path: string): { readonly key: string; readonly device: boolean };
  readonly stdoutIsTerminal: boolean;
  readonly stdinIsTerminal: boolean;
  readonly stderrIsTerminal: boolean;
  /** Milliseconds on a monotonic clock (for the progress line only; results never depend on it). */
  now(): number;
  readonly env: Readonly<Record<string, string | undefined>>;
  /** Imports vega for a chart (the launcher's own import: the bundle cannot use `import()`). */
  readonly loadVega: VegaLoader;
}

/** Writes `text` (or its pieces, in order) as the whole output at `path` (undefined: standard output). */
export async function writeOutput(io: CliIo, path: string | undefined, text: OutputText): Promise<Result<void, CliIssue>> {
  return writeOutputs(io, [{ path, text }]);
}

/** One of a run's outputs: its path (undefined: standard output) and its text. */
export interface OutputItem {
  readonly path: string | undefined;
  readonly text: OutputText;
}

/**
 * Writes a run's outputs as one: every file is opened, written and settled (flushed to the disk)
 * before anything is final, then standard output is written, and only then are the files renamed
 * over their targets. So any failure before the renames (a folder missing, a full disk, standard
 * output failing) leaves every previous file as it was; only a rename failing after another has
 * succeeded (the folder changed under the run) can part them.
 */
export async function writeOutputs(io: CliIo, items: readonly OutputItem[]): Promise<Result<void, CliIssue>> {
  const files = items.filter((item) => item.path !== undefined);
  const toStdout = items.filter((item) => item.path === undefined);
  const targets: OutputTarget[] = [];
  try {
    for (const item of files) {
      const opened = io.openOutput(item.path);
      if (!opened.ok) return opened;
      targets.push(opened.value);
    }
    for (const [k, target] of targets.entries()) {
      await target.write((files[k] as OutputItem).text);
      const settled = await target.settle();
      if (!settled.ok) return settled;
    }
    for (const item of toStdout) {
      const opened = io.openOutput(undefined);
      if (!opened.ok) return opened;
      await opened.value.write(item.text);
      const committed = await opened.value.commit();
      if (!committed.ok) return committed;
    }
    for (const target of targets) {
      const committed = await target.commit();
      if (!committed.ok) return committed;
    }
    return success(undefined);
  } finally {
    for (const target of targets) target.abort();
  }
}
