/** Matching requested column names against a header row (exact match after trimming spaces). */
import type { ColumnRole, InputIssue } from "../issues.js";
import { closestName } from "../suggest.js";

/** A column to find in the header, and what it is for (used in messages). */
export interface WantedColumn {
  readonly name: string;
  readonly role: ColumnRole;
}

/** Where the header is, for issues. */
export interface HeaderContext {
  readonly source: string;
  readonly line: number;
  /** The 1-based table of the file whose header has the name, if another one does. */
  readonly findInOtherTable: (name: string) => number | undefined;
}

/** Field index of each wanted column, or issues (unknown with suggestion, or named twice in the header). */
export function resolveColumns(
  header: readonly string[],
  wanted: readonly WantedColumn[],
  context: HeaderContext,
): number[] | InputIssue[] {
  const { source, line } = context;
  const names = header.map((name) => name.trim());
  const available = names.filter((name) => name !== "");
  const issues: InputIssue[] = [];
  const indexes: number[] = [];
  for (const { name, role } of wanted) {
    const target = name.trim();
    const found = names.flatMap((n, i) => (n === target ? [i] : []));
    if (found.length === 1) indexes.push(found[0] as number);
    else if (found.length > 1) issues.push({ code: "duplicate-column", source, line, column: target });
    else {
      const suggestion = closestName(target, available);
      const foundInBlock = context.findInOtherTable(target);
      issues.push({
        code: "unknown-column",
        source,
        line,
        column: target,
        role,
        available,
        ...(suggestion === undefined ? {} : { suggestion }),
        ...(foundInBlock === undefined ? {} : { foundInBlock }),
      });
    }
  }
  return issues.length > 0 ? issues : indexes;
}
