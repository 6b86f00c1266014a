/**
 * What a job needs from the world around it, injected so that jobs stay free of files, threads and
 * terminals: where files come from, how bootstrap replicates run, and where progress goes. Only
 * `read` is needed; the rest have plain defaults (replicates in this thread, no progress).
 */
import type { BootstrapData, BootstrapRange } from "../core/inference/bootstrap/replicates.js";
import type { ReadSource } from "./sources.js";

/** Replicates [from, to) of one bootstrap, each range computed anywhere (bootstrapRange). */
export interface BootstrapTask {
  readonly data: BootstrapData;
  readonly blockLength: number;
  readonly seed: number;
  readonly chunks: readonly (readonly [number, number])[];
}

/**
 * Runs the chunks of a bootstrap and returns their ranges in chunk order, calling `progress` with the
 * replicates done so far. Results do not depend on how: replicate r always draws from stream r + 1.
 */
export type BootstrapExecutor = (task: BootstrapTask, threads: number, progress: (done: number) => void) => Promise<BootstrapRange[]>;

/** A progress display for one long step. */
export interface Progress {
  update(done: number): void;
  finish(): void;
}

export interface JobContext {
  readonly read: ReadSource;
  /** Default: every chunk in this thread. */
  readonly bootstrap?: BootstrapExecutor;
  /** Default: no progress shown. */
  readonly progress?: (label: string, total: number) => Progress;
}
