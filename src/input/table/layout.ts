/**
 * Finding the table in a grid. Blank rows split the grid into blocks. A block is a table when
 * it has a header row followed by at least one row; the header is the first row (among the first
 * 20 of the block) that names every wanted column, or else the first row whose field count is the
 * most common one among the block's first 1000 rows. Rows above the header are titles and are skipped.
 */
import type { Grid } from "../engines/grid.js";
import type { InputIssue } from "../issues.js";
import { failure, success, type Result } from "../../core/result.js";

/** Rows [start, end) of one run of non-blank rows. */
export interface Block {
  readonly start: number;
  readonly end: number;
}

/** A located table: header row, data rows [firstDataRow, endRow), and which block of how many. */
export interface TableLocation {
  readonly headerRow: number;
  readonly firstDataRow: number;
  readonly endRow: number;
  /** 1-based index among the tables of the grid. */
  readonly block: number;
  readonly blocks: number;
  readonly titleRows: number;
}

const HEADER_SEARCH_ROWS = 20;
/** The most common field count of a block is taken from its first rows. */
const MODE_SAMPLE_ROWS = 1000;

/** Maximal runs of non-blank rows. */
export function listBlocks(grid: Grid): Block[] {
  const blocks: Block[] = [];
  let start = -1;
  for (let row = 0; row <= grid.rowCount; row++) {
    // Within a block, the rows before the next that may be blank are not: go to it.
    if (start >= 0 && grid.nextMaybeBlank !== undefined) row = Math.max(row, grid.nextMaybeBlank(row));
    const blank = row === grid.rowCount || grid.isBlank(row);
    if (blank && start >= 0) {
      blocks.push({ start, end: row });
      start = -1;
    } else if (!blank && start < 0) start = row;
  }
  return blocks;
}

function modalFieldCount(grid: Grid, block: Block): number {
  const tally = new Map<number, number>();
  let best = grid.fieldCount(block.start);
  let bestFrequency = 0;
  const end = Math.min(block.end, block.start + MODE_SAMPLE_ROWS);
  for (let row = block.start; row < end; row++) {
    const count = grid.fieldCount(row);
    const frequency = (tally.get(count) ?? 0) + 1;
    tally.set(count, frequency);
    if (frequency > bestFrequency) {
      best = count;
      bestFrequency = frequency;
    }
  }
  return best;
}

/** The header row of a block, or -1 when the block is not a table; `mode()`: the block's modal field count. */
function headerRowOf(grid: Grid, block: Block, wanted: readonly string[], minFields: number, mode: () => number): number {
  if (block.end - block.start < 2) return -1;
  if (mode() < minFields) return -1;
  const last = Math.min(block.end, block.start + HEADER_SEARCH_ROWS);
  let fallback = -1;
  for (let row = block.start; row < last; row++) {
    if (wanted.length > 0 && grid.fieldCount(row) >= 2) {
      const names = new Set(grid.fields(row).map((name) => name.trim()));
      if (wanted.every((name) => names.has(name))) return row < block.end - 1 ? row : -1;
    }
    if (fallback < 0 && row < block.end - 1 && grid.fieldCount(row) === mode()) fallback = row;
  }
  return fallback;
}

/** A table of a grid: its block and header row. */
export interface Table {
  readonly block: Block;
  readonly headerRow: number;
}

/** The tables of a grid; single-column tables only when there is nothing wider. */
export function listTables(grid: Grid, wanted: readonly string[]): Table[] {
  return tableLister(grid)(wanted);
}

/**
 * `listTables` of one grid for any number of wanted lists: the blocks and their modal field counts,
 * which do not depend on the names wanted, are found once.
 */
export function tableLister(grid: Grid): (wanted: readonly string[]) => Table[] {
  const blocks = listBlocks(grid).map((block) => {
    let mode: number | undefined;
    return { block, mode: () => (mode ??= modalFieldCount(grid, block)) };
  });
  return (wanted) => {
    for (const minFields of [2, 1]) {
      const tables = blocks
        .map(({ block, mode }) => ({ block, headerRow: headerRowOf(grid, block, wanted, minFields, mode) }))
        .filter((t) => t.headerRow >= 0);
      if (tables.length > 0) return tables;
    }
    return [];
  };
}

/** Locate the requested table (1-based `block`, default 1) among `tables` (by default the grid's, for `wanted`). */
export function locateTable(
  grid: Grid,
  source: string,
  wanted: readonly string[],
  block = 1,
  tables: readonly Table[] = listTables(grid, wanted),
): Result<TableLocation, InputIssue[]> {
  const chosen = tables[block - 1];
  if (chosen === undefined) {
    if (tables.length > 0) return failure([{ code: "no-such-block", source, block, available: tables.length }]);
    return failure([noTableIssue(grid, source)]);
  }
  return success({
    headerRow: chosen.headerRow,
    firstDataRow: chosen.headerRow + 1,
    endRow: chosen.block.end,
    block,
    blocks: tables.length,
    titleRows: chosen.headerRow - chosen.block.start,
  });
}

function noTableIssue(grid: Grid, source: string): InputIssue {
  const nonBlank: number[] = [];
  for (let row = 0; row < grid.rowCount && nonBlank.length < 2; row++) if (!grid.isBlank(row)) nonBlank.push(row);
  const first = nonBlank[0];
  if (first === undefined) return { code: "empty-file", source };
  for (let row = 0; row < grid.rowCount; row++) {
    if (grid.fieldCount(row) >= 2 || nonBlank.length === 1)
      return { code: "header-only", source, line: grid.line(nonBlank.length === 1 ? first : row) };
  }
  return { code: "no-table", source };
}
