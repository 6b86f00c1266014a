/** The input layer: pure functions from file text (or bytes) to return tables or typed issues. */
export { readReturns, readReturnsWith, readReturnsFromBytes, type Engine } from "./readReturns.js";
export type { ReadOptions, InputKind } from "./options.js";
export type { ReturnTable } from "./returnTable.js";
export type { Frequency, FrequencyName } from "./frequency.js";
export { decodeText } from "./decodeText.js";
export { joinOnDates, type JoinedReturns } from "./joinOnDates.js";
export { parseDecimal, isMissingToken } from "./numbers.js";
export { compileDateFormat } from "./dateFormat.js";
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
