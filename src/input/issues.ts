/**
 * The one place where input issues and warnings (issueTypes.ts) are worded: `describeInputIssue`,
 * `describeInputWarning`.
 */
import type { At, InputIssue, InputWarning } from "./issueTypes.js";

export { inputIssueCodes, type ColumnRole, type InputIssue, type InputIssueCode, type InputWarning } from "./issueTypes.js";

const quote = (text: string): string => JSON.stringify(text);

function where(issue: At): string {
  let text = issue.source;
  if (issue.line !== undefined) text += ` line ${issue.line}`;
  if (issue.column !== undefined) text += `${issue.line === undefined ? "" : ","} column ${quote(issue.column)}`;
  return text;
}

const whereLine = (issue: At): string => `${issue.source}${issue.line === undefined ? "" : ` line ${issue.line}`}`;
const listOf = (names: readonly string[]): string => names.map(quote).join(", ");
const percent = (x: number): string => `${Number((x * 100).toPrecision(6))}%`;
const delimiterName = (d: string): string => (d === "\t" ? "tab" : quote(d));

/** The message for one issue: where (file, line, column), what (the offending text) and what to do. */
export function describeInputIssue(issue: InputIssue): string {
  const at = where(issue);
  switch (issue.code) {
    case "empty-file":
      return `${at}: the file is empty; export the return series with a header row and one row per date`;
    case "header-only":
      return `${at}: there is a header but no data rows below it; check the export range`;
    case "no-table":
      return `${at}: no table found (a header followed by rows with the same number of fields); check the delimiter (--delimiter)`;
    case "no-such-block":
      return `${at}: table ${issue.block} was asked for but the file has ${issue.available}; use --block 1 to ${issue.available}`;
    case "unknown-column": {
      const hint = issue.suggestion === undefined ? "" : `did you mean ${quote(issue.suggestion)}? `;
      const block =
        issue.foundInBlock === undefined ? "" : `; it is in table ${issue.foundInBlock} of the file (use --block ${issue.foundInBlock})`;
      return `${whereLine(issue)}: no ${issue.role} column ${quote(issue.column)}; ${hint}available columns: ${listOf(issue.available)}${block}`;
    }
    case "duplicate-column":
      return `${at}: the header names this column more than once, so it is ambiguous; rename one of them in the file`;
    case "unknown-series": {
      const hint = issue.suggestion === undefined ? "" : `did you mean ${quote(issue.suggestion)}? `;
      return `${issue.source}: no series ${quote(issue.column)} in column ${quote(issue.idColumn)}; ${hint}series present: ${listOf(issue.available)}`;
    }
    case "not-a-number":
      return /^\s*[+-]?\d+,\d+\s*$/.test(issue.value)
        ? `${at}: ${quote(issue.value)} is not a number: it has a decimal comma; export the file with "." as the decimal separator, or pass --decimal-comma`
        : `${at}: ${quote(issue.value)} is not a number; use an empty field or NA for a missing value, or --missing to declare a sentinel`;
    case "missing-value":
      return `${at}: the value is missing (${quote(issue.value)}); fill it in, or allow dropping rows with missing values (--on-missing drop)`;
    case "wrong-field-count":
      return `${at}: ${issue.actual} fields where the header has ${issue.expected}; check for an unquoted delimiter or a truncated row`;
    case "unquoted-delimiter":
      return `${at}: ${quote(issue.value)} looks like a number split by the ${delimiterName(issue.delimiter)} delimiter; quote the value, use "." as the decimal separator, or choose another delimiter (--delimiter)`;
    case "malformed-quotes":
      return `${at}: broken quoting (${issue.detail}); every quoted field must start and end with a double quote, and a quote inside one is written twice`;
    case "bad-date":
      return issue.value.trim() === ""
        ? `${at}: the date is empty; every data row needs a date`
        : `${at}: ${quote(issue.value)} is not a date ${issue.dateFormat === undefined ? "in a recognised layout (YYYY-MM-DD, YYYYMMDD, YYYY-MM, YYYYMM, YYYY, or D/M/YYYY); pass --date-format, e.g. DD.MM.YYYY" : `in the layout ${issue.dateFormat}; check --date-format`}`;
    case "ambiguous-dates":
      return `${at}: ${quote(issue.value)} reads as ${issue.dayFirst} (day first) or ${issue.monthFirst} (month first), and no date in the column settles it; pass --date-format DD/MM/YYYY or MM/DD/YYYY`;
    case "duplicate-date":
      return `${at}: the date ${quote(issue.value)}${issue.series === undefined ? "" : ` for series ${quote(issue.series)}`} already appears on line ${issue.firstLine}; remove the repeated row`;
    case "unsorted-dates":
      return `${at}: ${quote(issue.value)} comes after ${quote(issue.previousValue)} (line ${issue.previousLine}) but is earlier; sort the file by date, or pass --sort`;
    case "too-few-rows":
      return `${at}: only ${issue.kept} usable rows (${issue.rowsRead} read, ${issue.dropped} dropped for missing values); at least ${issue.required} are needed`;
    case "too-few-common-dates":
      return `${at}: only ${issue.matched} dates are in every file (${issue.counts.map((c) => `${c.source}: ${c.dates}`).join(", ")}); at least ${issue.required} are needed; check that the files use the same dates (month-end or month-start) and frequency`;
    case "extreme-value":
      return `${at}: ${quote(issue.value)} is a return of ${percent(issue.decimalValue)}, beyond +-${percent(issue.limit)}; if the file is in percent pass --units percent, if the data are prices pass --input prices, or pass --allow-extreme`;
    case "non-positive-price":
      return `${at}: the price ${quote(issue.value)} is not positive, so no return can be computed from it; check the column or the --input setting`;
    case "invalid-encoding":
      return `${at}: the bytes at offset ${issue.offset} are not valid UTF-8; save the file as UTF-8 (CSV UTF-8)`;
    case "binary-content":
      return `${at}: a NUL byte at offset ${issue.offset}: this is not a text file (a spreadsheet or UTF-16 file?); export it as CSV in UTF-8`;
    case "unsupported-encoding":
      return `${at}: the file is ${issue.encoding}; save it as UTF-8 (CSV UTF-8)`;
    case "invalid-option":
      return `${at}: option ${issue.option}: ${issue.reason}`;
    case "too-many-issues":
      return `${at}: ${issue.omitted} more problems not shown; fix the ones above first`;
    case "internal-error":
      return `${at}: internal error while reading (${issue.detail}); this is a bug, please report it with the file`;
  }
}

/** The message for one warning. */
export function describeInputWarning(warning: InputWarning): string {
  switch (warning.code) {
    case "looks-like-percent":
      return `${warning.source}, column ${quote(warning.column)}: the median absolute return is ${warning.medianAbs}, which looks like percent; if so pass --units percent`;
    case "looks-like-decimal":
      return `${warning.source}, column ${quote(warning.column)}: read as percent, the median absolute return is only ${percent(warning.medianAbs)}, which looks like decimal data; check --units`;
    case "other-blocks":
      return `${warning.source}: the file holds ${warning.blocks} tables; table ${warning.used} was read (--block picks another)`;
    case "skipped-lines":
      return `${warning.source}: ${warning.count} line(s) before the header on line ${warning.line} were skipped as titles`;
  }
}
