/**
 * The bootstrap on worker threads: the chunks of replicates handed out to `threads` workers as each
 * finishes one. Chunks are merged in replicate order by the job, so the result is the same bit for
 * bit whatever the number of threads (each replicate draws from its own stream).
 */
import { existsSync } from "node:fs";
import { createRequire } from "node:module";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import type { Worker } from "node:worker_threads";
import type { BootstrapData, BootstrapRange } from "../../core/inference/bootstrap/replicates.js";
import { type BootstrapChunk, type BootstrapExecutor, inThisThread } from "../../jobs/index.js";

/** The worker script next to the bundled CLI; absent when running from source (tests), then 1 thread. */
const workerUrl = new URL("./bootstrapWorker.js", import.meta.url);

/**
 * Runs the chunks on `asked` threads, at most one per core: more threads than cores only add start-up
 * and switching (256 threads ran 7 times slower than 2 on two cores).
 */
export const inWorkerThreads: BootstrapExecutor = async (task, asked, progress) => {
  const threads = Math.min(asked, availableParallelism());
  if (threads <= 1 || !existsSync(fileURLToPath(workerUrl))) return inThisThread(task, threads, progress);
  const ranges: BootstrapRange[] = new Array(task.chunks.length);
  const data = task.data;
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
        const chunk = task.chunks[index];
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
        const message: BootstrapChunk = { data: plain, blockLength: task.blockLength, seed: task.seed, from: chunk[0], to: chunk[1] };
        worker.postMessage(message);
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
};
