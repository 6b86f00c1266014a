/**
 * Worker thread for the bootstrap: runs replicates [from, to) of one plan and sends the draws back.
 * Each replicate has its own random stream (seed, r + 1), so the split never changes the result.
 */
import { parentPort } from "node:worker_threads";
import { bootstrapRange } from "../../core/inference/bootstrap/replicates.js";
import type { BootstrapChunk } from "../../jobs/index.js";

parentPort?.on("message", (task: BootstrapChunk) => {
  const range = bootstrapRange(task.data, { blockLength: task.blockLength, seed: task.seed }, task.from, task.to);
  parentPort?.postMessage(range, [range.draws.buffer as ArrayBuffer]);
});
