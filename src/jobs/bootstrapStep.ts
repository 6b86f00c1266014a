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
  const ranges = await execute(task, Math.min(settings.threads, chunks.length), (done) => progress?.update(done));
  progress?.finish();
  return summariseBootstrap(mergeBootstrapRanges(ranges, settings.replicates), settings.seed, settings.confidence);
}
