/**
 * Reading several sets of columns of one file (a run's pairs) in one pass. The union of the sets is
 * read once, up to the rows in date order converted to returns; each set's table is then finished
 * from it as reading the set alone finishes it: a row is dropped when one of the set's own columns is
 * missing there, not another set's. Every answer is what `readReturnsFromBytes` gives for the set
 * alone: a set is read on its own when its reading could differ from the union's before that point
 * (problems with its options, another header row or date column chosen for its names), and when the
 * union cannot be read (after leaving out the columns the union's problems name, twice at most).
 */
import type { Result } from "../core/result.js";
import type { PagedBytes } from "./engines/byteWindow.js";
import type { InputIssue, InputWarning } from "./issues.js";
import { type ReadOptions, validateOptions } from "./options.js";
import { type LocatedTable, readBytesThen, readReturnsFromBytes } from "./readReturns.js";
import { dateColumnChooser } from "./table/dateColumnChoice.js";
import { type ConvertedTable, convertTable, keepComplete } from "./table/finish.js";
import { locateTable, type TableLocation, tableLister } from "./table/layout.js";
import type { ReturnTable } from "./table/returnTable.js";
import { columnUnitWarnings } from "./table/warnings.js";

/** The table of the set at an index of the sets read (asked for in any order, each once or more). */
export type ColumnSetTables = (index: number) => Result<ReturnTable, InputIssue[]>;

/**
 * Inputs above this many bytes are read in groups of sets of at most GROUP_COLUMNS columns, so that
 * the union's values (8 bytes each) stay within a few times what one set's take.
 */
const LARGE_INPUT_BYTES = 64 * 2 ** 20;
const GROUP_COLUMNS = 8;
/** Reads of a union after leaving out the columns its problems name. */
const RETRIES = 2;

/**
 * The tables of `sets` (each a `columns` of ReadOptions) of one file, with `options` for the rest.
 * Tables are made when asked for; a group of sets shares one read, kept while its sets are asked for.
 */
export function readColumnSetsFromBytes(
  bytes: Uint8Array | PagedBytes,
  options: Omit<ReadOptions, "columns">,
  sets: readonly (readonly string[])[],
): ColumnSetTables {
  const alone = (index: number): Result<ReturnTable, InputIssue[]> =>
    readReturnsFromBytes(bytes, { ...options, columns: sets[index] ?? [] });
  if (sets.length < 2 || options.idColumn !== undefined || options.valueColumn !== undefined) return alone;
  const groups = groupSets(
    sets,
    options,
    (bytes instanceof Uint8Array ? bytes.length : bytes.size) > LARGE_INPUT_BYTES ? GROUP_COLUMNS : Number.POSITIVE_INFINITY,
  );
  let current: { group: number; tables: UnionTables | null } | null = null;
  return (index) => {
    const group = groups.of[index] ?? -1;
    if (group < 0) return alone(index);
    if (current?.group !== group) current = { group, tables: readUnion(bytes, options, groups.unions[group] ?? []) };
    let shared: Result<ReturnTable, InputIssue[]> | null = null;
    try {
      shared = current.tables?.(sets[index] ?? []) ?? null;
    } catch {
      // Only a bug can throw (reading never does): the set read alone says what it says then.
    }
    return shared ?? alone(index);
  };
}

/**
 * Consecutive sets grouped so that each group's union has at most `most` columns (a larger set is a
 * group of its own); `of[i]` is -1 for a set whose options are refused (it is read alone, to say why).
 */
export function groupSets(sets: readonly (readonly string[])[], options: Omit<ReadOptions, "columns">, most: number) {
  const of = new Int32Array(sets.length).fill(-1);
  const unions: string[][] = [];
  let union = new Set<string>();
  sets.forEach((set, i) => {
    if (validateOptions({ ...options, columns: set }).length > 0) return;
    const names = set.map((name) => name.trim());
    const grown = new Set([...union, ...names]);
    if (unions.length === 0 || (grown.size > most && union.size > 0)) {
      unions.push([]);
      union = new Set(names);
    } else union = grown;
    unions[unions.length - 1] = [...union];
    of[i] = unions.length - 1;
  });
  return { of, unions };
}

/** A set's table from a union's read, or null when the set must be read alone. */
type UnionTables = (set: readonly string[]) => Result<ReturnTable, InputIssue[]> | null;

/** The rows of a union, converted, with the grid and where its table is. */
interface UnionRows extends LocatedTable {
  readonly converted: ConvertedTable;
}

function readUnion(bytes: Uint8Array | PagedBytes, options: Omit<ReadOptions, "columns">, names: readonly string[]): UnionTables | null {
  let columns = names;
  for (let attempt = 0; attempt <= RETRIES && columns.length > 0; attempt++) {
    const read = readBytesThen<UnionRows>(bytes, { ...options, columns }, "auto", (data, readOptions, issues, table) => {
      const converted = convertTable(data, readOptions, issues);
      return converted.ok ? { ok: true, value: { ...table, converted: converted.value } } : converted;
    });
    if (read.ok) return unionTables(read.value, options);
    const named = new Set(
      read.issues.flatMap((issue) => (issue.column !== undefined && columns.includes(issue.column) ? [issue.column] : [])),
    );
    if (named.size === 0) return null;
    columns = columns.filter((name) => !named.has(name));
  }
  return null;
}

function unionTables(union: UnionRows, options: Omit<ReadOptions, "columns">): UnionTables {
  const { grid, location, converted } = union;
  const { data } = converted;
  const header = grid.fields(location.headerRow).map((name) => name.trim());
  const tables = tableLister(grid);
  const chooseDateColumn = dateColumnChooser(grid, location, header, options.dateFormat);
  const indexOf = new Map(data.columns.map((name, c) => [name, c]));
  // A column kept whole (no row dropped) is the same array for every set: its unit warnings are found once.
  const warned = new Map<Float64Array, readonly InputWarning[]>();
  return (set) => {
    const names = set.map((name) => name.trim());
    const indexes = names.map((name) => indexOf.get(name) ?? -1);
    if (indexes.includes(-1)) return null;
    const wanted = [...names, ...(options.dateColumn === undefined ? [] : [options.dateColumn.trim()])];
    const located = locateTable(grid, options.source, wanted, options.block ?? 1, tables(wanted));
    if (!located.ok || !sameLocation(located.value, location)) return null;
    const dateColumn = options.dateColumn?.trim() ?? chooseDateColumn(names);
    if (dateColumn !== data.dateColumn) return null;
    const setOptions = { ...options, columns: set };
    return keepComplete(converted, indexes, setOptions, (column, values) => {
      const whole = converted.values[indexOf.get(column) ?? -1] === values;
      const found = whole ? warned.get(values) : undefined;
      if (found !== undefined) return found;
      const warnings = columnUnitWarnings(column, values, setOptions);
      if (whole) warned.set(values, warnings);
      return warnings;
    });
  };
}

function sameLocation(a: TableLocation, b: TableLocation): boolean {
  return (
    a.headerRow === b.headerRow &&
    a.firstDataRow === b.firstDataRow &&
    a.endRow === b.endRow &&
    a.block === b.block &&
    a.blocks === b.blocks &&
    a.titleRows === b.titleRows
  );
}
