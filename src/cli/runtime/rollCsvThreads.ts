/**
 * roll's CSV of every window on two threads: formatting the numbers is most of such a run (a million
 * windows, 36 numbers each), so a worker thread formats two blocks of windows in three while this
 * thread computes the windows, formats the third and writes every block in order. The rows are those
 * of writeRollCsv byte for byte: both write them with writeStampRow (report/rollCsv.ts). Used only
 * for dates that are stamps, without the uncertainty columns (computed here, window by window), on a
 * machine with two cores or more, and for runs long enough to repay the thread's start.
 */
import { existsSync } from "node:fs";
import { createRequire } from "node:module";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import type { Worker } from "node:worker_threads";
import type { WindowColumns } from "../../core/rolling/index.js";
import { windowColumnNames } from "../../core/rolling/index.js";
import { formatPackedBlock, type PackedBlock, packBlock, rollCsvPrefix, stampRowBytes } from "../../report/rollCsv.js";
import type { RollMeta } from "../../report/rollReport.js";

/** The worker script next to the bundled CLI; absent when running from source (tests): one thread. */
const workerUrl = new URL("./rollCsvWorker.js", import.meta.url);

/** Fewer windows than this are written by one thread (a worker takes tens of milliseconds to start). */
export const threadedCsvWindows = 50_000;

/** One block on its way through the worker: the packed windows, the rows' bytes and their length. */
export interface RollCsvTask {
  readonly block: PackedBlock;
  readonly prefix: Uint8Array;
  readonly form: number;
  readonly out: Uint8Array;
  readonly length: number;
}

/** Whether roll's CSV of `windows` windows is worth a second thread here. */
export function rollCsvThreadsPay(windows: number): boolean {
  return windows >= threadedCsvWindows && availableParallelism() >= 2 && existsSync(fileURLToPath(workerUrl));
}

/**
 * Writes the CSV rows of `blocks` (at most `blockWindows` windows each; their arrays are reused by
 * the producer) for `meta`, whose dates are `stamps` (meta.stamps), handing each block's bytes to
 * `write` in order. The stamps come apart from `meta` because copying `meta` would make its `dates`
 * (a string per row, a getter that builds them on first use).
 */
export async function writeRollCsvThreaded(
  meta: RollMeta,
  stamps: NonNullable<RollMeta["stamps"]>,
  blocks: Iterable<WindowColumns>,
  blockWindows: number,
  write: (bytes: Uint8Array) => Promise<void>,
): Promise<void> {
  const { keys, form } = stamps;
  const prefix = rollCsvPrefix(meta);
  const rowBytes = stampRowBytes(prefix.length, windowColumnNames.length);
  // Four sets of arrays go round (three blocks in flight and one being packed): no fresh memory per block.
  const free: RollCsvTask[] = [];
  const fresh = (): RollCsvTask => ({
    block: {
      count: 0,
      keys: new Float64Array(2 * blockWindows),
      numbers: new Float64Array((1 + windowColumnNames.length) * blockWindows),
    },
    prefix,
    form,
    out: new Uint8Array(rowBytes * blockWindows),
    length: 0,
  });
  const { Worker: WorkerThread } = createRequire(import.meta.url)("node:worker_threads") as typeof import("node:worker_threads");
  const worker: Worker = new WorkerThread(workerUrl);
  // The worker answers in the order it is asked.
  const answers: { resolve: (task: RollCsvTask) => void; reject: (error: unknown) => void }[] = [];
  worker.on("message", (task: RollCsvTask) => answers.shift()?.resolve(task));
  worker.on("error", (error) => {
    for (const answer of answers.splice(0)) answer.reject(error);
  });
  const formatted = (task: RollCsvTask, inWorker: boolean): Promise<RollCsvTask> => {
    if (!inWorker) return Promise.resolve({ ...task, length: formatPackedBlock(task.block, prefix, form, task.out) });
    return new Promise((resolve, reject) => {
      answers.push({ resolve, reject });
      worker.postMessage(task, [
        task.block.keys.buffer as ArrayBuffer,
        task.block.numbers.buffer as ArrayBuffer,
        task.out.buffer as ArrayBuffer,
      ]);
    });
  };
  const inFlight: Promise<RollCsvTask>[] = [];
  const writeOldest = async (): Promise<void> => {
    const done = await (inFlight.shift() as Promise<RollCsvTask>);
    await write(done.out.subarray(0, done.length));
    free.push(done);
  };
  try {
    let index = 0;
    for (const columns of blocks) {
      const task = free.pop() ?? fresh();
      packBlock(columns, keys, task.block);
      inFlight.push(formatted(task, index++ % 3 !== 2));
      if (inFlight.length >= 3) await writeOldest();
    }
    while (inFlight.length > 0) await writeOldest();
  } finally {
    // A failure leaves the other blocks unwritten: the output is aborted by the caller.
    inFlight.forEach((pending) => pending.catch(() => undefined));
    await worker.terminate();
  }
}
