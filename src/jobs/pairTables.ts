/**
 * From files and pairs to aligned tables: each (file, pair) is read on its own rows (a missing value
 * in one pair's columns does not drop rows for another; a file is read once for all its pairs, see
 * input/readBatch.ts), or, in two-file mode (--low PATH:COLUMN --high PATH:COLUMN), the two books are
 * read from their own files and joined on date.
 */
import { provenanceOf } from "./provenance.js";
import type { ReturnSample } from "../core/types.js";
import {
  describeInputIssue,
  type InputIssue,
  type InputWarningDiagnostic,
  joinOnDates,
  parseDecimal,
  type ReadOptions,
  readColumnSetsFromBytes,
  readReturnsFromBytes,
  type ReturnTable,
} from "../input/index.js";
import type { CommandOptions } from "../options/index.js";
import type { InputDescription, JoinDescription, RiskFreeSource } from "../report/types.js";
import { lowerBetaSecond } from "./allPairs.js";
import { type Pair, pairsFrom } from "./pairs.js";
import { closerOf, failureOf, type ReadSource, sourceName } from "./sources.js";

/** The options that say which files, which columns and how to read them (solve's and roll's are the same). */
export type ReadingOptions = Pick<
  CommandOptions<"solve">,
  | "low"
  | "high"
  | "date"
  | "rf"
  | "units"
  | "allowExtreme"
  | "delimiter"
  | "block"
  | "dateFormat"
  | "sort"
  | "periodsPerYear"
  | "missing"
  | "onMissing"
  | "input"
  | "idColumn"
  | "valueColumn"
  | "decimalComma"
  | "allPairs"
  | "weight"
>;

/** Columns of a table that hold the books and the risk-free return (null: constant or none). */
interface TableKeys {
  readonly low: string;
  readonly high: string;
  readonly riskFree: string | null;
}

/** One (file, pair) read and aligned. */
export interface PairTable {
  readonly source: string;
  readonly pair: Pair;
  readonly table: ReturnTable;
  readonly keys: TableKeys;
  readonly riskFree: RiskFreeSource;
  readonly join: JoinDescription | null;
  /** Further columns asked for (an index), aligned with the books, by their names. */
  readonly extras: ReadonlyMap<string, Float64Array>;
}

export interface PairError {
  readonly code: string;
  readonly message: string;
}

export type PairLoad =
  | { readonly ok: true; readonly value: PairTable }
  | { readonly ok: false; readonly source: string; readonly pair: Pair; readonly errors: readonly PairError[] };

interface Side {
  readonly file: string;
  readonly column: string;
}

/** Two-file mode: no file arguments, and --low and --high both written as PATH:COLUMN (split at the last colon). */
export function joinedSides(files: readonly string[], options: ReadingOptions): { low: Side; high: Side } | null {
  if (files.length > 0 || options.low === undefined || options.high === undefined) return null;
  const side = (value: string): Side | null => {
    const at = value.lastIndexOf(":");
    return at <= 0 || at === value.length - 1 ? null : { file: value.slice(0, at), column: value.slice(at + 1) };
  };
  const low = side(options.low);
  const high = side(options.high);
  return low === null || high === null ? null : { low, high };
}

/**
 * How a run reads: `joined` when the two books come from their own files, and `several` when more than
 * one (file, pair) is asked for (outputs are then lists of records); `reads`, every file it reads
 * ("-": standard input).
 */
export function runShape(files: readonly string[], options: ReadingOptions & Parameters<typeof pairsFrom>[0]) {
  const sides = joinedSides(files, options);
  const joined = sides !== null;
  return {
    joined,
    several: !joined && Math.max(files.length, 1) * pairsFrom(options).length > 1,
    reads: sides !== null ? [sides.low.file, sides.high.file] : files.length === 0 ? ["-"] : [...files],
  };
}

/**
 * Every (file, pair) of a run, read in order; `files` empty means standard input. `extras`: further
 * columns read with each pair (rows missing one are dropped as for the books; when joining, from the
 * low book's file).
 */
export async function* loadPairs(
  files: readonly string[],
  pairs: readonly Pair[],
  options: ReadingOptions,
  read: ReadSource,
  extras: readonly string[] = [],
): AsyncGenerator<PairLoad> {
  const joined = joinedSides(files, options);
  if (joined !== null) {
    yield await loadJoined(joined, options, read, extras);
    return;
  }
  for (const file of files.length === 0 ? ["-"] : files) {
    const source = sourceName(file);
    const failAll = (errors: PairError[]): PairLoad[] => pairs.map((pair) => ({ ok: false, source, pair, errors }));
    let bytes: Awaited<ReturnType<ReadSource>> | null = await read(file);
    if (!bytes.ok) {
      yield* failAll([bytes.issues]);
      continue;
    }
    const riskFree = riskFreeSource(options);
    // Each pair's columns: its books, the risk-free column, then any further column not among them.
    const sets = pairs.map((pair) => {
      const columns = [pair.low, pair.high, ...riskFreeColumn(riskFree)];
      return [...columns, ...extras.filter((name) => !columns.includes(name))];
    });
    // The file is read once for every pair; each pair's table is what reading its columns alone gives.
    const close = closerOf(bytes.value);
    const failed = failureOf(bytes.value);
    let tables: ReturnType<typeof readColumnSetsFromBytes> | null = readColumnSetsFromBytes(
      bytes.value,
      readOptions(source, [], options),
      sets,
    );
    bytes = null;
    try {
      for (const [index, pair] of pairs.entries()) {
        const table = tables!(index);
        // The file's bytes and its read are let go before the last pair is solved (on 10 million rows
        // they are hundreds of MB the pair's columns no longer need).
        if (index === pairs.length - 1) {
          tables = null;
          close();
        }
        if (!table.ok) yield { ok: false, source, pair, errors: readErrors(table.issues, failed()) };
        else {
          const keys = { low: pair.low, high: pair.high, riskFree: riskFree.kind === "column" ? riskFree.column : null };
          const found = new Map(extras.map((name) => [name, table.value.columns.get(name)!]));
          const value: PairTable = { source, pair, table: table.value, keys, riskFree, join: null, extras: found };
          yield {
            ok: true,
            value: options.allPairs !== undefined && lowerBetaSecond(sampleOf(value), options.weight) ? swapped(value) : value,
          };
        }
      }
    } finally {
      // No pairs, or a consumer that stopped early.
      close();
    }
  }
}

/** The pair with its books the other way round (--all-pairs: the lower CAPM beta as low). */
function swapped(loaded: PairTable): PairTable {
  const { pair, keys } = loaded;
  return { ...loaded, pair: { low: pair.high, high: pair.low }, keys: { ...keys, low: keys.high, high: keys.low } };
}

/** The aligned series of a loaded pair, as the core takes them. */
export function sampleOf(loaded: PairTable): ReturnSample & { riskFree: number | Float64Array } {
  const values = loaded.table.columns;
  return {
    low: values.get(loaded.keys.low)!,
    high: values.get(loaded.keys.high)!,
    riskFree:
      loaded.keys.riskFree !== null ? values.get(loaded.keys.riskFree)! : loaded.riskFree.kind === "constant" ? loaded.riskFree.rate : 0,
  };
}

/**
 * Why a pair could not be read, as messages for a person: the same for every pair of the file that
 * failed alike (a missing file, a risk-free column not there), so the CLI shows each once per run.
 */
export function readErrorMessages(errors: readonly PairError[]): { severity: "error"; text: string; reading: true }[] {
  return errors.map((e) => ({ severity: "error", text: e.message, reading: true }));
}

/** The reading warnings of a loaded pair as messages for a person (the CLI shows each once per run). */
export function readingMessages(warnings: readonly InputWarningDiagnostic[]): { severity: "warning"; text: string; reading: true }[] {
  return warnings.map((w) => ({ severity: "warning", text: w.message, reading: true }));
}

/** Where the numbers of a loaded pair came from, for the reports. */
export function describeInput(loaded: PairTable, options: ReadingOptions): InputDescription {
  const { table } = loaded;
  return {
    source: loaded.source,
    dateColumn: table.dateColumn,
    lowColumn: loaded.pair.low,
    highColumn: loaded.pair.high,
    riskFree: loaded.riskFree,
    units: options.units,
    firstDate: table.firstDate,
    lastDate: table.lastDate,
    rowsRead: table.rowsRead,
    rowsDropped: table.dropped.count,
    droppedDates: table.dropped.firstDates,
    frequency: table.frequency,
    join: loaded.join,
    ...provenanceOf(options, loaded.table.columns.get(loaded.keys.low)!.length, loaded.join === null ? 1 : 2),
  };
}

async function loadJoined(
  sides: { low: Side; high: Side },
  options: ReadingOptions,
  read: ReadSource,
  extras: readonly string[],
): Promise<PairLoad> {
  const source = `${sourceName(sides.low.file)} + ${sourceName(sides.high.file)}`;
  const pair = { low: sides.low.column, high: sides.high.column };
  const fail = (errors: PairError[]): PairLoad => ({ ok: false, source, pair, errors });
  const riskFree = riskFreeSource(options);
  const tables: ReturnTable[] = [];
  for (const [key, side, extra] of [
    [
      "low",
      sides.low,
      [...riskFreeColumn(riskFree), ...extras.filter((name) => name !== sides.low.column && !riskFreeColumn(riskFree).includes(name))],
    ],
    ["high", sides.high, []],
  ] as const) {
    const bytes = await read(side.file);
    if (!bytes.ok) return fail([bytes.issues]);
    const table = readReturnsFromBytes(bytes.value, readOptions(sourceName(side.file), [side.column, ...extra], options));
    closerOf(bytes.value)();
    if (!table.ok) return fail(readErrors(table.issues, failureOf(bytes.value)()));
    // Both files may call their column the same ("Return"): key them by role for the join.
    const columns = new Map<string, Float64Array>([[key, table.value.columns.get(side.column)!]]);
    for (const name of extra) columns.set(`rf:${name}`, table.value.columns.get(name)!);
    tables.push({ ...table.value, columns });
  }
  const joined = joinOnDates(tables);
  if (!joined.ok) return fail(inputErrors(joined.issues));
  const { table, dateCounts, matched, unmatched } = joined.value;
  const join: JoinDescription = {
    sides: [sides.low, sides.high].map((side, i) => ({
      source: sourceName(side.file),
      column: side.column,
      dates: dateCounts[i] ?? 0,
      unmatched: unmatched[i]?.count ?? 0,
    })),
    matched,
  };
  const keys = { low: "low", high: "high", riskFree: riskFree.kind === "column" ? `rf:${riskFree.column}` : null };
  // The low file's further columns are keyed "rf:NAME" as its risk-free column is.
  const found = new Map(extras.map((name) => [name, table.columns.get(name === sides.low.column ? "low" : `rf:${name}`)!]));
  return { ok: true, value: { source, pair, table, keys, riskFree, join, extras: found } };
}

function riskFreeSource(options: ReadingOptions): RiskFreeSource {
  if (options.rf === undefined) return { kind: "none" };
  const rate = parseDecimal(options.rf);
  if (rate === null) return { kind: "column", column: options.rf };
  return { kind: "constant", rate: options.units === "percent" ? rate / 100 : rate };
}

function riskFreeColumn(riskFree: RiskFreeSource): string[] {
  return riskFree.kind === "column" ? [riskFree.column] : [];
}

function readOptions(source: string, columns: readonly string[], options: ReadingOptions): ReadOptions {
  return {
    source,
    columns,
    units: options.units,
    allowExtreme: options.allowExtreme,
    sort: options.sort,
    onMissing: options.onMissing,
    input: options.input,
    decimalComma: options.decimalComma,
    ...definedOnly({
      dateColumn: options.date,
      delimiter: options.delimiter,
      block: options.block,
      dateFormat: options.dateFormat,
      periodsPerYear: options.periodsPerYear,
      missing: options.missing,
      idColumn: options.idColumn,
      valueColumn: options.valueColumn,
    }),
  };
}

/** The entries whose value is not undefined (optional properties must be absent, not undefined). */
function definedOnly<T extends Record<string, unknown>>(entries: T): { [K in keyof T]?: Exclude<T[K], undefined> } {
  return Object.fromEntries(Object.entries(entries).filter(([, v]) => v !== undefined)) as { [K in keyof T]?: Exclude<T[K], undefined> };
}

/** A file's reading issues, or why reading it failed meanwhile (what its issues then say is beside the point). */
function readErrors(issues: readonly InputIssue[], failure: PairError | null): PairError[] {
  return failure === null ? inputErrors(issues) : [failure];
}

function inputErrors(issues: readonly InputIssue[]): PairError[] {
  return issues.map((issue) => ({ code: issue.code, message: describeInputIssue(issue) }));
}
