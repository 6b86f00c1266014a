/**
 * What a job needs from the world around it, injected so that jobs stay free of files, threads and
 * terminals: where files come from, how bootstrap replicates run, and where progress goes. Only
 * `read` is needed; the rest have plain defaults (replicates in this thread, no progress).
 */
import type { BootstrapData, BootstrapRange } from "../core/inference/bootstrap/replicates.js";
import type { ReadSource } from "./sources.js";

/** One bootstrap's data and plan: each of its replicate ranges can be computed anywhere (bootstrapRange). */
export interface BootstrapPlanned {
  readonly data: BootstrapData;
  readonly blockLength: number;
  readonly seed: number;
}

/** The replicates of one bootstrap, in chunks [from, to). */
export interface BootstrapTask extends BootstrapPlanned {
  readonly chunks: readonly (readonly [number, number])[];
}

/** One chunk of a bootstrap, as a worker thread receives it. */
export interface BootstrapChunk extends BootstrapPlanned {
  readonly from: number;
  readonly to: number;
}

/**
 * Runs the chunks of a bootstrap and returns their ranges in chunk order, calling `progress` with the
 * replicates done so far. Results do not depend on how: replicate r always draws from stream r + 1.
 */
export type BootstrapExecutor = (
  task: BootstrapTask,
  threads: number,
  progress: (done: number) => void | Promise<void>,
) => Promise<BootstrapRange[]>;

/**
 * A progress display for one long step. `update` may return a promise: work done in this thread
 * waits for it between chunks, so that a display can be drawn (the CLI's yields to the event loop).
 */
export interface Progress {
  update(done: number): void | Promise<void>;
  finish(): void;
}

export interface JobContext {
  readonly read: ReadSource;
  /** Default: every chunk in this thread. */
  readonly bootstrap?: BootstrapExecutor;
  /** Default: no progress shown. */
  readonly progress?: (label: string, total: number) => Progress;
}
