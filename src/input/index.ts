/**
 * The input layer: pure functions from a file's text (or bytes) to a return table, or typed issues.
 * This is its one entry point; the engines (engines/), the table steps (table/) and the value parsers
 * (values/) behind it are internal.
 */
export { readReturns, readReturnsFromBytes } from "./readReturns.js";
export { type ColumnSetTables, readColumnSetsFromBytes } from "./readBatch.js";
export {
  type InputKind,
  inputKinds,
  inputRules,
  type MissingPolicy,
  missingPolicies,
  type ReadOptions,
  type Units,
  unitChoices,
} from "./options.js";
export type { ReturnTable } from "./table/returnTable.js";
export type { DetectedFrequency, FrequencyName } from "./values/frequency.js";
export { decodeText } from "./decodeText.js";
export { joinOnDates, type JoinedReturns } from "./table/joinOnDates.js";
export { parseDecimal, isMissingToken } from "./values/numbers.js";
export { EXTREME_LIMIT } from "./table/convert.js";
export { compileDateFormat } from "./values/dateFormat.js";
export { MAX_STAMP_ISO_BYTES, writeStampIso } from "./values/dateStamps.js";
export { detectDelimiter } from "./dialect.js";
export { closestName } from "./suggest.js";
export { inputWarningCodes, inputWarningDiagnostic, type InputWarningDiagnostic } from "./warningDiagnostics.js";
export { largeInputBuffer, readsThroughWindow } from "./engines/rowKernel.js";
export type { PagedBytes } from "./engines/byteWindow.js";
export { maximumInputBytes, maximumTextLength } from "./limits.js";
export {
  describeInputIssue,
  describeInputWarning,
  inputIssueCodes,
  type InputIssue,
  type InputIssueCode,
  type InputWarning,
  type ColumnRole,
} from "./issues.js";
