/**
 * Worker thread for roll's CSV: formats the rows of each packed block of windows it is sent and sends
 * the bytes back, with the block's arrays, for reuse (rollCsvThreads.ts).
 */
import { parentPort } from "node:worker_threads";
import { formatPackedBlock } from "../../report/rollCsv.js";
import type { RollCsvTask } from "./rollCsvThreads.js";

parentPort?.on("message", (task: RollCsvTask) => {
  const length = formatPackedBlock(task.block, task.prefix, task.form, task.out);
  const done: RollCsvTask = { ...task, length };
  parentPort?.postMessage(done, [
    task.block.keys.buffer as ArrayBuffer,
    task.block.numbers.buffer as ArrayBuffer,
    task.out.buffer as ArrayBuffer,
  ]);
});
