/**
 * Every expected problem with an input file, as a typed value with a stable kebab-case `code`.
 * Lines are 1-based lines of the source text; columns are header names. Their wording is in issues.ts.
 */
import type { QuoteProblem } from "./engines/grid.js";
import type { BinaryKind, UnicodeEncoding } from "./fileKind.js";
import type { DateProblem } from "./values/dates.js";

/** Stable issue codes, in a fixed order, so callers can map them to exit codes. */
export const inputIssueCodes = [
  "empty-file",
  "header-only",
  "no-table",
  "not-a-return-table",
  "no-such-block",
  "unknown-column",
  "duplicate-column",
  "unknown-series",
  "not-a-number",
  "missing-value",
  "wrong-field-count",
  "unquoted-delimiter",
  "malformed-quotes",
  "bad-date",
  "ambiguous-dates",
  "duplicate-date",
  "unsorted-dates",
  "too-few-rows",
  "too-few-common-dates",
  "extreme-value",
  "non-positive-price",
  "invalid-encoding",
  "binary-content",
  "not-a-text-file",
  "unsupported-encoding",
  "text-too-large",
  "input-too-large",
  "invalid-option",
  "similar-issues",
  "too-many-issues",
  "internal-error",
] as const;

/** One of `inputIssueCodes`. */
export type InputIssueCode = (typeof inputIssueCodes)[number];

/** Where an issue is. */
export interface At {
  readonly source: string;
  readonly line?: number;
  readonly column?: string;
  readonly value?: string;
  /** The series of the row, in the long layout (where the column is the value column all series share). */
  readonly series?: string;
}
type Issue<C extends InputIssueCode, Extra = object> = At & { readonly code: C } & Extra;

/** One problem that stops the file from being read. */
export type InputIssue =
  | Issue<"empty-file">
  | Issue<"header-only", { readonly line: number }>
  | Issue<"no-table">
  | Issue<"not-a-return-table", { readonly size: number; readonly wanted: readonly string[] }>
  | Issue<"no-such-block", { readonly block: number; readonly available: number }>
  | Issue<
      "unknown-column",
      {
        readonly column: string;
        readonly role: ColumnRole;
        readonly available: readonly string[];
        readonly suggestion?: string;
        readonly foundInBlock?: number;
      }
    >
  | Issue<"duplicate-column", { readonly column: string }>
  | Issue<
      "unknown-series",
      { readonly column: string; readonly idColumn: string; readonly available: readonly string[]; readonly suggestion?: string }
    >
  | Issue<"not-a-number", { readonly line: number; readonly column: string; readonly value: string }>
  | Issue<"missing-value", { readonly line: number; readonly column: string; readonly value: string }>
  | Issue<"wrong-field-count", { readonly line: number; readonly expected: number; readonly actual: number }>
  | Issue<"unquoted-delimiter", { readonly line: number; readonly column: string; readonly value: string; readonly delimiter: string }>
  | Issue<"malformed-quotes", { readonly problem: QuoteProblem /** 1-based. */; readonly field?: number }>
  | Issue<
      "bad-date",
      {
        readonly line: number;
        readonly column: string;
        readonly value: string;
        readonly dateFormat?: string;
        /** Why a text that fits a layout is no date. */
        readonly problem?: DateProblem;
        /** How the column's slash dates are read, when the problem is with one. */
        readonly reading?: "day first" | "month first";
        /** What the value itself suggests (see suggest.ts). */
        readonly hint?: DateHint;
      }
    >
  | Issue<
      "ambiguous-dates",
      { readonly line: number; readonly column: string; readonly value: string; readonly dayFirst: string; readonly monthFirst: string }
    >
  | Issue<"duplicate-date", { readonly line: number; readonly column: string; readonly value: string; readonly firstLine: number }>
  | Issue<
      "unsorted-dates",
      {
        readonly line: number;
        readonly column: string;
        readonly value: string;
        readonly previousValue: string;
        readonly previousLine: number;
      }
    >
  | Issue<"too-few-rows", { readonly kept: number; readonly required: number; readonly rowsRead: number; readonly dropped: number }>
  | Issue<
      "too-few-common-dates",
      {
        readonly matched: number;
        readonly required: number;
        readonly counts: readonly { readonly source: string; readonly dates: number }[];
      }
    >
  | Issue<
      "extreme-value",
      { readonly line: number; readonly column: string; readonly value: string; readonly decimalValue: number; readonly limit: number }
    >
  | Issue<"non-positive-price", { readonly line: number; readonly column: string; readonly value: string }>
  | Issue<"invalid-encoding", { readonly line: number; readonly offset: number; readonly byte: number }>
  | Issue<"binary-content", { readonly line: number; readonly offset: number }>
  | Issue<"not-a-text-file", { readonly kind: BinaryKind; readonly size: number }>
  | Issue<"unsupported-encoding", { readonly encoding: UnicodeEncoding; readonly bom: boolean }>
  | Issue<
      "text-too-large",
      {
        readonly size: number;
        /** The text's length in UTF-16 code units, and the most a string holds. */
        readonly length: number;
        readonly limit: number;
        /** What sent the file to the text path, and on which line. */
        readonly cause: "non-ascii" | "quote" | "carriage-return" | "size";
      }
    >
  | Issue<"input-too-large", { readonly size: number; readonly limit: number }>
  | Issue<"invalid-option", { readonly option: string; readonly reason: string }>
  | Issue<
      "similar-issues",
      { readonly like: InputIssueCode; readonly omitted: number; readonly firstLine?: number; readonly lastLine?: number }
    >
  | Issue<"too-many-issues", { readonly omitted: number }>
  | Issue<"internal-error", { readonly detail: string }>;

/** A --date-format layout that reads a value, and the date (ISO) it gives. */
export interface LayoutReading {
  readonly layout: string;
  readonly iso: string;
}

/** What a date's text that could not be read suggests, from its own shape. */
export interface DateHint {
  /** The --date-format layouts that read it (a few), other than the one given. */
  readonly layouts: readonly LayoutReading[];
  /** The date (ISO) it reads as without --date-format, when a layout was given. */
  readonly unformatted?: string;
  /** When nothing reads it: a layout it fits whose parts name no date, and why. */
  readonly nearly?: { readonly layout: string; readonly problem: DateProblem };
  /** When nothing reads it and it ends in a time of day: the layouts that read the date before it (layouts have no time). */
  readonly withoutTime?: readonly LayoutReading[];
  /** When nothing reads it: it looks like a spreadsheet's serial day number. */
  readonly serial?: true;
}

/** What a requested column was wanted for (used in wording). */
export type ColumnRole = "date" | "value" | "series id" | "series value";

/** Something suspicious that does not stop the file from being read. */
export type InputWarning =
  | { readonly code: "looks-like-percent"; readonly source: string; readonly column: string; readonly medianAbs: number }
  | { readonly code: "looks-like-decimal"; readonly source: string; readonly column: string; readonly medianAbs: number }
  | { readonly code: "other-blocks"; readonly source: string; readonly used: number; readonly blocks: number }
  | { readonly code: "skipped-lines"; readonly source: string; readonly line: number; readonly count: number };
