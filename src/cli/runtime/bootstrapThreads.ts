/**
 * Runs the stationary bootstrap for the CLI: in chunks of replicates, spread over worker threads when
 * asked, with progress reported between chunks. Chunks are merged in replicate order, so the result is
 * the same bit for bit whatever the number of threads (each replicate draws from its own stream).
 */
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { createRequire } from "node:module";
import type { Worker } from "node:worker_threads";
import {
  bootstrapRange,
  mergeBootstrapRanges,
  resolveBlockLength,
  type BootstrapData,
  type BootstrapRange,
} from "../../core/inference/bootstrap/replicates.js";
import { summariseBootstrap, type BootstrapSummary } from "../../core/inference/bootstrap/summary.js";
import type { BootstrapTask } from "./bootstrapWorker.js";

export interface BootstrapRun {
  readonly replicates: number;
  readonly blockLength: number | "auto";
  readonly seed: number;
  readonly confidence: number;
  readonly threads: number;
}

/** Replicates per chunk: small enough for smooth progress, large enough to keep messaging cheap. */
const chunkSize = 500;

/** The worker script next to the bundled CLI; absent when running from source (tests), then 1 thread. */
const workerUrl = new URL("./bootstrapWorker.js", import.meta.url);

export async function runBootstrap(data: BootstrapData, run: BootstrapRun, progress: (done: number) => void): Promise<BootstrapSummary> {
  const blockLength = resolveBlockLength(data, run.blockLength);
  const chunks: [number, number][] = [];
  for (let from = 0; from < run.replicates; from += chunkSize) chunks.push([from, Math.min(run.replicates, from + chunkSize)]);
  const threads = Math.min(run.threads, chunks.length);
  const ranges =
    threads > 1 && existsSync(fileURLToPath(workerUrl))
      ? await inWorkers(data, blockLength, run.seed, chunks, threads, progress)
      : await inThisThread(data, blockLength, run.seed, chunks, progress);
  return summariseBootstrap(mergeBootstrapRanges(ranges, run.replicates), run.seed, run.confidence);
}

async function inThisThread(
  data: BootstrapData,
  blockLength: number,
  seed: number,
  chunks: readonly [number, number][],
  progress: (done: number) => void,
): Promise<BootstrapRange[]> {
  const ranges: BootstrapRange[] = [];
  for (const [from, to] of chunks) {
    ranges.push(bootstrapRange(data, { blockLength, seed }, from, to));
    progress(to);
    await new Promise((resolve) => setImmediate(resolve)); // let the progress line reach the terminal
  }
  return ranges;
}

async function inWorkers(
  data: BootstrapData,
  blockLength: number,
  seed: number,
  chunks: readonly [number, number][],
  threads: number,
  progress: (done: number) => void,
): Promise<BootstrapRange[]> {
  const ranges: BootstrapRange[] = new Array(chunks.length);
  const plain: BootstrapData = {
    low: Float64Array.from(data.low),
    high: Float64Array.from(data.high),
    weight: data.weight,
    ...(data.riskFree === undefined
      ? {}
      : { riskFree: typeof data.riskFree === "number" ? data.riskFree : Float64Array.from(data.riskFree) }),
  };
  let next = 0;
  let done = 0;
  const work = (worker: Worker): Promise<void> =>
    new Promise((resolve, reject) => {
      const take = (): void => {
        const index = next++;
        const chunk = chunks[index];
        if (chunk === undefined) {
          resolve();
          return;
        }
        worker.once("message", (range: BootstrapRange) => {
          ranges[index] = range;
          done += range.to - range.from;
          progress(done);
          take();
        });
        const task: BootstrapTask = { data: plain, blockLength, seed, from: chunk[0], to: chunk[1] };
        worker.postMessage(task);
      };
      worker.once("error", reject);
      take();
    });
  // Loaded here, not at start-up: only runs with bootstrap threads need it (a few ms to load).
  const { Worker: WorkerThread } = createRequire(import.meta.url)("node:worker_threads") as typeof import("node:worker_threads");
  const workers = Array.from({ length: threads }, () => new WorkerThread(workerUrl));
  try {
    await Promise.all(workers.map(work));
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return ranges;
}
