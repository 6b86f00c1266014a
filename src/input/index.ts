/** The input layer: pure functions from file text (or bytes) to return tables or typed issues. */
export { readReturns, readReturnsWith, readReturnsFromBytes, type Engine } from "./readReturns.js";
export type { ReadOptions, InputKind } from "./options.js";
export type { ReturnTable } from "./table/returnTable.js";
export type { Frequency, FrequencyName } from "./values/frequency.js";
export { decodeText } from "./decodeText.js";
export { joinOnDates, type JoinedReturns } from "./table/joinOnDates.js";
export { parseDecimal, isMissingToken } from "./values/numbers.js";
export { compileDateFormat } from "./values/dateFormat.js";
export { detectDelimiter } from "./dialect.js";
export {
  describeInputIssue,
  describeInputWarning,
  inputIssueCodes,
  type InputIssue,
  type InputIssueCode,
  type InputWarning,
  type ColumnRole,
} from "./issues.js";
