/** Rolling and expanding windows: the plan, the scan of their sums, each window's set, and the CSV columns. */
export {
  rollSolveColumnBlocks,
  rollSolveColumns,
  type WindowColumnName,
  type WindowColumns,
  windowColumnNames,
} from "./columns.js";
export { scanWindows, type WindowSums } from "./scan.js";
export { type WindowAlignment, type WindowSpec, windowAlignments, windowCount, windowOffset } from "./windowPlan.js";
export {
  type CapmLine,
  type CapmPair,
  describeWindow,
  iterateRollingMoments,
  iterateRollSolve,
  rollingMoments,
  rollSolve,
  solveWindow,
  type WindowMoments,
  type WindowSolution,
} from "./windows.js";
