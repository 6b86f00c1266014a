/**
 * The one place where input issues and warnings (issueTypes.ts) are worded: `describeInputIssue`,
 * `describeInputWarning`.
 */
import type { QuoteProblem } from "./engines/grid.js";
import type { BinaryKind } from "./fileKind.js";
import type { At, InputIssue, InputIssueCode, InputWarning, LayoutReading } from "./issueTypes.js";
import { maximumInputBytes } from "./limits.js";
import type { DateProblem } from "./values/dates.js";
import { MONTH_NAMES } from "./values/dateFormat.js";

export { inputIssueCodes, type ColumnRole, type InputIssue, type InputIssueCode, type InputWarning } from "./issueTypes.js";

/** Quoted file content is cut to this many characters. */
const QUOTED_LENGTH = 40;
/** Control, format and bidirectional characters, which could garble or disguise a terminal line. */
const UNSAFE = /[\u007f-\u009f\u00ad\u061c\u200b-\u200f\u2028-\u202e\u2060-\u206f\ufeff\ufff9-\ufffb]/g;

/**
 * Text quoted in a message: in double quotes, with control, format and bidirectional characters
 * escaped (\u001b, \u202e, ...), and cut to 40 characters (with the full length) when longer.
 */
export function quote(text: string): string {
  const long = text.length > QUOTED_LENGTH;
  let shown = long ? text.slice(0, QUOTED_LENGTH) : text;
  if (long && /[\ud800-\udbff]$/.test(shown)) shown = shown.slice(0, -1);
  const escaped = JSON.stringify(shown).replace(UNSAFE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, "0")}`);
  return long ? `${escaped.slice(0, -1)}…" (${grouped(text.length)} characters)` : escaped;
}

function where(issue: At): string {
  let text = issue.source;
  if (issue.line !== undefined) text += ` line ${issue.line}`;
  if (issue.column !== undefined) text += `${issue.line === undefined ? "" : ","} column ${quote(issue.column)}`;
  if (issue.series !== undefined) text += ` (series ${quote(issue.series)})`;
  return text;
}

/** Lists of names from a file stop after this many. */
const LISTED = 20;
const whereLine = (issue: At): string => `${issue.source}${issue.line === undefined ? "" : ` line ${issue.line}`}`;
const listOf = (names: readonly string[]): string =>
  names.length <= LISTED
    ? names.map(quote).join(", ")
    : `${names.slice(0, LISTED).map(quote).join(", ")} and ${names.length - LISTED} more`;
const percent = (x: number): string => `${Number((x * 100).toPrecision(6))}%`;
const delimiterName = (d: string): string => (d === "\t" ? "tab" : quote(d));
const grouped = (n: number): string => String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ",");
const bytesOf = (n: number): string => `${grouped(n)} bytes`;
const gib = (n: number): string => `${Number((n / 2 ** 30).toFixed(2))} GiB`;
const capitalised = (name: string): string => `${name.charAt(0).toUpperCase()}${name.slice(1)}`;
const splitHint =
  "split it by date (a file per period) or by columns (each book in its own file, joined on dates with --low FILE:COLUMN --high FILE:COLUMN)";

/** Why a text is no date, in words (e.g. "February 2021 has 28 days"). */
export function describeDateProblem(problem: DateProblem): string {
  switch (problem.kind) {
    case "no-year":
      return "there is no year 0";
    case "no-month":
      return `there is no month ${problem.month}`;
    case "no-day":
      return `there is no day ${problem.day}`;
    case "short-month":
      return `${capitalised(MONTH_NAMES[problem.month - 1] ?? "")} ${problem.year} has ${problem.days} days`;
    case "no-time":
      return `there is no ${problem.part} ${problem.value}`;
    case "no-offset":
      return `${quote(problem.offset)} is not a UTC offset`;
    case "no-month-name":
      return `${quote(problem.name)} is not a month name`;
  }
}

/** Dates read without --date-format, one of each form (each reads as a date: tested). */
export const UNFORMATTED_EXAMPLES = [
  "2000-01-31",
  "2000-01-31T09:30",
  "20000131",
  "2000-01",
  "200001",
  "2000",
  "31/01/2000",
  "01/31/2000",
  "Jan 31 2000",
  "31 Jan 2000",
] as const;

/** A date with a time, as read without --date-format (one of `UNFORMATTED_EXAMPLES`). */
const TIMED_EXAMPLE = UNFORMATTED_EXAMPLES[1];

/** A layout as it is typed after --date-format (quoted when it holds more than letters, digits and . / -). */
const layoutArgument = (layout: string): string => (/^[A-Za-z\d./-]+$/.test(layout) ? layout : quote(layout));

/** "it reads as a date without --date-format (2000-01-31) or with --date-format DD.MM.YYYY (2000-01-31) or MM.DD.YYYY (...)" */
function readsAsDate(unformatted: string | undefined, layouts: readonly LayoutReading[]): string {
  const ways = layouts.map(({ layout, iso }, k) => `${k === 0 ? "with --date-format " : ""}${layoutArgument(layout)} (${iso})`);
  if (unformatted !== undefined) ways.unshift(`without --date-format (${unformatted})`);
  return `it reads as a date ${ways.join(" or ")}`;
}

/** The forms of dates read, for a value that nothing reads. */
const ACCEPTED = `dates are read like ${UNFORMATTED_EXAMPLES.join(", ")}, and in other layouts with --date-format (tokens YYYY, MM, M, DD, D and MMM; a year has four digits)`;

/** The "bad-date" message after its place: the value, why it is no date, and what its own shape suggests. */
function describeBadDate(issue: Extract<InputIssue, { code: "bad-date" }>): string {
  const { value, dateFormat, hint } = issue;
  if (value.trim() === "") return "the date is empty; every data row needs a date";
  if (issue.problem !== undefined) {
    const how =
      dateFormat !== undefined
        ? ` (layout ${dateFormat})`
        : issue.reading === undefined
          ? ""
          : ` read ${issue.reading} (as the column's other dates are)`;
    const other =
      hint === undefined || hint.layouts.length === 0
        ? ""
        : `, or if the column is in another layout: ${readsAsDate(undefined, hint.layouts)}`;
    return `${quote(value)} is not a real date${how}: ${describeDateProblem(issue.problem)}; correct it in the file${other}`;
  }
  const not = `${quote(value)} is not a date in ${dateFormat === undefined ? "a layout read without --date-format" : `the layout ${dateFormat}`}`;
  if (hint !== undefined && (hint.unformatted !== undefined || hint.layouts.length > 0))
    return `${not}; ${readsAsDate(hint.unformatted, hint.layouts)}`;
  if (hint?.nearly !== undefined)
    return `${not}; it has the layout ${hint.nearly.layout}, but ${describeDateProblem(hint.nearly.problem)}; correct it in the file`;
  if (hint?.withoutTime !== undefined)
    return `${not}; --date-format layouts have no time of day: without its time ${readsAsDate(undefined, hint.withoutTime)}; dates with a time are read without --date-format, written like ${TIMED_EXAMPLE}`;
  if (hint?.serial === true)
    return `${not}; it looks like a spreadsheet's serial day number: export the column formatted as dates, e.g. YYYY-MM-DD`;
  return dateFormat === undefined
    ? `${quote(value)} is not a date in any layout; ${ACCEPTED}`
    : `${not} nor in any other; check that the date column is the right one (--date); ${ACCEPTED}`;
}

/** What each binary format is, and what to do with it. */
const BINARY: Record<BinaryKind, readonly [string, string]> = {
  gzip: ["gzip-compressed data", "decompress it (gunzip) and read the CSV file inside"],
  zip: ["a zip archive (an .xlsx or .ods workbook is one)", "export the sheet as CSV (UTF-8), or extract the CSV file from the archive"],
  xls: ["an Office document (.xls)", "export the sheet as CSV (UTF-8)"],
  pdf: ["a PDF document", "export the table as CSV (UTF-8) from where it came from"],
  png: ["a PNG image", "check the file name"],
  jpeg: ["a JPEG image", "check the file name"],
  gif: ["a GIF image", "check the file name"],
  bzip2: ["bzip2-compressed data", "decompress it (bunzip2) and read the CSV file inside"],
  xz: ["xz-compressed data", "decompress it (unxz) and read the CSV file inside"],
  zstd: ["zstd-compressed data", "decompress it (unzstd) and read the CSV file inside"],
  "7z": ["a 7z archive", "extract the CSV file from the archive"],
  sqlite: ["an SQLite database", "export the table as CSV (UTF-8)"],
  parquet: ["a Parquet file", "export the table as CSV (UTF-8)"],
  elf: ["an executable program", "check the file name"],
};

/** What is wrong with the quoting, for "malformed-quotes". */
const QUOTING: Record<QuoteProblem, string> = {
  "quote-inside": "has a double quote inside but does not start with one",
  "after-closing": "a field has text after its closing quote",
  "not-closed": "a quoted field is never closed",
  other: "the quotes cannot be read",
};

/** What sent a file to the text path, for "text-too-large". */
const TEXT_CAUSE = {
  "non-ascii": ["has a character that is not ASCII", "save it as plain ASCII (no accents or symbols in names)"],
  quote: ["has a double quote", "export it without quotes"],
  "carriage-return": ["has a carriage return that does not end a line", "save it with LF or CRLF line ends"],
  size: ["is too large for the byte reader", "make it smaller"],
} as const;

/** The issues that repeat, as a plural noun for "… and N more". */
const REPEATED: Partial<Record<InputIssueCode, string>> = {
  "not-a-number": "values that are not numbers",
  "missing-value": "missing values",
  "wrong-field-count": "rows with the wrong number of fields",
  "unquoted-delimiter": "numbers split by the delimiter",
  "bad-date": "dates that cannot be read",
  "duplicate-date": "repeated dates",
  "unsorted-dates": "dates out of order",
  "extreme-value": "extreme returns",
  "non-positive-price": "prices that are not positive",
};

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
    case "not-a-return-table":
      return `${at}: not a return table (${bytesOf(issue.size)}): no header row names ${listOf(issue.wanted)}, and the first column holds no dates; a header row naming the date and return columns is expected, then one row per date; check the file name and the column names`;
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
      return `${at}: broken quoting (${issue.problem === "quote-inside" ? `${issue.field === undefined ? "a field" : `field ${issue.field}`} ` : ""}${QUOTING[issue.problem]}); every quoted field must start and end with a double quote, and a quote inside one is written twice`;
    case "bad-date":
      return `${at}: ${describeBadDate(issue)}`;
    case "ambiguous-dates":
      return `${at}: ${quote(issue.value)} reads as ${issue.dayFirst} (day first) or ${issue.monthFirst} (month first), and no date in the column settles it; pass --date-format DD/MM/YYYY or MM/DD/YYYY`;
    case "duplicate-date":
      return `${at}: the date ${quote(issue.value)} already appears on line ${issue.firstLine}; remove the repeated row`;
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
      return `${at}: byte 0x${issue.byte.toString(16).toUpperCase().padStart(2, "0")} at offset ${issue.offset} is not valid UTF-8, so the file is probably in a single-byte encoding such as Latin-1 or Windows-1252; save it as UTF-8 (CSV UTF-8)`;
    case "binary-content":
      return `${at}: a NUL byte at offset ${issue.offset}, which no text table has: this is binary data, not a CSV file; export the returns as CSV (UTF-8)`;
    case "not-a-text-file": {
      const [what, todo] = BINARY[issue.kind];
      return `${at}: this is not a text table (${bytesOf(issue.size)}): it looks like ${what}; ${todo}`;
    }
    case "unsupported-encoding":
      return `${at}: the file is ${issue.encoding} text (${issue.bom ? "with" : "without"} a byte-order mark); save it as UTF-8 (CSV UTF-8)`;
    case "text-too-large": {
      const [cause, todo] = TEXT_CAUSE[issue.cause];
      const line = issue.line === undefined ? "it" : `line ${issue.line}`;
      return `${issue.source}: ${bytesOf(issue.size)} (${gib(issue.size)}) of text, read as one string because ${line} ${cause}, and a string holds at most ${grouped(issue.limit)} characters (this one would have ${grouped(issue.length)}); ${todo}, so that it is read from its bytes (up to ${gib(maximumInputBytes + 1)} - 1 byte), or ${splitHint}`;
    }
    case "input-too-large":
      return `${at}: the input is ${bytesOf(issue.size)} (${gib(issue.size)}), more than the ${bytesOf(issue.limit)} (2 GiB - 1 byte) that can be read; ${splitHint}`;
    case "invalid-option":
      return issue.option === "columns" ? `${at}: ${issue.reason}` : `${at}: option ${issue.option}: ${issue.reason}`;
    case "similar-issues": {
      const { firstLine, lastLine } = issue;
      const lines =
        firstLine === undefined || lastLine === undefined
          ? ""
          : firstLine === lastLine
            ? `, on line ${firstLine}`
            : `, on lines ${firstLine} to ${lastLine}`;
      return `${issue.source}${issue.column === undefined ? "" : ` column ${quote(issue.column)}`}: … and ${issue.omitted} more ${REPEATED[issue.like] ?? "like the ones above"}${lines}`;
    }
    case "too-many-issues":
      return `${at}: ${issue.omitted} more problems not shown; fix the ones above first`;
    case "internal-error":
      return `${at}: internal error while reading (${issue.detail}); this is a bug, please report it with the file`;
  }
}

/** The message for one warning. */
/** "line 4" or "lines 2 to 4": the title lines directly above a header. */
function skippedTitleLines(header: number, count: number): string {
  return count === 1 ? `line ${header - 1}` : `lines ${header - count} to ${header - 1}`;
}

export function describeInputWarning(warning: InputWarning): string {
  switch (warning.code) {
    case "looks-like-percent":
      return `${warning.source}, column ${quote(warning.column)}: the median absolute return is ${warning.medianAbs}, which looks like percent; if so pass --units percent`;
    case "looks-like-decimal":
      return `${warning.source}, column ${quote(warning.column)}: read as percent, the median absolute return is only ${percent(warning.medianAbs)}, which looks like decimal data; if so pass --units decimal`;
    case "other-blocks":
      return `${warning.source}: the file holds ${warning.blocks} tables; table ${warning.used} was read; pass --block N to read table N instead`;
    case "skipped-lines":
      return `${warning.source}: the header is on line ${warning.line}; ${skippedTitleLines(warning.line, warning.count)} above it, read as its title, ${warning.count === 1 ? "was" : "were"} skipped; if line ${warning.line} is not the header row, remove the lines above the header`;
  }
}
