/**
 * Reading a return file from its text. Pure: no file system, no console, never throws; every
 * expected problem is an InputIssue (see issues.ts for the codes and their wording).
 */
import { failure, type Result } from "../core/result.js";
import { detectDelimiter } from "./dialect.js";
import { extractLong } from "./extractLong.js";
import { extractWide } from "./extractWide.js";
import { finishTable } from "./finish.js";
import { fastGrid } from "./fastGrid.js";
import { csvGrid, type Grid } from "./grid.js";
import { IssueList } from "./issueList.js";
import type { InputIssue } from "./issues.js";
import { listTables, locateTable } from "./layout.js";
import { compileSentinels } from "./numbers.js";
import { validateOptions, type ReadOptions } from "./options.js";
import type { ReturnTable } from "./returnTable.js";

export type { ReadOptions, InputKind } from "./options.js";
export type { ReturnTable } from "./returnTable.js";

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
    return read(String(text), options, engine);
  } catch (error) {
    return failure([{ code: "internal-error", source, detail: error instanceof Error ? error.message : String(error) }]);
  }
}

function read(input: string, options: ReadOptions, engine: Engine): Result<ReturnTable, InputIssue[]> {
  const { source } = options;
  const optionIssues = validateOptions(options);
  if (optionIssues.length > 0) return failure(optionIssues);
  const text = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
  if (text.trim() === "") return failure([{ code: "empty-file", source }]);
  const delimiter = options.delimiter ?? detectDelimiter(text, options.decimalComma === true ? [";", "\t"] : undefined);
  const fast = engine === "auto" ? fastGrid(text, delimiter) : null;
  const grid: Grid | { line: number; detail: string } = fast ?? csvGrid(text, delimiter);
  if (!("rowCount" in grid)) return failure([{ code: "malformed-quotes", source, line: grid.line, detail: grid.detail }]);

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
  const issues = new IssueList(source);
  const sentinels = compileSentinels(options.missing ?? []);
  const extracted = long
    ? extractLong(grid, located.value, options, sentinels, issues, findInOtherTable)
    : extractWide(grid, located.value, options, sentinels, issues, findInOtherTable);
  if (extracted === null) return failure(issues.list());
  return finishTable(extracted, options, issues);
}
