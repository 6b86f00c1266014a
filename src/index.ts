/**
 * betabound as a library: the jobs (a file and one options object in, the finished document out,
 * exactly what the command line prints), the option table and its defaults, the renderers, and the
 * pure core (also alone as "betabound/core").
 *
 * @example
 * import { readFileSync } from "node:fs";
 * import { solveJob, sourcesFrom } from "betabound";
 * const files = { "returns.csv": readFileSync("returns.csv") };
 * const result = await solveJob(["returns.csv"], { low: "LOW", high: "HIGH", format: "json" }, { read: sourcesFrom(files) });
 * if (result.ok) console.log(JSON.stringify(result.value.pairs[0]?.document, null, 2)); // = solve --format json
 */

export * from "./core/index.js";
export * from "./jobs/index.js";
export {
  type CommandName,
  type CommandOptions,
  type CommandOptionsInput,
  commandNames,
  defaultsFor,
  type OptionIssue,
  optionTable,
} from "./options/index.js";
export { renderReport } from "./report/render.js";
export { renderImplied } from "./report/impliedReport.js";
export { renderJsonLines, renderRecordsCsv, renderRecordsText, type SolveRecord } from "./report/records.js";
export { renderSummaryCsv, summaryColumns } from "./report/summaryCsv.js";
export type { InputDescription, RenderOptions, SolveReport } from "./report/types.js";
export type { ImpliedOutputJson } from "./schema/impliedOutput.js";
export type { RollOutputJson } from "./schema/rollOutput.js";
export type { SolveFailureJson, SolveOutputJson } from "./schema/solveOutput.js";
