/** Options of `readReturns`, their vocabularies and rules, and their validation. */
import { integerRule, numberRule, type Rule, refusal } from "../core/parameters.js";
import type { InputIssue } from "./issues.js";
import { compileDateFormat } from "./values/dateFormat.js";

/** What the numbers in the requested columns are. */
export const inputKinds = ["returns", "prices", "log-returns"] as const;
export type InputKind = (typeof inputKinds)[number];

/** Units of a file's numbers: every figure the tool reports is decimal whatever they are. */
export const unitChoices = ["decimal", "percent"] as const;
export type Units = (typeof unitChoices)[number];

/** What to do with a row holding a missing value in a used column. */
export const missingPolicies = ["drop", "error"] as const;
export type MissingPolicy = (typeof missingPolicies)[number];

/** The rules of the reading options, each written once (the option table uses them too). */
export const inputRules = {
  delimiter: {
    accept: (d: string) => d.length === 1 && !/[\r\n"\d.+-]/.test(d),
    expected: "one character other than a quote, a line break, a digit, a sign or a point",
  } satisfies Rule<string>,
  block: integerRule(1, 1_000_000),
  periodsPerYear: numberRule({ gt: 0 }),
  dateFormat: {
    accept: (layout: string) => typeof compileDateFormat(layout) !== "string",
    expected: "a date layout of the tokens YYYY, MM, M, DD, D and MMM with separators, e.g. DD/MM/YYYY",
    reason: (layout: string) => {
      const compiled = compileDateFormat(layout);
      return typeof compiled === "string" ? compiled : undefined;
    },
  } satisfies Rule<string>,
  longLayout: {
    accept: (o: { readonly idColumn?: string | undefined; readonly valueColumn?: string | undefined }) =>
      (o.idColumn === undefined) === (o.valueColumn === undefined),
    expected: "given together with the other: the long layout needs both the id column and the value column",
  } satisfies Rule<{ readonly idColumn?: string | undefined; readonly valueColumn?: string | undefined }>,
} as const;

/** How to read a file; only `source` and `columns` are required. */
export interface ReadOptions {
  /** File name shown in messages, e.g. "returns.csv" or "<stdin>". */
  readonly source: string;
  /** Date column; default: the first column of the header. */
  readonly dateColumn?: string;
  /** The numeric columns wanted (wide layout), or the series ids wanted (long layout, see idColumn). */
  readonly columns: readonly string[];
  /** percent: every value is divided by 100 on read. Default decimal. Not allowed with input "prices". */
  readonly units?: Units;
  /** Default false: a return with |value| > 10 (decimal, after conversion) is an error. */
  readonly allowExtreme?: boolean;
  /** Field delimiter (one character); default: detected among comma, semicolon and tab. */
  readonly delimiter?: string;
  /** Which table of the file (1-based) when blank lines separate several; default 1. */
  readonly block?: number;
  /** Explicit date layout such as "DD/MM/YYYY" (see compileDateFormat); default: automatic. */
  readonly dateFormat?: string;
  /** Sort rows by date instead of reporting unsorted dates. Default false. */
  readonly sort?: boolean;
  /** Overrides the detected frequency. */
  readonly periodsPerYear?: number;
  /** Accept a decimal comma ("0,85") in values; the delimiter must then not be a comma. Default false. */
  readonly decimalComma?: boolean;
  /** Extra missing-value sentinels, e.g. ["-99.99", "#N/A"] (see compileSentinels). */
  readonly missing?: readonly string[];
  /** drop (default): rows with a missing value are dropped and counted; error: each is an issue. */
  readonly onMissing?: MissingPolicy;
  /**
   * returns (default); prices: simple returns P_t / P_{t-1} - 1 (the first date has no return and
   * is consumed; a missing price makes both returns that use it missing); log-returns: exp(l) - 1.
   */
  readonly input?: InputKind;
  /** Long layout: the column holding the series id; `columns` then lists series ids. Needs valueColumn. */
  readonly idColumn?: string;
  /** Long layout: the column holding the values. */
  readonly valueColumn?: string;
}

const invalid = (source: string, option: string, reason: string): InputIssue => ({ code: "invalid-option", source, option, reason });

/** Problems with the options themselves (nothing to do with the file). */
export function validateOptions(options: ReadOptions): InputIssue[] {
  const { source } = options;
  const issues: InputIssue[] = [];
  const columns = Array.isArray(options.columns) ? options.columns : [];
  if (columns.length === 0) issues.push(invalid(source, "columns", "name at least one column to read"));
  const seen = new Set<string>();
  for (const name of columns) {
    if (typeof name !== "string" || name.trim() === "") issues.push(invalid(source, "columns", "column names must be non-empty"));
    else if (seen.has(name.trim()))
      issues.push(
        invalid(
          source,
          "columns",
          `the column ${JSON.stringify(name)} is asked for twice (among the books, the risk-free rate, --portfolios and --index): name each column once`,
        ),
      );
    else seen.add(name.trim());
  }
  if (options.dateColumn !== undefined && seen.has(options.dateColumn.trim()) && options.idColumn === undefined) {
    issues.push(
      invalid(
        source,
        "columns",
        `the column ${JSON.stringify(options.dateColumn)} is asked for as a series and is also the date column: name the date column with --date (a file needs one: without a column of dates, the first column is taken as it)`,
      ),
    );
  }
  const { delimiter, block, periodsPerYear } = options;
  const check = <T>(option: string, value: T | undefined, rule: Rule<T>): void => {
    if (value !== undefined && !rule.accept(value)) issues.push(invalid(source, option, refusal(rule, value)));
  };
  check("delimiter", delimiter, inputRules.delimiter);
  check("block", block, inputRules.block);
  check("periodsPerYear", periodsPerYear, inputRules.periodsPerYear);
  check("dateFormat", options.dateFormat, inputRules.dateFormat);
  if (options.decimalComma === true && delimiter === ",")
    issues.push(invalid(source, "decimalComma", "the delimiter is a comma, so it cannot also be the decimal separator"));
  if (options.input === "prices" && options.units === "percent") issues.push(invalid(source, "units", "percent does not apply to prices"));
  if (!inputRules.longLayout.accept(options)) {
    issues.push(invalid(source, options.idColumn === undefined ? "idColumn" : "valueColumn", refusal(inputRules.longLayout, options)));
  }
  return issues;
}
