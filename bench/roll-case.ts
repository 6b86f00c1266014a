/**
 * Benchmark entry for case (d) while the CLI has no `roll` command: what `betabound roll FILE --low L
 * --high H --window N --format csv` will do. Reads the file with the project's reader (readReturns,
 * as solve does), runs rollSolveColumns (src/core/rolling.ts) over every window and writes one CSV
 * row per window to standard output. Bundled on the fly by bench/run.mjs with esbuild.
 *
 * Usage: node roll-case.mjs FILE LOW HIGH WINDOW
 */
import { readFileSync, writeSync } from "node:fs";
import { rollSolveColumns, windowColumnNames } from "../src/core/rolling.js";
import { readReturns } from "../src/input/readReturns.js";

const [file, lowName, highName, windowText] = process.argv.slice(2);
if (file === undefined || lowName === undefined || highName === undefined || windowText === undefined) {
  process.stderr.write("usage: roll-case FILE LOW HIGH WINDOW\n");
  process.exit(2);
}
const text = new TextDecoder("utf-8").decode(readFileSync(file));
const table = readReturns(text, { source: file, columns: [lowName, highName], units: "decimal" });
if (!table.ok) {
  process.stderr.write(`${JSON.stringify(table.issues)}\n`);
  process.exit(3);
}
const { dates, columns } = table.value;
const low = columns.get(lowName)!;
const high = columns.get(highName)!;
const header = [
  "start_date", "end_date", "observations",
  "low_mean", "high_mean", "low_variance", "high_variance", "covariance", "market_mean", "market_variance",
  "low_alpha", "low_beta", "low_alpha_se", "low_beta_se", "low_r_squared", "low_residual_variance",
  "high_alpha", "high_beta", "high_alpha_se", "high_beta_se", "high_r_squared", "high_residual_variance",
  "low_beta_min", "low_beta_max", "high_beta_min", "high_beta_max", "factor_variance_min", "factor_variance_max",
  "low_noise_free", "high_noise_free", "equal_noise", "capm_consistent", "return_implied",
];
// rollSolveColumns: rollSolve's numbers without per-window objects (iterateRollSolve builds seven
// Candidate objects and diagnostic texts per window; see bench/analysis.md for its figures).
const windows = rollSolveColumns(low, high, 0, 0.5, { kind: "window", size: Number(windowText), step: 1 });
const windowColumns = windowColumnNames.map((name) => windows.columns[name]);
let chunk = `${header.join(",")}\n`;
for (let k = 0; k < windows.count; k++) {
  let line = `${dates[windows.start[k]!]},${dates[windows.end[k]!]},${windows.observations[k]}`;
  for (const column of windowColumns) {
    const x = column[k]!;
    line += Number.isNaN(x) ? "," : `,${x}`;
  }
  chunk += `${line}\n`;
  if (chunk.length > 1 << 20) {
    writeSync(1, chunk);
    chunk = "";
  }
}
writeSync(1, chunk);
