/**
 * The stationary bootstrap of a solve: the block length resolved once, the replicates split into
 * chunks (for progress and for threads), run by the context's executor, merged in replicate order
 * and summarised. The same seed gives the same summary bit for bit whatever the executor.
 */
import {
  type BootstrapData,
  type BootstrapRange,
  bootstrapRange,
  mergeBootstrapRanges,
  resolveBlockLength,
} from "../core/inference/bootstrap/replicates.js";
import { type BootstrapSummary, summariseBootstrap } from "../core/inference/bootstrap/summary.js";
import type { BootstrapExecutor, BootstrapTask, JobContext } from "./context.js";

/** Replicates per chunk: small enough for smooth progress, large enough to keep messaging cheap. */
const chunkSize = 500;

export interface BootstrapSettings {
  readonly replicates: number;
  readonly blockLength: number | "auto";
  readonly seed: number;
  readonly confidence: number;
  readonly threads: number;
}

/**
 * Below this much work (rows x replicates) a second thread costs more than it saves: a worker's start
 * (loading its script, a cold JIT) is worth roughly 25 million row-replicates. Measured on 2 cores
 * (median of 5 runs, whole CLI, 2026-12-04; bench case c): n = 2,520, B = 2,000 (5M): 0.32 s on one
 * thread, 0.36 s on two; B = 10,000 (25M): 0.73 s and 0.72 s; n = 25,200, B = 2,000 (50M): 1.78 s and
 * 1.26 s; B = 10,000 (252M): 7.3 s and 4.4 s.
 */
export const threadsPayFrom = 40_000_000;

/** The threads a bootstrap of this size uses: one below `threadsPayFrom`, else those asked for. */
export function bootstrapThreads(rows: number, replicates: number, asked: number): number {
  return rows * replicates < threadsPayFrom ? 1 : asked;
}

/** Every chunk in this thread, waiting for the progress display between chunks. */
export const inThisThread: BootstrapExecutor = async (task, _threads, progress) => {
  const ranges: BootstrapRange[] = [];
  for (const [from, to] of task.chunks) {
    ranges.push(bootstrapRange(task.data, { blockLength: task.blockLength, seed: task.seed }, from, to));
    await progress(to);
  }
  return ranges;
};

export async function runBootstrap(data: BootstrapData, settings: BootstrapSettings, context: JobContext): Promise<BootstrapSummary> {
  const chunks: [number, number][] = [];
  for (let from = 0; from < settings.replicates; from += chunkSize) chunks.push([from, Math.min(settings.replicates, from + chunkSize)]);
  const task: BootstrapTask = { data, blockLength: resolveBlockLength(data, settings.blockLength), seed: settings.seed, chunks };
  const progress = context.progress?.("bootstrap", settings.replicates);
  const execute = context.bootstrap ?? inThisThread;
  const threads = Math.min(bootstrapThreads(data.low.length, settings.replicates, settings.threads), chunks.length);
  const ranges = await execute(task, threads, (done) => progress?.update(done));
  progress?.finish();
  return summariseBootstrap(mergeBootstrapRanges(ranges, settings.replicates), settings.seed, settings.confidence);
}
