/**
 * Jobs: file names (read through the context) or a structure, and one options object, in; the
 * finished documents out. The CLI is a thin wiring around them; the library offers them as they are.
 */
export { inThisThread } from "./bootstrapStep.js";
export type { BootstrapChunk, BootstrapExecutor, BootstrapTask, JobContext, Progress } from "./context.js";
export { runShape } from "./pairTables.js";
export { impliedJob, type ImpliedJobResult } from "./impliedJob.js";
export { type RolledPair, type RollFailure, type RollJob, rollJob } from "./rollJob.js";
export { simulateJob, type SimulateJobResult } from "./simulateJob.js";
export {
  type JobMessage,
  type PairStatus,
  type SolvedPair,
  type SolveJobPlan,
  type SolveJobResult,
  solveJob,
  solveOptions,
  solvePlanned,
} from "./solveJob.js";
export { type PagedFile, type ReadSource, type SourceFailure, sourceName, sourcesFrom } from "./sources.js";
export { tool, version } from "./tool.js";
export { defaultThreads } from "./uncertaintyStep.js";
