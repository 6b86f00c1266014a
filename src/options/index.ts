/** The options of every command, defined once (table.ts), and what is generated from them. */
export { type ConfigContents, type ConfigProblem, parseConfig, pathOptions } from "./config.js";
export { parseConfigJobs } from "./configJobs.js";
export { optionTableMarkdown, updateOptionDocs } from "./docs.js";
export { type ColumnPair, type GarchCoefficients, type Kind, mustBe, refusalOf } from "./kinds.js";
export {
  type CommandOptions,
  type CommandOptionsInput,
  defaultsFor,
  entriesFor,
  flagOf,
  type OptionIssue,
  optionIssueOf,
  optionsSchema,
  parseOptions,
} from "./schemas.js";
export { type CommandName, commandNames, type OptionGroup, type OptionSpec, optionGroups, optionTable } from "./table.js";
