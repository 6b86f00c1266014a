/**
 * Reading a return file from its text. Pure: no file system, no console, never throws; every
 * expected problem is an InputIssue (see issues.ts for the codes and their wording).
 */
import { failure, type Result } from "../core/result.js";
import { byteGrid } from "./engines/byteGrid.js";
import { maximumInputBytes } from "./limits.js";
import { isPlain, plainLines } from "./engines/plainLines.js";
import type { PagedBytes } from "./engines/byteWindow.js";
import { memoryFile, pagedFile, type PlainFile, wholeFile } from "./engines/plainFile.js";
import { decodeText, notTextIssue } from "./decodeText.js";
import { detectDelimiter } from "./dialect.js";
import { extractLong } from "./table/extractLong.js";
import { extractWide } from "./table/extractWide.js";
import { finishTable } from "./table/finish.js";
import { fastGrid } from "./engines/fastGrid.js";
import { csvGrid, type Grid, type QuoteError } from "./engines/grid.js";
import { IssueList } from "./issueList.js";
import type { InputIssue } from "./issues.js";
import { listTables, locateTable, type TableLocation } from "./table/layout.js";
import type { Extracted } from "./table/extracted.js";
import { isReturnTable } from "./table/recognise.js";
import { compileSentinels } from "./values/numbers.js";
import { validateOptions, type ReadOptions } from "./options.js";
import type { ReturnTable } from "./table/returnTable.js";

export type { ReadOptions, InputKind } from "./options.js";
export type { ReturnTable } from "./table/returnTable.js";

/** Which tokeniser to use: "auto" takes the fast scanner whenever the text allows it. */
export type Engine = "auto" | "general";

/**
 * Read the requested columns of a delimited return file.
 * Conventions: the UTF-8 byte-order mark is ignored; LF, CRLF and CR line ends; header names and
 * requested names are compared exactly after trimming spaces; values are returned as decimal simple
 * returns in date order; rows with a missing value (empty, NA, NaN, null, N/A, or a declared
 * sentinel) are dropped and counted; at least 3 rows must remain.
 */
export function readReturns(text: string, options: ReadOptions): Result<ReturnTable, InputIssue[]> {
  return readReturnsWith(text, options, "auto");
}

/** `readReturns` with an explicit engine (the general one is csv-parse); results are identical. */
export function readReturnsWith(text: string, options: ReadOptions, engine: Engine): Result<ReturnTable, InputIssue[]> {
  const source = typeof options?.source === "string" ? options.source : "<input>";
  try {
    return readText(String(text), options, engine, finishTable);
  } catch (error) {
    return failure([{ code: "internal-error", source, detail: error instanceof Error ? error.message : String(error) }]);
  }
}

/**
 * `readReturns` on the bytes of a file: the same as `decodeText(bytes, options.source)` followed,
 * when that succeeds, by `readReturns` on the text (a decoding failure is returned as it is).
 * Plain ASCII files without quotes are read from the bytes directly, without building the text; a
 * file given as `PagedBytes` (read by position) is then read through a window, never held whole.
 */
export function readReturnsFromBytes(bytes: Uint8Array | PagedBytes, options: ReadOptions): Result<ReturnTable, InputIssue[]> {
  return readBytesWith(bytes, options, "auto");
}

/**
 * `readReturnsFromBytes` with the byte engine ("auto"), through the text ("text"), or with the byte
 * engine not even looking at the first bytes before reading ("speculative", for tests of the
 * fallback); results are identical.
 */
export function readBytesWith(
  bytes: Uint8Array | PagedBytes,
  options: ReadOptions,
  engine: "auto" | "text" | "speculative",
): Result<ReturnTable, InputIssue[]> {
  return readBytesThen(bytes, options, engine, finishTable);
}

/**
 * What becomes of a table's extracted rows: `finishTable` makes the ReturnTable; a reader of several
 * sets of columns (readBatch.ts) keeps the rows of all of them, with the grid and where its table is.
 */
export type Finish<T> = (data: Extracted, options: ReadOptions, issues: IssueList, table: LocatedTable) => Result<T, InputIssue[]>;

/** The tokenised file and where the table read is in it. */
export interface LocatedTable {
  readonly grid: Grid;
  readonly location: TableLocation;
}

/** `readBytesWith`, its extracted rows handed to `finish`; a file read by position is read through a window when it allows. */
export function readBytesThen<T>(
  input: Uint8Array | PagedBytes,
  options: ReadOptions,
  engine: "auto" | "text" | "speculative",
  finish: Finish<T>,
): Result<T, InputIssue[]> {
  const source = typeof options?.source === "string" ? options.source : "<input>";
  try {
    const size = input instanceof Uint8Array ? input.length : input.size;
    if (size > maximumInputBytes) return failure([{ code: "input-too-large", source, size, limit: maximumInputBytes }]);
    let bytes: Uint8Array;
    if (input instanceof Uint8Array) bytes = input;
    else {
      const paged = engine === "auto" ? pagedFile(input) : null;
      const read = paged === null || paged instanceof Uint8Array ? null : readPlainBytes(paged, options, finish);
      if (read !== null) return read;
      bytes = paged instanceof Uint8Array ? paged : wholeFile(input);
    }
    const notText = notTextIssue(bytes, source);
    if (notText !== null) return failure([notText]);
    const lines = engine === "text" ? null : plainLines(bytes, engine === "auto" ? undefined : 0);
    let read: Result<T, InputIssue[]> | null = null;
    try {
      read = lines === null ? null : readPlainBytes(memoryFile(bytes, lines), options, finish);
    } catch (error) {
      // Only a bug can throw; on bytes that are not plain the text decides.
      if (lines === null || isPlain(bytes, lines.start, bytes.length)) throw error;
    }
    if (read !== null) return read;
    const text = decodeText(bytes, source);
    return text.ok ? readText(text.value, options, "auto", finish) : text;
  } catch (error) {
    return failure([{ code: "internal-error", source, detail: error instanceof Error ? error.message : String(error) }]);
  }
}

/**
 * `readText` on the file of `lines`, read from its bytes; null when the bytes turn out not to be
 * plain (see byteGrid.ts), so that the text must be read instead.
 */
function readPlainBytes<T>(file: PlainFile, options: ReadOptions, finish: Finish<T>): Result<T, InputIssue[]> | null {
  const { source } = options;
  const { lines, size } = file;
  const optionIssues = validateOptions(options);
  if (optionIssues.length > 0) return file.plain() ? failure(optionIssues) : null;
  // Only ASCII white space: the text is blank, whatever else.
  if (file.blank()) return failure([{ code: "empty-file", source }]);
  // detectDelimiter looks at no more than the first 65537 characters.
  const head = (): string => file.text(lines.start, Math.min(size, lines.start + 65537));
  const delimiter = options.delimiter ?? detectDelimiter(head(), options.decimalComma === true ? [";", "\t"] : undefined);
  const grid = byteGrid(file.bytes, lines, delimiter);
  const result = readGrid(grid, options, () => size - lines.start, finish);
  return grid.clean() ? result : null;
}

function readText<T>(input: string, options: ReadOptions, engine: Engine, finish: Finish<T>): Result<T, InputIssue[]> {
  const { source } = options;
  const optionIssues = validateOptions(options);
  if (optionIssues.length > 0) return failure(optionIssues);
  const text = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
  if (text.trim() === "") return failure([{ code: "empty-file", source }]);
  const delimiter = options.delimiter ?? detectDelimiter(text, options.decimalComma === true ? [";", "\t"] : undefined);
  const fast = engine === "auto" ? fastGrid(text, delimiter) : null;
  const grid: Grid | QuoteError = fast ?? csvGrid(text, delimiter);
  if (!("rowCount" in grid)) {
    const { line, problem, field } = grid;
    return failure([{ code: "malformed-quotes", source, line, problem, ...(field === undefined ? {} : { field: field + 1 }) }]);
  }
  return readGrid(grid, options, () => utf8Length(text), finish);
}

/** Locate, extract and finish the table of a tokenised file; `size()`: its text's length in UTF-8 bytes (after any byte-order mark). */
function readGrid<T>(grid: Grid, options: ReadOptions, size: () => number, finish: Finish<T>): Result<T, InputIssue[]> {
  const { source } = options;
  const long = options.idColumn !== undefined && options.valueColumn !== undefined;
  const wanted = long
    ? [options.idColumn ?? "", options.valueColumn ?? "", ...(options.dateColumn === undefined ? [] : [options.dateColumn])]
    : [...options.columns, ...(options.dateColumn === undefined ? [] : [options.dateColumn])];
  const names = wanted.map((name) => name.trim());
  const located = locateTable(grid, source, names, options.block ?? 1);
  if (!located.ok) return located;
  const findInOtherTable = (name: string): number | undefined => {
    const tables = listTables(grid, []);
    const index = tables.findIndex((t) => grid.fields(t.headerRow).some((field) => field.trim() === name));
    return index < 0 || index + 1 === located.value.block ? undefined : index + 1;
  };
  // Nothing of a file that holds no return table is quoted, not even its header's names.
  if (!isReturnTable(grid, located.value, names, options.dateFormat) && names.every((name) => findInOtherTable(name) === undefined))
    return failure([{ code: "not-a-return-table", source, size: size(), wanted: names }]);
  const issues = new IssueList(source);
  const sentinels = compileSentinels(options.missing ?? []);
  const extracted = long
    ? extractLong(grid, located.value, options, sentinels, issues, findInOtherTable)
    : extractWide(grid, located.value, options, sentinels, issues, findInOtherTable);
  if (extracted === null) return failure(issues.list());
  return finish(extracted, options, issues, { grid, location: located.value });
}

/** The length of a text in UTF-8 bytes. */
function utf8Length(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const unit = text.charCodeAt(i);
    // A surrogate pair (4 bytes) counts 2 + 2.
    bytes += unit < 0x80 ? 1 : unit < 0x800 || (unit >= 0xd800 && unit < 0xe000) ? 2 : 3;
  }
  return bytes;
}
