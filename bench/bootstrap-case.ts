/**
 * Benchmark entry for case (c): the stationary bootstrap of src/core/inference (bootstrapSolve) on a
 * return file read with the project's reader, the summary written as JSON. Bundled on the fly by
 * bench/run.mjs with esbuild; the case is skipped when the module does not build.
 *
 * Usage: node bootstrap-case.mjs FILE LOW HIGH REPLICATES BLOCK SEED
 */
import { readFileSync } from "node:fs";
import { bootstrapSolve } from "../src/core/inference/bootstrap/summary.js";
import { readReturns } from "../src/input/readReturns.js";

const [file, lowName, highName, replicates, block, seed] = process.argv.slice(2);
if (file === undefined || lowName === undefined || highName === undefined) {
  process.stderr.write("usage: bootstrap-case FILE LOW HIGH REPLICATES BLOCK SEED\n");
  process.exit(2);
}
const text = new TextDecoder("utf-8").decode(readFileSync(file));
const table = readReturns(text, { source: file, columns: [lowName, highName], units: "decimal" });
if (!table.ok) {
  process.stderr.write(`${JSON.stringify(table.issues)}\n`);
  process.exit(3);
}
const summary = bootstrapSolve(table.value.columns.get(lowName)!, table.value.columns.get(highName)!, 0, 0.5, {
  replicates: Number(replicates ?? 10000),
  blockLength: Number(block ?? 10),
  seed: Number(seed ?? 1),
});
process.stdout.write(`${JSON.stringify(summary, null, 2)}\n`);
